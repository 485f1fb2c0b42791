import { describe, expect, it } from "vitest";
import { scoreNoteKeys, sortNoteKeys } from "./key-order";

describe("sortNoteKeys", () => {
  // The order written out by hand: parts in score order, then measure, staff, voice (numeric, so
  // 5 after 1 and 10 after 5), onset as a fraction (1/8 before 1/4), grace notes g1, g2 before the
  // note they lead into, chord members from the bottom up.
  const ordered = [
    "P1:m0:s1:v1:0/1:62",
    "P1:m1:s1:v1:1/8:69:g1",
    "P1:m1:s1:v1:1/8:71:g2",
    "P1:m1:s1:v1:1/8:67",
    "P1:m1:s1:v1:1/4:72",
    "P1:m1:s1:v2:0/1:55",
    "P1:m12:s1:v1:0/1:60",
    "P2:m0:s1:v1:0/1:65",
    "P2:m0:s1:v1:0/1:69",
    "P2:m0:s1:v1:0/1:72",
    "P2:m0:s2:v5:0/1:53",
    "P2:m0:s2:v10:0/1:41",
  ];

  it("puts a shuffled list back in the shared order", () => {
    const shuffled = [...ordered].reverse();
    [shuffled[2], shuffled[7]] = [shuffled[7], shuffled[2]];
    expect(sortNoteKeys(shuffled, ["P1", "P2"])).toEqual(ordered);
  });

  it("follows the score's part order, not the alphabet", () => {
    expect(sortNoteKeys(["P1:m0:s1:v1:0/1:60", "Piano:m0:s1:v1:0/1:48"], ["Piano", "P1"])).toEqual([
      "Piano:m0:s1:v1:0/1:48",
      "P1:m0:s1:v1:0/1:60",
    ]);
  });

  it("refuses text that is not a note key", () => {
    expect(() => sortNoteKeys(["P1:m0:s1:v1:0/1:60", "nonsense"], ["P1"])).toThrow(/not a note key/);
  });
});

describe("scoreNoteKeys", () => {
  it("leaves rests out and orders the notes of every part", () => {
    const score = {
      parts: [
        { id: "P1", notes: [{ key: "P1:m0:s1:v1:1/4:64", isRest: false }, { key: "", isRest: true }, { key: "P1:m0:s1:v1:0/1:60", isRest: false }] },
        { id: "P2", notes: [{ key: "P2:m0:s2:v5:0/1:48", isRest: false }] },
      ],
    };
    expect(scoreNoteKeys(score)).toEqual(["P1:m0:s1:v1:0/1:60", "P1:m0:s1:v1:1/4:64", "P2:m0:s2:v5:0/1:48"]);
  });
});
