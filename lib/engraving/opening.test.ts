import { describe, expect, it } from "vitest";
import { OPENING_BARS, openingNoteKeys } from "./opening";

describe("openingNoteKeys", () => {
  it("keeps the keys of the opening's bars (0-based measure index below OPENING_BARS), grace notes included", () => {
    const last = OPENING_BARS - 1;
    const keys = ["P1:m0:s1:v1:0/1:60", `P1:m${last}:s1:v1:3/4:62:g1`, `P1:m${last}:s1:v1:3/4:64`, `P1:m${OPENING_BARS}:s1:v1:0/1:65`, "P1:m40:s2:v5:1/2:48"];
    expect(openingNoteKeys(keys)).toEqual(keys.slice(0, 3));
  });

  it("reads the measure index from the end of the key, whatever the part id holds", () => {
    expect(openingNoteKeys(["score:m99:7:m2:s1:v1:0/1:60", "score:m1:7:m20:s1:v1:0/1:60"])).toEqual(["score:m99:7:m2:s1:v1:0/1:60"]);
  });
});
