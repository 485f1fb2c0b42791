/**
 * Due dates of practice assignments. A due date is a calendar day with no time zone: it is
 * overdue once the viewer's own calendar has passed it, so "today" is always given by the caller
 * (the browser's local day on the practice page, the server's UTC day on the studio page).
 */

const DAY_MS = 86_400_000;

/** `YYYY-MM-DD` of the instant in the runtime's local time zone. */
export function localIsoDate(at: Date): string {
  const pad = (n: number) => String(n).padStart(2, "0");
  return `${at.getFullYear()}-${pad(at.getMonth() + 1)}-${pad(at.getDate())}`;
}

/** `YYYY-MM-DD` of the instant in UTC. */
export function utcIsoDate(at: Date): string {
  return at.toISOString().slice(0, 10);
}

/** Whole calendar days from `from` to `to` (negative when `to` is earlier). */
export function daysBetween(from: string, to: string): number {
  return Math.round((Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / DAY_MS);
}

/** The day `days` after `day` (before it when negative). */
export function addDays(day: string, days: number): string {
  return utcIsoDate(new Date(Date.parse(`${day}T00:00:00Z`) + days * DAY_MS));
}

export type DueState = "none" | "later" | "tomorrow" | "today" | "overdue";

export interface DueStatus {
  state: DueState;
  /** Days until the due date (negative: days past it); 0 without a date. */
  days: number;
  /** In words, so lateness never rests on colour alone. */
  text: string;
}

const plural = (n: number, one: string) => `${n} ${one}${n === 1 ? "" : "s"}`;

export function dueStatus(dueOn: string | null, today: string): DueStatus {
  if (!dueOn) return { state: "none", days: 0, text: "No due date" };
  const days = daysBetween(today, dueOn);
  if (days < 0) return { state: "overdue", days, text: `Overdue by ${plural(-days, "day")}` };
  if (days === 0) return { state: "today", days, text: "Due today" };
  if (days === 1) return { state: "tomorrow", days, text: "Due tomorrow" };
  return { state: "later", days, text: `Due in ${plural(days, "day")}` };
}

export function isOverdue(a: { dueOn: string | null; doneAt: string | null }, today: string): boolean {
  return a.doneAt === null && a.dueOn !== null && a.dueOn < today;
}

/**
 * Open assignments first, the most pressing on top: overdue and dated ones by due date, then
 * those without a date, oldest first. Done ones after, the most recently ticked first.
 */
export function arrangeAssignments<T extends { dueOn: string | null; doneAt: string | null; createdAt: string }>(list: readonly T[]): { open: T[]; done: T[] } {
  const open = list.filter((a) => a.doneAt === null);
  const done = list.filter((a) => a.doneAt !== null);
  open.sort((a, b) => {
    if (a.dueOn !== b.dueOn) {
      if (a.dueOn === null) return 1;
      if (b.dueOn === null) return -1;
      return a.dueOn < b.dueOn ? -1 : 1;
    }
    return a.createdAt < b.createdAt ? -1 : a.createdAt > b.createdAt ? 1 : 0;
  });
  done.sort((a, b) => (a.doneAt! < b.doneAt! ? 1 : a.doneAt! > b.doneAt! ? -1 : 0));
  return { open, done };
}

/**
 * Whether a teacher may set this due date: not before yesterday on the server's UTC calendar, so a
 * teacher west or east of UTC can still pick their own today.
 */
export function isSettableDueDate(dueOn: string, todayUtc: string): boolean {
  return daysBetween(todayUtc, dueOn) >= -1;
}
