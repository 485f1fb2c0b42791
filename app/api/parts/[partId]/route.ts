import { handle, parseJson, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { partIdParams, patchPartBody } from "@/lib/parts/schemas";
import { deletePart, getPart, updatePart } from "@/server/parts";

export const dynamic = "force-dynamic";

export const GET = handle(async (_request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  return Response.json(await getPart(user, partId));
});

export const PATCH = handle(async (request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  const body = await parseJson(request, patchPartBody);
  return Response.json(await updatePart(user, partId, body));
});

export const DELETE = handle(async (_request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  return Response.json(await deletePart(user, partId));
});
