import { describe, expect, it } from "vitest";
import { groupProgressByStudent, minutesAskedInWindow, progressWindowStart, type PartProgress } from "./progress";

const row = (o: Partial<PartProgress> & Pick<PartProgress, "ownerId" | "ownerName" | "partId" | "title">): PartProgress => ({
  ownerEmail: `${o.ownerId}@example.test`,
  openAssignments: 0,
  overdueAssignments: 0,
  minutesAskedPerDay: 0,
  minutesLately: 0,
  lastTakeAt: null,
  ...o,
});

describe("studio progress", () => {
  it("adds up each student's parts and keeps the latest take", () => {
    const groups = groupProgressByStudent([
      row({ ownerId: "s1", ownerName: "Ilse", partId: "p1", title: "Bells", openAssignments: 2, overdueAssignments: 1, minutesLately: 25, lastTakeAt: "2026-05-01T10:00:00.000Z" }),
      row({ ownerId: "s1", ownerName: "Ilse", partId: "p2", title: "Air", openAssignments: 1, minutesLately: 12.5, lastTakeAt: "2026-05-04T09:00:00.000Z" }),
      row({ ownerId: "s2", ownerName: "Bram", partId: "p3", title: "Reel", minutesLately: 40 }),
    ]);
    const ilse = groups.find((g) => g.ownerId === "s1")!;
    expect(ilse).toMatchObject({ openAssignments: 3, overdueAssignments: 1, minutesLately: 37.5, lastTakeAt: "2026-05-04T09:00:00.000Z" });
    expect(groups.find((g) => g.ownerId === "s2")).toMatchObject({ openAssignments: 0, minutesLately: 40, lastTakeAt: null });
  });

  it("puts students with overdue practice first, then open practice, then by name; parts alike", () => {
    const groups = groupProgressByStudent([
      row({ ownerId: "a", ownerName: "Aino", partId: "p1", title: "Z" }),
      row({ ownerId: "b", ownerName: "Bela", partId: "p2", title: "Y", openAssignments: 1 }),
      row({ ownerId: "c", ownerName: "Cato", partId: "p3", title: "B" }),
      row({ ownerId: "c", ownerName: "Cato", partId: "p4", title: "A" }),
      row({ ownerId: "c", ownerName: "Cato", partId: "p5", title: "C", openAssignments: 1, overdueAssignments: 1 }),
    ]);
    expect(groups.map((g) => g.ownerName)).toEqual(["Cato", "Bela", "Aino"]);
    expect(groups[0].parts.map((p) => p.title)).toEqual(["C", "A", "B"]);
  });

  it("looks back seven days and asks a week's worth of the daily minutes", () => {
    const now = new Date("2026-05-10T12:00:00.000Z");
    expect(progressWindowStart(now).toISOString()).toBe("2026-05-03T12:00:00.000Z");
    expect(minutesAskedInWindow(15)).toBe(105);
  });
});
