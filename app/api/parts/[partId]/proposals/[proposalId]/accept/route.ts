import { randomUUID } from "node:crypto";
import { handle, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { threadLabel } from "@/lib/sharing/note-label";
import { PROPOSAL_ACTION_FROM } from "@/lib/sharing/proposal-state";
import { proposalParams } from "@/lib/sharing/schemas";
import { notifyParticipants } from "@/server/notify";
import { loadPart } from "@/server/parts";
import { assertProposalState, conflictAfterRace, loadProposal, proposalView } from "@/server/proposals";
import { getMarkingByNoteKey, writeMarking } from "@/db/markings";
import { getProposalById, transitionProposal } from "@/db/proposals";

export const dynamic = "force-dynamic";

/**
 * Applies a proposal through the ordinary marking write, guarded by the version it was made
 * against: if the marking changed since, nothing is applied and the proposal becomes stale.
 */
export const POST = handle(async (_request, { params }) => {
  const { partId, proposalId } = await parseParams(params, proposalParams);
  const user = await requireUser();
  const { part } = await loadPart(user, partId, "marking:write");
  const proposal = await loadProposal(partId, proposalId);
  assertProposalState(proposal, "accept");
  // Claim first, so two windows accepting at once (or the author withdrawing) cannot both win.
  const claimed = await transitionProposal({ proposalId, from: [...PROPOSAL_ACTION_FROM.accept], to: "accepted" });
  if (!claimed) throw await conflictAfterRace(partId, proposalId, "accept");

  const noteExists = part.noteKeys.includes(proposal.noteKey);
  let result: Awaited<ReturnType<typeof writeMarking>>;
  try {
    result = noteExists
      ? await writeMarking({
          partId,
          noteKey: proposal.noteKey,
          values: proposal.proposed,
          expectedVersion: proposal.baseVersion ?? undefined,
          actorId: user.id,
          groupId: randomUUID(),
          proposalId,
        })
      : { ok: false, current: null };
  } catch (err) {
    await transitionProposal({ proposalId, from: ["accepted"], to: "open" });
    throw err;
  }
  if (!result.ok) {
    await transitionProposal({ proposalId, from: ["accepted"], to: "stale" });
    const current = noteExists ? await getMarkingByNoteKey({ partId, noteKey: proposal.noteKey }) : null;
    const stale = await getProposalById({ partId, proposalId });
    return Response.json(
      {
        code: "conflict:proposal_stale",
        message: noteExists
          ? "The marking on this note changed after the proposal was made, so it was not applied. Compare them, then decline it or ask for a new one."
          : "This note is no longer in the part, so the proposal cannot be applied.",
        current,
        proposal: stale ? proposalView(stale, current) : null,
      },
      { status: 409 },
    );
  }
  await notifyParticipants({
    partId,
    actorId: user.id,
    kind: "proposal_accepted",
    threadKey: proposal.noteKey,
    summary: `${user.name} accepted your proposal for ${threadLabel(proposal.noteKey)}`,
    onlyUserIds: [proposal.authorId],
  });
  const accepted = await getProposalById({ partId, proposalId });
  return Response.json({ proposal: proposalView(accepted!, result.marking), marking: result.marking });
});
