import { handle, parseJson, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { partIdParams } from "@/lib/parts/schemas";
import { inviteBody } from "@/lib/sharing/schemas";
import { listShares, sharePart } from "@/server/sharing";
import { idempotent } from "@/server/http/idempotency";

export const dynamic = "force-dynamic";

export const GET = handle(async (_request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  return Response.json(await listShares(user, partId));
});

export const POST = handle(async (request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  return idempotent(request, user, async (request) => {
    const body = await parseJson(request, inviteBody);
    return Response.json(await sharePart(user, { partId, ...body }), { status: 201 });
  });
});
