import { describe, expect, it } from "vitest";
import { workingTempoOf } from "./working-tempo";

describe("workingTempoOf", () => {
  it("takes the player's tempo first, then the part's own, else none (asked for)", () => {
    expect(workingTempoOf({ tempo: 84, workingTempo: 66 })).toBe(66);
    expect(workingTempoOf({ tempo: 84, workingTempo: null })).toBe(84);
    expect(workingTempoOf({ tempo: null, workingTempo: null })).toBeNull();
    expect(workingTempoOf({ tempo: 0, workingTempo: null })).toBeNull();
  });
});
