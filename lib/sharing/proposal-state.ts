import type { ErrorCode } from "@/lib/errors";
import type { ProposalStatus } from "./dto";

/** What can be done to a proposal: the owner accepts or declines it, its author withdraws it. */
export type ProposalAction = "accept" | "decline" | "withdraw";

/**
 * The states each action starts from. A stale proposal (its marking moved on) cannot be applied,
 * but it is still undecided: the owner may decline it and its author may take it back.
 */
export const PROPOSAL_ACTION_FROM: Record<ProposalAction, readonly ProposalStatus[]> = {
  accept: ["open"],
  decline: ["open", "stale"],
  withdraw: ["open", "stale"],
};

export function canTakeAction(status: ProposalStatus, action: ProposalAction): boolean {
  return PROPOSAL_ACTION_FROM[action].includes(status);
}

/**
 * Why a proposal in `status` cannot take `action`: a 409 code and a sentence that tells the
 * person what happened and what is left to do. Null when the action is possible.
 */
export function proposalConflict(status: ProposalStatus, action: ProposalAction, authorName: string): { code: ErrorCode; message: string } | null {
  if (canTakeAction(status, action)) return null;
  if (status === "withdrawn") {
    return action === "withdraw"
      ? { code: "conflict:proposal_withdrawn", message: "You have already withdrawn this proposal." }
      : { code: "conflict:proposal_withdrawn", message: `${authorName} withdrew this proposal, so there is nothing to ${action}.` };
  }
  if (status === "stale") {
    // Only accepting refuses a stale proposal.
    return {
      code: "conflict:proposal_stale",
      message: "This proposal was made against a marking that has changed since, so it cannot be applied. Decline it, or ask for a new one.",
    };
  }
  if (status === "accepted" || status === "declined") {
    if (action === "withdraw") {
      return {
        code: "conflict:proposal_decided",
        message:
          status === "accepted"
            ? "This proposal has already been accepted, so it can no longer be withdrawn. Propose a new marking if you want a change."
            : "This proposal has already been declined; there is nothing to withdraw.",
      };
    }
    return { code: "conflict:proposal_decided", message: `This proposal has already been ${status}.` };
  }
  return { code: "conflict:proposal_decided", message: "This proposal changed in another window. Reload to see it." };
}
