import { handle, parseJson, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { excerpt } from "@/lib/sharing/comment-text";
import { threadLabel } from "@/lib/sharing/note-label";
import { PROPOSAL_ACTION_FROM } from "@/lib/sharing/proposal-state";
import { declineBody, proposalParams } from "@/lib/sharing/schemas";
import { notifyParticipants } from "@/server/notify";
import { loadPart } from "@/server/parts";
import { assertProposalState, conflictAfterRace, loadProposal, proposalView } from "@/server/proposals";
import { getMarkingByNoteKey } from "@/db/markings";
import { getProposalById, transitionProposal } from "@/db/proposals";

export const dynamic = "force-dynamic";

/** Declines an open or stale proposal, with an optional reply to its author. */
export const POST = handle(async (request, { params }) => {
  const { partId, proposalId } = await parseParams(params, proposalParams);
  const user = await requireUser();
  const { reply } = await parseJson(request, declineBody);
  await loadPart(user, partId, "marking:write");
  const proposal = await loadProposal(partId, proposalId);
  assertProposalState(proposal, "decline");
  const declined = await transitionProposal({ proposalId, from: [...PROPOSAL_ACTION_FROM.decline], to: "declined", reply: reply || null });
  if (!declined) throw await conflictAfterRace(partId, proposalId, "decline");
  await notifyParticipants({
    partId,
    actorId: user.id,
    kind: "proposal_declined",
    threadKey: proposal.noteKey,
    summary: `${user.name} declined your proposal for ${threadLabel(proposal.noteKey)}${reply ? `: “${excerpt(reply)}”` : ""}`,
    onlyUserIds: [proposal.authorId],
  });
  const [updated, current] = await Promise.all([
    getProposalById({ partId, proposalId }),
    getMarkingByNoteKey({ partId, noteKey: proposal.noteKey }),
  ]);
  return Response.json(proposalView(updated!, current));
});
