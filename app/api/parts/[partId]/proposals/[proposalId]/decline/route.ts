import { handle, parseJson, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { declineBody, proposalParams } from "@/lib/sharing/schemas";
import { declineProposal } from "@/server/proposals";

export const dynamic = "force-dynamic";

/** Declines an open or stale proposal, with an optional reply to its author. */
export const POST = handle(async (request, { params }) => {
  const { partId, proposalId } = await parseParams(params, proposalParams);
  const user = await requireUser();
  const { reply } = await parseJson(request, declineBody);
  return Response.json(await declineProposal(user, { partId, proposalId, reply }));
});
