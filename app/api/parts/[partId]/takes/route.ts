import { handle, parseJson, parseParams, parseQuery } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { partIdParams } from "@/lib/parts/schemas";
import { listTakesQuery, takeBodySchema } from "@/lib/practice/schema";
import { listTakes, saveTake } from "@/server/practice";

export const dynamic = "force-dynamic";

/** The owner's measured takes, newest first (optionally of one note). */
export const GET = handle(async (request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  const { noteKey } = parseQuery(request, listTakesQuery);
  return Response.json(await listTakes(user, partId, noteKey));
});

/** Stores a take's numbers; the marking it is compared with is read on the server. */
export const POST = handle(async (request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  const body = await parseJson(request, takeBodySchema);
  return Response.json(await saveTake(user, partId, body), { status: 201 });
});
