import { handle, parseParams } from "@/lib/http/handler";
import { assertCan } from "@/lib/auth/policy";
import { requireUser } from "@/server/auth/session";
import { PROPOSAL_ACTION_FROM } from "@/lib/sharing/proposal-state";
import { proposalParams } from "@/lib/sharing/schemas";
import { loadPart } from "@/server/parts";
import { assertProposalState, conflictAfterRace, loadProposal, proposalView } from "@/server/proposals";
import { getMarkingByNoteKey } from "@/db/markings";
import { getProposalById, transitionProposal } from "@/db/proposals";

export const dynamic = "force-dynamic";

/** Its author takes back an undecided proposal; the owner then sees it as withdrawn. */
export const POST = handle(async (_request, { params }) => {
  const { partId, proposalId } = await parseParams(params, proposalParams);
  const user = await requireUser();
  const { part, permission } = await loadPart(user, partId, "part:view");
  const proposal = await loadProposal(partId, proposalId);
  assertCan(user, "proposal:withdraw", {
    type: "proposal",
    part: { id: part.id, ownerId: part.ownerId },
    share: permission === "owner" ? null : { permission },
    proposal: { authorId: proposal.authorId },
  });
  assertProposalState(proposal, "withdraw");
  // Guarded on the state, so an owner accepting at the same moment and the author cannot both win.
  const withdrawn = await transitionProposal({ proposalId, from: [...PROPOSAL_ACTION_FROM.withdraw], to: "withdrawn" });
  if (!withdrawn) throw await conflictAfterRace(partId, proposalId, "withdraw");
  const [updated, current] = await Promise.all([
    getProposalById({ partId, proposalId }),
    getMarkingByNoteKey({ partId, noteKey: proposal.noteKey }),
  ]);
  return Response.json(proposalView(updated!, current));
});
