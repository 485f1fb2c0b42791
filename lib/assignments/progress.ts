/**
 * The studio's view of practice: per student and part, what is open, what is late, how much was
 * practised lately and when the last take was recorded.
 */

/** "Lately" on the studio page: the last seven days (a week between lessons, common practice). */
export const PROGRESS_WINDOW_DAYS = 7;

export function progressWindowStart(now: Date): Date {
  return new Date(now.getTime() - PROGRESS_WINDOW_DAYS * 86_400_000);
}

/** One row of the grouped progress query. */
export interface PartProgress {
  ownerId: string;
  ownerName: string;
  ownerEmail: string;
  partId: string;
  title: string;
  /** Open assignments the viewing teacher set. */
  openAssignments: number;
  /** Of those, the ones whose due date has passed. */
  overdueAssignments: number;
  /** Minutes a day the open assignments ask for, added up (0 when none says). */
  minutesAskedPerDay: number;
  /** Practice-log minutes of the owner on the part within the window. */
  minutesLately: number;
  /** ISO time of the owner's latest take on the part, or null. */
  lastTakeAt: string | null;
}

export interface StudentProgress {
  ownerId: string;
  ownerName: string;
  ownerEmail: string;
  openAssignments: number;
  overdueAssignments: number;
  minutesLately: number;
  lastTakeAt: string | null;
  parts: PartProgress[];
}

const later = (a: string | null, b: string | null) => (a === null ? b : b === null ? a : a > b ? a : b);

/**
 * Groups the rows by student with totals. Students with overdue practice come first, then those
 * with open practice, then by name; a student's parts keep the same order.
 */
export function groupProgressByStudent(rows: readonly PartProgress[]): StudentProgress[] {
  const groups = new Map<string, StudentProgress>();
  for (const row of rows) {
    let g = groups.get(row.ownerId);
    if (!g) {
      g = { ownerId: row.ownerId, ownerName: row.ownerName, ownerEmail: row.ownerEmail, openAssignments: 0, overdueAssignments: 0, minutesLately: 0, lastTakeAt: null, parts: [] };
      groups.set(row.ownerId, g);
    }
    g.parts.push(row);
    g.openAssignments += row.openAssignments;
    g.overdueAssignments += row.overdueAssignments;
    g.minutesLately += row.minutesLately;
    g.lastTakeAt = later(g.lastTakeAt, row.lastTakeAt);
  }
  const rank = (x: { overdueAssignments: number; openAssignments: number }) => (x.overdueAssignments > 0 ? 0 : x.openAssignments > 0 ? 1 : 2);
  const order = (a: StudentProgress | PartProgress, b: StudentProgress | PartProgress, name: (x: typeof a) => string) =>
    rank(a) - rank(b) || name(a).localeCompare(name(b));
  const list = [...groups.values()];
  for (const g of list) g.parts.sort((a, b) => order(a, b, (x) => (x as PartProgress).title));
  return list.sort((a, b) => order(a, b, (x) => x.ownerName));
}

/** What the open practice asks for over the whole window, to set beside the minutes practised. */
export function minutesAskedInWindow(minutesAskedPerDay: number): number {
  return minutesAskedPerDay * PROGRESS_WINDOW_DAYS;
}
