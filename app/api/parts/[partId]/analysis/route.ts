import { handle, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { partIdParams } from "@/lib/parts/schemas";
import { getPartAnalysis } from "@/server/parts";

export const dynamic = "force-dynamic";

/** The chosen part's analysis, in the same shape as one part of the command line's output. */
export const GET = handle(async (_request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  return Response.json(await getPartAnalysis(user, partId));
});
