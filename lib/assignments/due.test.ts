import { describe, expect, it } from "vitest";
import { addDays, arrangeAssignments, daysBetween, dueStatus, isOverdue, isSettableDueDate, localIsoDate, utcIsoDate } from "./due";

describe("calendar days", () => {
  it("counts days across a leap day and a year end", () => {
    // Gregorian calendar: 2024 is a leap year (divisible by 4, not by 100), so February has 29 days.
    expect(daysBetween("2024-02-28", "2024-03-01")).toBe(2);
    // 2023 is not a leap year.
    expect(daysBetween("2023-02-28", "2023-03-01")).toBe(1);
    expect(daysBetween("2025-12-30", "2026-01-02")).toBe(3);
    expect(daysBetween("2026-01-02", "2025-12-30")).toBe(-3);
    expect(addDays("2024-02-28", 1)).toBe("2024-02-29");
    expect(addDays("2024-03-01", -1)).toBe("2024-02-29");
  });

  it("is not moved by a daylight-saving change (dates carry no time zone)", () => {
    // In the EU, clocks went forward on 2025-03-30 (last Sunday of March, EU Directive 2000/84/EC).
    expect(daysBetween("2025-03-29", "2025-03-31")).toBe(2);
  });

  it("names the local and the UTC day of an instant", () => {
    const at = new Date(2026, 4, 3, 23, 30); // 3 May 2026, 23:30 local
    expect(localIsoDate(at)).toBe("2026-05-03");
    expect(utcIsoDate(new Date(Date.UTC(2026, 4, 3, 23, 30)))).toBe("2026-05-03");
  });
});

describe("due status", () => {
  const today = "2026-05-10";
  it("says in words how a due date stands", () => {
    expect(dueStatus(null, today)).toEqual({ state: "none", days: 0, text: "No due date" });
    expect(dueStatus("2026-05-10", today)).toMatchObject({ state: "today", text: "Due today" });
    expect(dueStatus("2026-05-11", today)).toMatchObject({ state: "tomorrow", text: "Due tomorrow" });
    expect(dueStatus("2026-05-17", today)).toMatchObject({ state: "later", days: 7, text: "Due in 7 days" });
    expect(dueStatus("2026-05-09", today)).toMatchObject({ state: "overdue", days: -1, text: "Overdue by 1 day" });
    expect(dueStatus("2026-04-30", today)).toMatchObject({ state: "overdue", days: -10, text: "Overdue by 10 days" });
  });

  it("counts practice overdue only while it is open and past its day", () => {
    expect(isOverdue({ dueOn: "2026-05-09", doneAt: null }, today)).toBe(true);
    expect(isOverdue({ dueOn: "2026-05-10", doneAt: null }, today)).toBe(false);
    expect(isOverdue({ dueOn: "2026-05-09", doneAt: "2026-05-10T08:00:00.000Z" }, today)).toBe(false);
    expect(isOverdue({ dueOn: null, doneAt: null }, today)).toBe(false);
  });

  it("lets a teacher pick yesterday (another time zone's today) but nothing earlier", () => {
    expect(isSettableDueDate("2026-05-09", today)).toBe(true);
    expect(isSettableDueDate("2026-05-08", today)).toBe(false);
    expect(isSettableDueDate("2027-01-01", today)).toBe(true);
  });
});

describe("arranging assignments", () => {
  const a = (id: string, dueOn: string | null, createdAt: string, doneAt: string | null = null) => ({ id, dueOn, createdAt, doneAt });

  it("puts open practice first by due date, undated last, and done practice after, latest first", () => {
    const list = [
      a("undated-new", null, "2026-05-05T10:00:00.000Z"),
      a("due-12", "2026-05-12", "2026-05-01T10:00:00.000Z"),
      a("done-early", "2026-05-01", "2026-04-20T10:00:00.000Z", "2026-04-30T10:00:00.000Z"),
      a("overdue-02", "2026-05-02", "2026-04-25T10:00:00.000Z"),
      a("undated-old", null, "2026-04-01T10:00:00.000Z"),
      a("done-late", null, "2026-04-21T10:00:00.000Z", "2026-05-08T10:00:00.000Z"),
      a("due-12-later", "2026-05-12", "2026-05-03T10:00:00.000Z"),
    ];
    const { open, done } = arrangeAssignments(list);
    expect(open.map((x) => x.id)).toEqual(["overdue-02", "due-12", "due-12-later", "undated-old", "undated-new"]);
    expect(done.map((x) => x.id)).toEqual(["done-late", "done-early"]);
    // The input is left as it was.
    expect(list[0].id).toBe("undated-new");
  });
});
