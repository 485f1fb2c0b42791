import { describe, expect, it } from "vitest";
import { groupByStudent, type SharedPartRow } from "./attention";

const row = (o: Partial<SharedPartRow> & Pick<SharedPartRow, "partId" | "ownerId">): SharedPartRow => ({
  title: o.partId,
  ownerName: o.ownerId,
  ownerEmail: `${o.ownerId}@example.test`,
  permission: "comment",
  unread: 0,
  openProposals: 0,
  lastActivityAt: "2026-01-01T00:00:00.000Z",
  ...o,
});

describe("studio view order", () => {
  it("puts students with unread items first, then the most recent activity", () => {
    const groups = groupByStudent([
      row({ partId: "a1", ownerId: "ann", lastActivityAt: "2026-01-05T00:00:00.000Z" }),
      row({ partId: "b1", ownerId: "ben", lastActivityAt: "2026-01-02T00:00:00.000Z", unread: 2 }),
      row({ partId: "c1", ownerId: "cas", lastActivityAt: "2026-01-09T00:00:00.000Z" }),
    ]);
    expect(groups.map((g) => g.ownerId)).toEqual(["ben", "cas", "ann"]);
  });

  it("orders a student's parts the same way and sums their unread items", () => {
    const [g] = groupByStudent([
      row({ partId: "old", ownerId: "ann", lastActivityAt: "2026-01-01T00:00:00.000Z" }),
      row({ partId: "new", ownerId: "ann", lastActivityAt: "2026-01-03T00:00:00.000Z" }),
      row({ partId: "unread", ownerId: "ann", lastActivityAt: "2026-01-02T00:00:00.000Z", unread: 1 }),
      row({ partId: "unread2", ownerId: "ann", lastActivityAt: "2026-01-02T12:00:00.000Z", unread: 3 }),
    ]);
    expect(g.parts.map((p) => p.partId)).toEqual(["unread2", "unread", "new", "old"]);
    expect(g.unread).toBe(4);
    expect(g.lastActivityAt).toBe("2026-01-03T00:00:00.000Z");
  });

  it("gives no groups for no parts", () => {
    expect(groupByStudent([])).toEqual([]);
  });
});
