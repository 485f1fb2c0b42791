import { handle, parseJson, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { partIdParams } from "@/lib/parts/schemas";
import { practiceEntryBodySchema, type PracticeLogDto } from "@/lib/practice/schema";
import { loadPart } from "@/server/parts";
import { assertNoteOfPart, canWritePractice } from "@/server/practice";
import { insertPracticeEntry, listPracticeEntriesByPartId } from "@/db/practice";

export const dynamic = "force-dynamic";

/** The part owner's practice log; the owner's teacher with access reads it too. */
export const GET = handle(async (_request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  const access = await loadPart(user, partId, "practice:view");
  const { part } = access;
  const log = await listPracticeEntriesByPartId({ partId, userId: part.ownerId });
  return Response.json({ ...log, canWrite: canWritePractice(user, access) } satisfies PracticeLogDto);
});

export const POST = handle(async (request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  const body = await parseJson(request, practiceEntryBodySchema);
  const { part } = await loadPart(user, partId, "practice:write");
  assertNoteOfPart(part, body.noteKey);
  const entry = await insertPracticeEntry({ partId, userId: user.id, kind: body.kind, minutes: body.minutes, noteKey: body.noteKey ?? null, notes: body.notes });
  return Response.json({ entry }, { status: 201 });
});
