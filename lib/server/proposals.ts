import "server-only";
import { AppError } from "@/lib/errors";
import type { MarkingDto } from "@/lib/markings/schema";
import type { ProposalWithCurrent } from "@/lib/sharing/dto";
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
