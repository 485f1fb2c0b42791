import { handle, parseJson, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { createAssignmentBody, type AssignmentListDto } from "@/lib/assignments/schema";
import { partIdParams } from "@/lib/parts/schemas";
import { ASSIGNMENT_NOTIFICATION } from "@/lib/sharing/note-label";
import { assertSettableDueDate, assignmentAbilities, assignmentSummary } from "@/server/assignments";
import { notifyParticipants } from "@/server/notify";
import { loadPart } from "@/server/parts";
import { assertNoteOfPart } from "@/server/practice";
import { insertAssignment, listAssignmentsByPartId } from "@/db/assignments";

export const dynamic = "force-dynamic";

/** The part's practice assignments, for its owner and everyone it is shared with. */
export const GET = handle(async (_request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  const access = await loadPart(user, partId, "assignment:view");
  const assignments = await listAssignmentsByPartId({ partId });
  return Response.json({ assignments, ...assignmentAbilities(user, access) } satisfies AssignmentListDto);
});

/** A teacher the part is shared with sets practice for its owner, who is notified (and e-mailed, batched). */
export const POST = handle(async (request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  const body = await parseJson(request, createAssignmentBody);
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
    summary: assignmentSummary(user.name, assignment),
    onlyUserIds: [part.ownerId],
  });
  return Response.json(assignment, { status: 201 });
});
