import { describe, expect, it } from "vitest";
import { findKey, keyCorrelation, pearson } from "./key-finding";
import { AARDEN_ESSEN, KRUMHANSL_KESSLER, SIMPLE_MAJOR, TEMPERLEY_1999, TEMPERLEY_2007_PRESENCE } from "./profiles";

const NAMES = ["C", "C#", "D", "Eb", "E", "F", "F#", "G", "Ab", "A", "Bb", "B"];
const top = (h: number[], p = KRUMHANSL_KESSLER) => {
  const best = findKey(h, p)[0];
  return { name: `${NAMES[best.tonicPc]} ${best.mode}`, r: best.r };
};
const rOf = (h: number[], p: typeof KRUMHANSL_KESSLER, tonic: string, mode: "major" | "minor") => keyCorrelation(h, p, NAMES.indexOf(tonic), mode);

describe("published key profiles", () => {
  it("holds the Krumhansl–Kessler (1982) probe-tone ratings, with 2.23 (not 2.33) for ♭2 in major", () => {
    // source: Krumhansl & Kessler 1982, as in music21 KrumhanslKessler, AMADS and MIDI Toolbox refstat.m (check-values §1.1).
    expect(KRUMHANSL_KESSLER.major).toEqual([6.35, 2.23, 3.48, 2.33, 4.38, 4.09, 2.52, 5.19, 2.39, 3.66, 2.29, 2.88]);
    expect(KRUMHANSL_KESSLER.minor).toEqual([6.33, 2.68, 3.52, 5.38, 2.6, 3.53, 2.54, 4.75, 3.98, 2.69, 3.34, 3.17]);
    expect(KRUMHANSL_KESSLER.major[1]).toBe(2.23);
  });

  it("holds Temperley (1999) whose minor profile expects the raised seventh", () => {
    // source: Temperley 1999 via AMADS class Temperley and MIDI Toolbox kkmajt/kkmint (check-values §1.1, §9 item 2).
    expect(TEMPERLEY_1999.minor[11]).toBe(4.0);
    expect(TEMPERLEY_1999.minor[10]).toBe(1.5);
    expect(TEMPERLEY_1999.major).toEqual([5.0, 2.0, 3.5, 2.0, 4.5, 4.0, 2.0, 4.5, 2.0, 3.5, 1.5, 4.0]);
  });

  it("holds Temperley (2007) presence probabilities: tonic-triad degrees most likely, the raised seventh likely in minor", () => {
    // source: Temperley 2007, Music and Probability, ch. 6 (Kostka–Payne counts) — values from memory.
    for (const p of [...TEMPERLEY_2007_PRESENCE.major, ...TEMPERLEY_2007_PRESENCE.minor]) expect(p > 0 && p < 1).toBe(true);
    const rankMajor = [...TEMPERLEY_2007_PRESENCE.major.keys()].sort((a, b) => TEMPERLEY_2007_PRESENCE.major[b] - TEMPERLEY_2007_PRESENCE.major[a]);
    expect(rankMajor.slice(0, 3).sort()).toEqual([0, 4, 7]);
    const rankMinor = [...TEMPERLEY_2007_PRESENCE.minor.keys()].sort((a, b) => TEMPERLEY_2007_PRESENCE.minor[b] - TEMPERLEY_2007_PRESENCE.minor[a]);
    expect(rankMinor.slice(0, 3).sort()).toEqual([0, 3, 7]);
    expect(TEMPERLEY_2007_PRESENCE.minor[11]).toBeGreaterThan(TEMPERLEY_2007_PRESENCE.minor[10]);
  });

  it("holds Aarden–Essen (2003)", () => {
    // source: Aarden 2003 via music21 AardenEssen and AMADS (check-values §1.1).
    expect(AARDEN_ESSEN.major[7]).toBe(22.062);
    expect(AARDEN_ESSEN.minor[0]).toBe(18.2648);
    expect(AARDEN_ESSEN.major).toHaveLength(12);
    expect(AARDEN_ESSEN.minor).toHaveLength(12);
  });
});

describe("Krumhansl–Schmuckler golden cases", () => {
  const keycor = [8, 0, 0, 0, 2, 11, 0, 5, 7, 0, 5, 2];

  it("correlates keycor's example with the simple C-major weights at r = 0.35", () => {
    // source: Humdrum Extras keycor manpage example (r = 0.35; 0.3493 computed, check-values §1.3).
    expect(pearson(keycor, [...SIMPLE_MAJOR])).toBeCloseTo(0.3493, 3);
  });

  it("finds F minor for keycor's histogram with K–K (r = 0.8650), then F major and C major", () => {
    // source: check-values §1.3 [computed with the K–S algorithm of §1.2].
    const ranked = findKey(keycor, KRUMHANSL_KESSLER);
    expect(`${NAMES[ranked[0].tonicPc]} ${ranked[0].mode}`).toBe("F minor");
    expect(ranked[0].r).toBeCloseTo(0.865, 3);
    expect(`${NAMES[ranked[1].tonicPc]} ${ranked[1].mode}`).toBe("F major");
    expect(ranked[1].r).toBeCloseTo(0.6718, 3);
    expect(rOf(keycor, KRUMHANSL_KESSLER, "C", "major")).toBeCloseTo(0.4561, 3);
  });

  it("finds F minor for keycor's histogram with Temperley (0.8476) and Aarden–Essen (0.8983)", () => {
    // source: check-values §1.3 [computed].
    expect(top(keycor, TEMPERLEY_1999)).toMatchObject({ name: "F minor" });
    expect(top(keycor, TEMPERLEY_1999).r).toBeCloseTo(0.8476, 3);
    expect(top(keycor, AARDEN_ESSEN)).toMatchObject({ name: "F minor" });
    expect(top(keycor, AARDEN_ESSEN).r).toBeCloseTo(0.8983, 3);
  });

  it("hears the C major scale as C major with K–K and Temperley, but as A minor with Aarden–Essen", () => {
    // source: check-values §1.3 — a regression test that the profile matters.
    const scale = [2, 0, 1, 0, 1, 1, 0, 1, 0, 1, 0, 1];
    expect(top(scale).name).toBe("C major");
    expect(top(scale).r).toBeCloseTo(0.9014, 3);
    expect(rOf(scale, KRUMHANSL_KESSLER, "A", "minor")).toBeCloseTo(0.7563, 3);
    expect(top(scale, TEMPERLEY_1999).r).toBeCloseTo(0.9431, 3);
    expect(top(scale, AARDEN_ESSEN).name).toBe("A minor");
    expect(top(scale, AARDEN_ESSEN).r).toBeCloseTo(0.8244, 3);
    expect(rOf(scale, AARDEN_ESSEN, "C", "major")).toBeCloseTo(0.8181, 3);
  });

  it("hears A harmonic minor as A minor with all three profiles; A natural minor as C major with Temperley", () => {
    // source: check-values §1.3 [computed].
    const harmonic = [1, 0, 1, 0, 1, 1, 0, 0, 1, 2, 0, 1];
    expect(top(harmonic)).toMatchObject({ name: "A minor" });
    expect(top(harmonic).r).toBeCloseTo(0.8466, 3);
    expect(top(harmonic, TEMPERLEY_1999).r).toBeCloseTo(0.9431, 3);
    expect(top(harmonic, AARDEN_ESSEN)).toMatchObject({ name: "A minor" });
    expect(top(harmonic, AARDEN_ESSEN).r).toBeCloseTo(0.7461, 3);
    const natural = [1, 0, 1, 0, 1, 1, 0, 1, 0, 2, 0, 1];
    expect(top(natural).name).toBe("A minor");
    expect(top(natural).r).toBeCloseTo(0.8662, 3);
    expect(top(natural, TEMPERLEY_1999).name).toBe("C major");
    expect(top(natural, TEMPERLEY_1999).r).toBeCloseTo(0.7734, 3);
  });

  it("moves the answer by k when the histogram is transposed by k semitones", () => {
    // source: check-values §1.3 test idea — K–S is transposition invariant.
    const keycor2 = [8, 0, 0, 0, 2, 11, 0, 5, 7, 0, 5, 2];
    for (const profile of [KRUMHANSL_KESSLER, TEMPERLEY_1999, AARDEN_ESSEN]) {
      const base = findKey(keycor2, profile);
      for (let k = 1; k < 12; k++) {
        const rotated = keycor2.map((_, i) => keycor2[(i - k + 12) % 12]);
        const moved = findKey(rotated, profile);
        expect(moved[0].mode).toBe(base[0].mode);
        expect(moved[0].tonicPc).toBe((base[0].tonicPc + k) % 12);
        expect(moved[0].r).toBeCloseTo(base[0].r, 10);
      }
    }
  });
});
