import { handle, parseJson, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { decisionBodySchema } from "@/lib/markings/schema";
import { partIdParams } from "@/lib/parts/schemas";
import { loadPart } from "@/server/parts";
import { listDecisionsByPartId, upsertDecision } from "@/db/suggestion-decisions";

export const dynamic = "force-dynamic";

export const GET = handle(async (_request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  await loadPart(user, partId, "part:view");
  return Response.json({ decisions: await listDecisionsByPartId({ partId }) });
});

export const POST = handle(async (request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  const body = await parseJson(request, decisionBodySchema);
  await loadPart(user, partId, "marking:write");
  await upsertDecision({ partId, ...body, userId: user.id });
  return Response.json({ ok: true, ...body });
});
