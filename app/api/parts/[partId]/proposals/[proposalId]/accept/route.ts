import { handle, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { proposalParams } from "@/lib/sharing/schemas";
import { acceptProposal } from "@/server/proposals";

export const dynamic = "force-dynamic";

/** Applies a proposal, guarded by the version it was made against (see `acceptProposal`). */
export const POST = handle(async (_request, { params }) => {
  const { partId, proposalId } = await parseParams(params, proposalParams);
  const user = await requireUser();
  return Response.json(await acceptProposal(user, { partId, proposalId }));
});
