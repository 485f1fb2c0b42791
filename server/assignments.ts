import "server-only";
import { assertCan, can, type Action } from "@/lib/auth/policy";
import type { CurrentUser } from "@/lib/auth/types";
import type { AssignmentDto } from "@/lib/assignments/schema";
import { DRILL_LABELS } from "@/lib/assignments/schema";
import { isSettableDueDate, utcIsoDate } from "@/lib/assignments/due";
import { AppError } from "@/lib/errors";
import { threadLabel } from "@/lib/sharing/note-label";
import { getAssignmentById } from "@/db/assignments";
import type { PartAccess } from "@/db/parts";
import { loadPart } from "./parts";

const shareOf = (access: PartAccess) => (access.permission === "owner" ? null : { permission: access.permission });
const partRef = (access: PartAccess) => ({ id: access.part.id, ownerId: access.part.ownerId });

/**
 * Loads an assignment of a part the viewer may see and checks `action` on it through the policy.
 * An assignment of another part answers 404 like one that does not exist.
 */
export async function loadAssignment(user: CurrentUser, partId: string, assignmentId: string, action: Action): Promise<{ access: PartAccess; assignment: AssignmentDto }> {
  const access = await loadPart(user, partId, "assignment:view");
  const assignment = await getAssignmentById({ partId, assignmentId });
  if (!assignment) throw new AppError("not_found:assignment", "This practice assignment does not exist any more: it may have been removed. Reload the page.");
  assertCan(user, action, { type: "assignment", part: partRef(access), share: shareOf(access), assignment: { assignedBy: assignment.assignedById } });
  return { access, assignment };
}

/** What the list shows the viewer they may do. */
export function assignmentAbilities(user: CurrentUser, access: PartAccess) {
  const resource = { type: "part" as const, part: partRef(access), share: shareOf(access) };
  return { canAssign: can(user, "assignment:create", resource), canMarkDone: access.part.ownerId === user.id, viewerId: user.id };
}

export function assertSettableDueDate(dueOn: string | null | undefined) {
  if (dueOn && !isSettableDueDate(dueOn, utcIsoDate(new Date()))) {
    throw new AppError("bad_request:due_on", "That due date has already passed. Choose today or a later day.", { field: "dueOn" });
  }
}

/** A stale version: the change is not made, and the row as it is now goes back to be looked at. */
export function assignmentConflict(current: AssignmentDto | null): Response {
  if (!current) throw new AppError("not_found:assignment", "This practice assignment has been removed in the meantime.");
  return Response.json(
    {
      code: "conflict:assignment",
      message: "This practice was changed in another window since you opened it. Look at it as it is now, then make your change again.",
      current,
    },
    { status: 409 },
  );
}

/** "Teo Barral set practice: Hold ladder on bar 3, due 2026-05-12" — for the notification and its e-mail. */
export function assignmentSummary(teacherName: string, a: Pick<AssignmentDto, "drill" | "noteKey" | "dueOn" | "minutesPerDay">): string {
  const on = a.noteKey ? ` on ${threadLabel(a.noteKey)}` : "";
  const daily = a.minutesPerDay ? `, ${a.minutesPerDay} min a day` : "";
  const due = a.dueOn ? `, due ${a.dueOn}` : "";
  return `${teacherName} set practice: ${DRILL_LABELS[a.drill]}${on}${daily}${due}`;
}
