import { handle, parseJson, parseParams, parseQuery } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { assignmentParams, deleteAssignmentQuery, patchAssignmentBody } from "@/lib/assignments/schema";
import { deleteAssignment, updateAssignment } from "@/server/assignments";

export const dynamic = "force-dynamic";

/** A stale version answers 409 with the practice as it is now (see `updateAssignment`). */
export const PATCH = handle(async (request, { params }) => {
  const { partId, assignmentId } = await parseParams(params, assignmentParams);
  const user = await requireUser();
  const body = await parseJson(request, patchAssignmentBody);
  return Response.json(await updateAssignment(user, { partId, assignmentId, body }));
});

export const DELETE = handle(async (request, { params }) => {
  const { partId, assignmentId } = await parseParams(params, assignmentParams);
  const user = await requireUser();
  const { version } = parseQuery(request, deleteAssignmentQuery);
  return Response.json(await deleteAssignment(user, { partId, assignmentId, version }));
});
