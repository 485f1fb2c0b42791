import { handle, parseJson, parseParams, parseQuery } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { partIdParams } from "@/lib/parts/schemas";
import { listTakesQuery, takeBodySchema } from "@/lib/practice/schema";
import { loadPart } from "@/server/parts";
import { assertNoteOfPart } from "@/server/practice";
import { getMarkingByNoteKey } from "@/db/markings";
import { insertTake, listTakesByPartId } from "@/db/practice";

export const dynamic = "force-dynamic";

/** The owner's measured takes, newest first (optionally of one note). */
export const GET = handle(async (request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  const { noteKey } = parseQuery(request, listTakesQuery);
  const { part } = await loadPart(user, partId, "practice:view");
  return Response.json({ takes: await listTakesByPartId({ partId, userId: part.ownerId, noteKey }) });
});

/** Stores a take's numbers; the marking it is compared with is read here, not sent by the client. */
export const POST = handle(async (request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  const body = await parseJson(request, takeBodySchema);
  const { part } = await loadPart(user, partId, "practice:write");
  assertNoteOfPart(part, body.noteKey);
  const marking = await getMarkingByNoteKey({ partId, noteKey: body.noteKey });
  const { noteKey, ...numbers } = body;
  const take = await insertTake({
    partId,
    userId: user.id,
    noteKey,
    measured: { ...numbers, marked: marking ? { speedHz: marking.speedHz, depthCents: marking.depthCents } : null },
  });
  return Response.json({ take }, { status: 201 });
});
