import { handle, parseJson, parseParams, parseQuery } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { assignmentParams, deleteAssignmentQuery, patchAssignmentBody } from "@/lib/assignments/schema";
import { assertSettableDueDate, assignmentConflict, loadAssignment } from "@/server/assignments";
import { assertNoteOfPart } from "@/server/practice";
import { deleteAssignmentById, updateAssignmentById } from "@/db/assignments";

export const dynamic = "force-dynamic";

/**
 * The teacher who set the practice changes its fields; the part's owner sends only `done`. Both
 * name the version they saw: a stale one answers 409 with the practice as it is now.
 */
export const PATCH = handle(async (request, { params }) => {
  const { partId, assignmentId } = await parseParams(params, assignmentParams);
  const user = await requireUser();
  const { version, done, ...fields } = await parseJson(request, patchAssignmentBody);
  const marking = done !== undefined;
  const { access, assignment } = await loadAssignment(user, partId, assignmentId, marking ? "assignment:mark_done" : "assignment:edit");
  if (!marking) {
    assertNoteOfPart(access.part, fields.noteKey);
    // Late practice keeps its date when only its other fields change.
    if (fields.dueOn !== assignment.dueOn) assertSettableDueDate(fields.dueOn);
  }
  const result = await updateAssignmentById({ partId, assignmentId, expectedVersion: version, changes: marking ? { done } : fields });
  if (!result.ok) return assignmentConflict(result.current);
  return Response.json(result.assignment);
});

export const DELETE = handle(async (request, { params }) => {
  const { partId, assignmentId } = await parseParams(params, assignmentParams);
  const user = await requireUser();
  const { version } = parseQuery(request, deleteAssignmentQuery);
  await loadAssignment(user, partId, assignmentId, "assignment:delete");
  const result = await deleteAssignmentById({ partId, assignmentId, expectedVersion: version });
  if (!result.ok) return assignmentConflict(result.current);
  return Response.json({ id: assignmentId, deleted: true });
});
