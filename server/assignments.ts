import "server-only";
import { assertCan, can, type Action } from "@/lib/auth/policy";
import type { CurrentUser } from "@/lib/auth/types";
import type { AssignmentDto, AssignmentListDto, createAssignmentBody, patchAssignmentBody } from "@/lib/assignments/schema";
import { ASSIGNMENT_NOTIFICATION } from "@/lib/sharing/note-label";
import type { z } from "zod";
import { DRILL_LABELS } from "@/lib/assignments/schema";
import { isSettableDueDate, utcIsoDate } from "@/lib/assignments/due";
import { AppError } from "@/lib/errors";
import { threadLabel } from "@/lib/sharing/note-label";
import type { WrittenBar } from "@/lib/musicxml/bar-names";
import { deleteAssignmentById, getAssignmentById, insertAssignment, listAssignmentsByPartId, updateAssignmentById } from "@/db/assignments";
import type { PartAccess } from "@/db/parts";
import { notifyParticipants } from "./notify";
import { assertNoteOfPart, barsOfPart, loadPart } from "./parts";


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
function assignmentConflict(current: AssignmentDto | null): AppError {
  if (!current) return new AppError("not_found:assignment", "This practice assignment has been removed in the meantime.");
  return new AppError(
    "conflict:assignment",
    "This practice was changed in another window since you opened it. Look at it as it is now, then make your change again.",
    { state: { current } },
  );
}

/** "Teo Barral set practice: Hold ladder on bar 3, due 2026-05-12" — for the notification and its e-mail. */
export function assignmentSummary(teacherName: string, a: Pick<AssignmentDto, "drill" | "noteKey" | "dueOn" | "minutesPerDay">, bars: readonly WrittenBar[]): string {
  const on = a.noteKey ? ` on ${threadLabel(a.noteKey, bars)}` : "";
  const daily = a.minutesPerDay ? `, ${a.minutesPerDay} min a day` : "";
  const due = a.dueOn ? `, due ${a.dueOn}` : "";
  return `${teacherName} set practice: ${DRILL_LABELS[a.drill]}${on}${daily}${due}`;
}

// ——— use cases ———

/** The part's practice assignments, for its owner and everyone it is shared with. */
export async function listAssignments(user: CurrentUser, partId: string): Promise<AssignmentListDto> {
  const access = await loadPart(user, partId, "assignment:view");
  const assignments = await listAssignmentsByPartId({ partId });
  return { assignments, ...assignmentAbilities(user, access) };
}

/** A teacher the part is shared with sets practice for its owner, who is notified (and e-mailed, batched). */
export async function createAssignment(user: CurrentUser, partId: string, body: z.infer<typeof createAssignmentBody>): Promise<AssignmentDto> {
  const { part } = await loadPart(user, partId, "assignment:create");
  assertNoteOfPart(part, body.noteKey);
  assertSettableDueDate(body.dueOn);
  const assignment = await insertAssignment({ ...body, partId, assignedBy: user.id });
  await notifyParticipants({
    partId,
    actorId: user.id,
    kind: ASSIGNMENT_NOTIFICATION,
    // No thread: reading a note's comments must not count as reading the practice set on it.
    threadKey: null,
    summary: assignmentSummary(user.name, assignment, barsOfPart(part)),
    onlyUserIds: [part.ownerId],
  });
  return assignment;
}

/**
 * The teacher who set the practice changes its fields; the part's owner sends only `done`. Both
 * name the version they saw: a stale one is a conflict carrying the practice as it is now.
 */
export async function updateAssignment(user: CurrentUser, o: { partId: string; assignmentId: string; body: z.infer<typeof patchAssignmentBody> }): Promise<AssignmentDto> {
  const { version, done, ...fields } = o.body;
  const marking = done !== undefined;
  const { access, assignment } = await loadAssignment(user, o.partId, o.assignmentId, marking ? "assignment:mark_done" : "assignment:edit");
  if (!marking) {
    assertNoteOfPart(access.part, fields.noteKey);
    // Late practice keeps its date when only its other fields change.
    if (fields.dueOn !== assignment.dueOn) assertSettableDueDate(fields.dueOn);
  }
  const result = await updateAssignmentById({ partId: o.partId, assignmentId: o.assignmentId, expectedVersion: version, changes: marking ? { done } : fields });
  if (!result.ok) throw assignmentConflict(result.current);
  return result.assignment;
}

export async function deleteAssignment(user: CurrentUser, o: { partId: string; assignmentId: string; version: number }): Promise<{ id: string; deleted: true }> {
  await loadAssignment(user, o.partId, o.assignmentId, "assignment:delete");
  const result = await deleteAssignmentById({ partId: o.partId, assignmentId: o.assignmentId, expectedVersion: o.version });
  if (!result.ok) throw assignmentConflict(result.current);
  return { id: o.assignmentId, deleted: true };
}
