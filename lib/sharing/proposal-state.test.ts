import { describe, expect, it } from "vitest";
import type { ProposalStatus } from "./dto";
import { canTakeAction, proposalConflict, type ProposalAction } from "./proposal-state";

const STATUSES: ProposalStatus[] = ["open", "stale", "accepted", "declined", "withdrawn"];

describe("what can be done to a proposal in each state", () => {
  // Rows: status; columns: accept, decline, withdraw (docs/sharing.md, "Proposals").
  const table: Record<ProposalStatus, [boolean, boolean, boolean]> = {
    open: [true, true, true],
    stale: [false, true, true],
    accepted: [false, false, false],
    declined: [false, false, false],
    withdrawn: [false, false, false],
  };
  const actions: ProposalAction[] = ["accept", "decline", "withdraw"];
  for (const status of STATUSES) {
    actions.forEach((action, i) => {
      it(`${action} a ${status} proposal → ${table[status][i] ? "allowed" : "409"}`, () => {
        expect(canTakeAction(status, action)).toBe(table[status][i]);
        expect(proposalConflict(status, action, "Ada") === null).toBe(table[status][i]);
      });
    });
  }
});

describe("the 409 a person reads", () => {
  it("names who withdrew when the owner tries to accept or decline", () => {
    expect(proposalConflict("withdrawn", "accept", "Theo Teacher")).toEqual({
      code: "conflict:proposal_withdrawn",
      message: "Theo Teacher withdrew this proposal, so there is nothing to accept.",
    });
    expect(proposalConflict("withdrawn", "decline", "Theo Teacher")?.message).toBe("Theo Teacher withdrew this proposal, so there is nothing to decline.");
  });

  it("tells the author a decided proposal can no longer be taken back", () => {
    expect(proposalConflict("accepted", "withdraw", "Theo")).toMatchObject({ code: "conflict:proposal_decided", message: expect.stringMatching(/already been accepted, so it can no longer be withdrawn/) });
    expect(proposalConflict("declined", "withdraw", "Theo")?.message).toMatch(/already been declined/);
    expect(proposalConflict("withdrawn", "withdraw", "Theo")?.message).toBe("You have already withdrawn this proposal.");
  });

  it("keeps the stale answer for accepting an out-of-date proposal", () => {
    expect(proposalConflict("stale", "accept", "Theo")?.code).toBe("conflict:proposal_stale");
  });
});
