import { handle, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { partIdParams } from "@/lib/parts/schemas";
import { summarizeThreads } from "@/server/comments";

export const dynamic = "force-dynamic";

/** What the score's comment markers draw: per thread, live comments and open proposals. */
export const GET = handle(async (_request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  return Response.json(await summarizeThreads(user, partId));
});
