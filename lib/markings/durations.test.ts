import { describe, expect, it } from "vitest";
import { noteDurations, resolutionsOf } from "./durations";

describe("noteDurations", () => {
  it("turns whole-note fractions into seconds at the tempo", () => {
    // At 60 quarter notes per minute a quarter lasts 1 s, a dotted half 3 s (arithmetic).
    expect(noteDurations([{ key: "a", duration: "1/4" }, { key: "b", duration: "3/4" }], 60)).toEqual({ a: 1, b: 3 });
    // At 120 an eighth lasts 0.25 s.
    expect(noteDurations([{ key: "c", duration: "1/8" }], 120)).toEqual({ c: 0.25 });
  });

  it("is empty without a tempo and skips malformed durations", () => {
    expect(noteDurations([{ key: "a", duration: "1/4" }], null)).toEqual({});
    expect(noteDurations([{ key: "a", duration: "1/0" }, { key: "b", duration: "x" }], 90)).toEqual({});
  });
});

describe("resolutionsOf", () => {
  it("keeps only tension tones that name their resolution", () => {
    expect(
      resolutionsOf([
        { note: "t", role: "tension", resolvesTo: "r" },
        { note: "u", role: "tension", resolvesTo: null },
        { note: "p", role: "peak", resolvesTo: "q" },
      ]),
    ).toEqual({ t: "r" });
  });
});
