import { handle, parseJson, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { decisionBodySchema } from "@/lib/markings/schema";
import { partIdParams } from "@/lib/parts/schemas";
import { decideSuggestion, listDecisions } from "@/server/suggestions";

export const dynamic = "force-dynamic";

export const GET = handle(async (_request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  return Response.json(await listDecisions(user, partId));
});

export const POST = handle(async (request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  const body = await parseJson(request, decisionBodySchema);
  return Response.json(await decideSuggestion(user, partId, body));
});
