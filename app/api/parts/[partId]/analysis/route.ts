import { handle, parseParams, parseQuery } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { analysisQuery, partIdParams } from "@/lib/parts/schemas";
import { getPartAnalysis } from "@/server/parts";

export const dynamic = "force-dynamic";

/**
 * The chosen part's analysis, in the same shape as one part of the command line's output, on the
 * player's line of a two-player staff, or on `?line=upper|lower`.
 */
export const GET = handle(async (request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const { line } = parseQuery(request, analysisQuery);
  const user = await requireUser();
  return Response.json(await getPartAnalysis(user, partId, line));
});
