import { handle, parseJson, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/lib/auth/session";
import { AppError } from "@/lib/errors";
import { excerpt } from "@/lib/sharing/comment-text";
import { threadLabel } from "@/lib/sharing/note-label";
import { declineBody, proposalParams } from "@/lib/sharing/schemas";
import { notifyParticipants } from "@/lib/server/notify";
import { loadPart } from "@/lib/server/parts";
import { loadProposal, proposalView } from "@/lib/server/proposals";
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
  const declined = await transitionProposal({ proposalId, from: ["open", "stale"], to: "declined", reply: reply || null });
  if (!declined) throw new AppError("conflict:proposal_decided", `This proposal has already been ${proposal.status}.`);
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
