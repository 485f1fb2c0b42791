import "server-only";
import { randomUUID } from "node:crypto";
import { assertCan } from "@/lib/auth/policy";
import type { CurrentUser } from "@/lib/auth/types";
import { AppError } from "@/lib/errors";
import type { MarkingDto } from "@/lib/markings/schema";
import { excerpt } from "@/lib/sharing/comment-text";
import type { ProposalWithCurrent } from "@/lib/sharing/dto";
import { threadLabel } from "@/lib/sharing/note-label";
import { PROPOSAL_ACTION_FROM, proposalConflict, type ProposalAction } from "@/lib/sharing/proposal-state";
import type { proposalBody } from "@/lib/sharing/schemas";
import type { z } from "zod";
import { transaction, type Executor } from "@/db/client";
import { getMarkingByNoteKey, listMarkingsByPartId, writeMarking } from "@/db/markings";
import { getProposalById, insertProposal, listProposalsByPartId, transitionProposal, type ProposalDto, type ProposalStatus } from "@/db/proposals";
import { notifyParticipants } from "./notify";
import { barsOfPart, loadPart } from "./parts";

export async function loadProposal(partId: string, proposalId: string, tx?: Executor): Promise<ProposalDto> {
  const proposal = await getProposalById({ partId, proposalId, tx });
  if (!proposal) throw new AppError("not_found:proposal", "This proposal does not exist.");
  return proposal;
}

/**
 * A proposal beside the note's current marking. An open proposal whose base version no longer
 * matches is reported stale at once, before anyone tries to accept it.
 */
export function proposalView(p: ProposalDto, current: MarkingDto | null): ProposalWithCurrent {
  const outdated = p.status === "open" && (current?.version ?? null) !== p.baseVersion;
  return { ...p, current, stale: p.status === "stale" || outdated };
}

/** Throws the 409 for a proposal whose state does not allow the action (e.g. accepting a withdrawn one). */
export function assertProposalState(p: ProposalDto, action: ProposalAction): void {
  const refused = proposalConflict(p.status, action, p.authorName);
  if (refused) throw new AppError(refused.code, refused.message);
}

/**
 * The 409 after a guarded transition found the proposal already moved on (another window, or
 * the owner and the author at the same moment), worded for the state it is in now.
 */
export async function conflictAfterRace(partId: string, proposalId: string, action: ProposalAction, tx?: Executor): Promise<AppError> {
  const now = await loadProposal(partId, proposalId, tx);
  const conflict = proposalConflict(now.status, action, now.authorName);
  return new AppError(conflict?.code ?? "conflict:proposal_decided", conflict?.message ?? "This proposal changed in another window. Reload to see it.");
}

// ——— use cases ———

/** Proposals with the note's current marking beside each, so they can be compared. */
export async function listProposals(user: CurrentUser, o: { partId: string; noteKey?: string; status: ProposalStatus | "all" }) {
  await loadPart(user, o.partId, "part:view");
  const [list, markings] = await Promise.all([
    listProposalsByPartId({ partId: o.partId, noteKey: o.noteKey, statuses: o.status === "all" ? undefined : [o.status] }),
    listMarkingsByPartId({ partId: o.partId }),
  ]);
  const current = new Map(markings.map((m) => [m.noteKey, m]));
  return { proposals: list.map((p) => proposalView(p, current.get(p.noteKey) ?? null)) };
}

/** Someone with "propose" suggests a marking, made against the version they saw; the owner is told. */
export async function createProposal(user: CurrentUser, partId: string, body: z.infer<typeof proposalBody>): Promise<ProposalWithCurrent> {
  const { part } = await loadPart(user, partId, "part:propose");
  if (!part.noteKeys.includes(body.noteKey)) {
    throw new AppError("not_found:note", "That note is not in this part. Reload the page: the part may have changed.", { field: "noteKey" });
  }
  const current = await getMarkingByNoteKey({ partId, noteKey: body.noteKey });
  if ((current?.version ?? null) !== body.baseVersion) {
    throw new AppError("conflict:marking", "This note's marking changed since you opened it. Look at the current marking, then make your proposal again.", { state: { current } });
  }
  const row = await insertProposal({ partId, noteKey: body.noteKey, authorId: user.id, baseVersion: body.baseVersion, proposed: body.marking, comment: body.comment });
  await notifyParticipants({
    partId,
    actorId: user.id,
    kind: "proposal",
    threadKey: body.noteKey,
    summary: `${user.name} proposed a marking for ${threadLabel(body.noteKey, barsOfPart(part))}${body.comment ? `: “${excerpt(body.comment)}”` : ""}`,
    onlyUserIds: [part.ownerId],
  });
  const created = await getProposalById({ partId, proposalId: row.id });
  return proposalView(created!, current);
}

/**
 * Applies a proposal through the ordinary marking write, guarded by the version it was made
 * against, in one transaction: the claim, the write and the proposal's new state are kept
 * together or not at all. If the marking changed since (or the note is gone), nothing is applied,
 * the proposal becomes stale, and the conflict carries the marking and the proposal as they are now.
 */
export async function acceptProposal(user: CurrentUser, o: { partId: string; proposalId: string }): Promise<{ proposal: ProposalWithCurrent; marking: MarkingDto | null }> {
  const { partId, proposalId } = o;
  const { part } = await loadPart(user, partId, "marking:write");
  const outcome = await transaction(async (tx) => {
    const proposal = await loadProposal(partId, proposalId, tx);
    assertProposalState(proposal, "accept");
    // Claim first, so two windows accepting at once (or the author withdrawing) cannot both win.
    const claimed = await transitionProposal({ proposalId, from: [...PROPOSAL_ACTION_FROM.accept], to: "accepted", tx });
    if (!claimed) throw await conflictAfterRace(partId, proposalId, "accept", tx);
    const noteExists = part.noteKeys.includes(proposal.noteKey);
    const result = noteExists
      ? await writeMarking({
          partId,
          noteKey: proposal.noteKey,
          values: proposal.proposed,
          expectedVersion: proposal.baseVersion ?? undefined,
          actorId: user.id,
          groupId: randomUUID(),
          proposalId,
          tx,
        })
      : ({ ok: false, current: null } as const);
    if (!result.ok) {
      // Kept: the proposal is stale from now on, whoever looks at it.
      await transitionProposal({ proposalId, from: ["accepted"], to: "stale", tx });
      const stale = await getProposalById({ partId, proposalId, tx });
      return { ok: false as const, noteExists, current: result.current, proposal: stale ? proposalView(stale, result.current) : null };
    }
    const accepted = await getProposalById({ partId, proposalId, tx });
    return { ok: true as const, proposal: proposalView(accepted!, result.marking), marking: result.marking, noteKey: proposal.noteKey, authorId: proposal.authorId };
  });
  if (!outcome.ok) {
    throw new AppError(
      "conflict:proposal_stale",
      outcome.noteExists
        ? "The marking on this note changed after the proposal was made, so it was not applied. Compare them, then decline it or ask for a new one."
        : "This note is no longer in the part, so the proposal cannot be applied.",
      { state: { current: outcome.current, proposal: outcome.proposal } },
    );
  }
  await notifyParticipants({
    partId,
    actorId: user.id,
    kind: "proposal_accepted",
    threadKey: outcome.noteKey,
    summary: `${user.name} accepted your proposal for ${threadLabel(outcome.noteKey, barsOfPart(part))}`,
    onlyUserIds: [outcome.authorId],
  });
  return { proposal: outcome.proposal, marking: outcome.marking };
}

/** Moves a proposal to its decided state, guarded so that the first of two deciders wins. */
async function decide(partId: string, proposal: ProposalDto, action: "decline" | "withdraw", reply?: string | null): Promise<ProposalWithCurrent> {
  assertProposalState(proposal, action);
  const to = action === "decline" ? "declined" : "withdrawn";
  const moved = await transitionProposal({ proposalId: proposal.id, from: [...PROPOSAL_ACTION_FROM[action]], to, ...(reply !== undefined ? { reply } : {}) });
  if (!moved) throw await conflictAfterRace(partId, proposal.id, action);
  const [updated, current] = await Promise.all([getProposalById({ partId, proposalId: proposal.id }), getMarkingByNoteKey({ partId, noteKey: proposal.noteKey })]);
  return proposalView(updated!, current);
}

/** The owner declines an open or stale proposal, with an optional reply to its author. */
export async function declineProposal(user: CurrentUser, o: { partId: string; proposalId: string; reply: string }): Promise<ProposalWithCurrent> {
  const { part } = await loadPart(user, o.partId, "marking:write");
  const proposal = await loadProposal(o.partId, o.proposalId);
  const view = await decide(o.partId, proposal, "decline", o.reply || null);
  await notifyParticipants({
    partId: o.partId,
    actorId: user.id,
    kind: "proposal_declined",
    threadKey: proposal.noteKey,
    summary: `${user.name} declined your proposal for ${threadLabel(proposal.noteKey, barsOfPart(part))}${o.reply ? `: “${excerpt(o.reply)}”` : ""}`,
    onlyUserIds: [proposal.authorId],
  });
  return view;
}

/** Its author takes back an undecided proposal; the owner then sees it as withdrawn. */
export async function withdrawProposal(user: CurrentUser, o: { partId: string; proposalId: string }): Promise<ProposalWithCurrent> {
  const { part, permission } = await loadPart(user, o.partId, "part:view");
  const proposal = await loadProposal(o.partId, o.proposalId);
  assertCan(user, "proposal:withdraw", {
    type: "proposal",
    part: { id: part.id, ownerId: part.ownerId },
    share: permission === "owner" ? null : { permission },
    proposal: { authorId: proposal.authorId },
  });
  return decide(o.partId, proposal, "withdraw");
}
