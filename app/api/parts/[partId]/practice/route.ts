import { handle, parseJson, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { partIdParams } from "@/lib/parts/schemas";
import { practiceEntryBodySchema } from "@/lib/practice/schema";
import { addPracticeEntry, getPracticeLog } from "@/server/practice";

export const dynamic = "force-dynamic";

/** The part owner's practice log; the owner's teacher with access reads it too. */
export const GET = handle(async (_request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  return Response.json(await getPracticeLog(user, partId));
});

export const POST = handle(async (request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  const body = await parseJson(request, practiceEntryBodySchema);
  return Response.json(await addPracticeEntry(user, partId, body), { status: 201 });
});
