import { handle, parseJson, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { createAssignmentBody } from "@/lib/assignments/schema";
import { partIdParams } from "@/lib/parts/schemas";
import { createAssignment, listAssignments } from "@/server/assignments";
import { idempotent } from "@/server/http/idempotency";

export const dynamic = "force-dynamic";

/** The part's practice assignments, for its owner and everyone it is shared with. */
export const GET = handle(async (_request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  return Response.json(await listAssignments(user, partId));
});

/** A teacher the part is shared with sets practice for its owner, who is notified (and e-mailed, batched). */
export const POST = handle(async (request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  return idempotent(request, user, async (request) => {
    const body = await parseJson(request, createAssignmentBody);
    return Response.json(await createAssignment(user, partId, body), { status: 201 });
  });
});
