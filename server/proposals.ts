import "server-only";
import { AppError } from "@/lib/errors";
import type { MarkingDto } from "@/lib/markings/schema";
import type { ProposalWithCurrent } from "@/lib/sharing/dto";
import { proposalConflict, type ProposalAction } from "@/lib/sharing/proposal-state";
import { getProposalById, type ProposalDto } from "@/db/proposals";

export async function loadProposal(partId: string, proposalId: string): Promise<ProposalDto> {
  const proposal = await getProposalById({ partId, proposalId });
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
export async function conflictAfterRace(partId: string, proposalId: string, action: ProposalAction): Promise<AppError> {
  const now = await loadProposal(partId, proposalId);
  const conflict = proposalConflict(now.status, action, now.authorName);
  return new AppError(conflict?.code ?? "conflict:proposal_decided", conflict?.message ?? "This proposal changed in another window. Reload to see it.");
}
