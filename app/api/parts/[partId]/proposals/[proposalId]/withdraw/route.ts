import { handle, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { proposalParams } from "@/lib/sharing/schemas";
import { withdrawProposal } from "@/server/proposals";

export const dynamic = "force-dynamic";

/** Its author takes back an undecided proposal; the owner then sees it as withdrawn. */
export const POST = handle(async (_request, { params }) => {
  const { partId, proposalId } = await parseParams(params, proposalParams);
  const user = await requireUser();
  return Response.json(await withdrawProposal(user, { partId, proposalId }));
});
