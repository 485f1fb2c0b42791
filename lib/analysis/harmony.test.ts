import { describe, expect, it } from "vitest";
import { barEvidence } from "./bar-evidence";
import { CHORD_FIT, chordFit, nameChord } from "./chord-fit";
import { analyzeScore } from "./index";
import { buildTimeline, extractMelody } from "./melody";
import { dominantSupport } from "./tension";
import { buildPart, buildScore } from "./test-part";

const hist = (...pcs: number[]) => {
  const h = new Float64Array(12);
  for (const pc of pcs) h[pc] += 1;
  return h;
};
const fitIn = (pcs: number[], keyIndex: number) => {
  const chord = nameChord(hist(...pcs));
  if (!chord) throw new Error("no chord");
  return chordFit(chord, new Float64Array(24))[keyIndex];
};
const C_MAJOR = 0;
const G_MAJOR = 7;
const A_MINOR = 12 + 9;

describe("naming chords and fitting them to keys (common practice)", () => {
  it("names triads and seventh chords by their root", () => {
    expect(nameChord(hist(0, 4, 7))).toEqual({ root: 0, quality: "major" });
    expect(nameChord(hist(7, 11, 2, 5))).toEqual({ root: 7, quality: "dominant7" });
    expect(nameChord(hist(9, 0, 4))).toEqual({ root: 9, quality: "minor" });
    expect(nameChord(hist(11, 2, 5))).toEqual({ root: 11, quality: "diminished" });
    expect(nameChord(hist(0, 7))).toBeNull(); // two pitch classes are no chord
  });

  it("fits I and V best, other diatonic chords well, applied dominants still, foreign chords not", () => {
    // source: Open Music Theory v1, "Applied chords": V/V, V/vi … tonicize a degree inside the key.
    expect(fitIn([0, 4, 7], C_MAJOR)).toBe(CHORD_FIT.tonic);
    expect(fitIn([7, 11, 2, 5], C_MAJOR)).toBe(CHORD_FIT.dominant);
    expect(fitIn([2, 5, 9], C_MAJOR)).toBe(CHORD_FIT.diatonic); // ii
    expect(fitIn([2, 6, 9, 0], C_MAJOR)).toBe(CHORD_FIT.applied); // V7/V
    expect(fitIn([4, 8, 11], C_MAJOR)).toBe(CHORD_FIT.applied); // V/vi
    expect(fitIn([3, 7, 10], C_MAJOR)).toBe(CHORD_FIT.foreign); // E♭ major
    // The same D7 is the dominant of G major.
    expect(fitIn([2, 6, 9, 0], G_MAJOR)).toBe(CHORD_FIT.dominant);
    // E major is V of A minor (harmonic minor's raised seventh).
    expect(fitIn([4, 8, 11], A_MINOR)).toBe(CHORD_FIT.dominant);
  });

  it("says when the harmony under a leading tone is a dominant of its target, and when it is not", () => {
    // source: Hutchinson, "Secondary dominant chords": the raised note is the leading tone of the tonicized chord's root.
    const G = 7;
    expect(dominantSupport(new Set([2, 6, 9, 0]), G)).toBe("dominant"); // D7 under F♯
    expect(dominantSupport(new Set([0, 4, 7]), G)).toBe("against"); // C major, IV of G: F♯ would pass
    expect(dominantSupport(new Set([0, 9, 3, 6]), G)).toBe("leading-tone chord"); // F♯°7 = F♯ A C E♭
    expect(dominantSupport(new Set([7, 11, 2]), G)).toBe("against"); // G itself sounds
    expect(dominantSupport(new Set([2]), G)).toBe("unknown");
  });
});

describe("cadences and local keys from every part", () => {
  // A flute melody over a piano that modulates from C major to G major with a V7–I cadence in G.
  const flute = buildPart("E5:h D5:h | C5:h B4:h | C5:h D5:h | C5:h B4:h | A4:h F#4:h | G4:h A4:h | F#4:h G4:h | G4:w |]", { id: "P1", fifths: 0, mode: "major" });
  const piano = buildPart(
    "[C3,G3,C4]:h [G2,G3,B3]:h | [A2,E3,A3]:h [G2,D3,G3]:h | [C3,E3,G3]:h [F2,F3,A3]:h | [G2,F3,G3]:h [G2,D3,G3]:h | " +
      "[D3,A3,C4]:h [D3,A3,C4]:h | [G2,D3,B3]:h [D3,C4,F#3]:h | [D3,A3,C4]:h [G2,D3,B3]:h | [G2,D3,G3]:w |]",
    { id: "P2", fifths: 0, mode: "major", staff: 1 },
  );
  const score = buildScore(flute, piano);

  it("hears a V7–I in the bass as a cadence on the new tonic", () => {
    // common practice: an authentic cadence, V(7)–I with the bass falling a fifth, confirms a key.
    const part = score.parts[0];
    const timeline = buildTimeline(score, part);
    const bars = barEvidence(score, part, timeline, extractMelody(part, timeline));
    expect(bars[6].cadence.get(G_MAJOR)).toBeGreaterThan(0);
    expect(bars[1].cadence.get(C_MAJOR) ?? 0).toBe(0);
    expect(bars[0].melodyOnly).toBe(false);
  });

  it("finds the modulation to G major with the piano's help and names the dominant under the leading tone", () => {
    const p = analyzeScore(score, "t.musicxml").parts[0];
    expect(p.key).toMatchObject({ tonic: "C", mode: "major" });
    const g = p.localKeys.find((k) => k.tonic === "G" && k.mode === "major");
    expect(g).toBeDefined();
    expect(Number(g?.fromMeasure)).toBeGreaterThanOrEqual(4);
    expect(Number(g?.fromMeasure)).toBeLessThanOrEqual(6);
    const fs = p.suggestions.find((s) => s.role === "tension" && s.pitch === "F#4" && s.measure === "7");
    expect(fs?.kind).toBe("leading-tone");
    expect(fs?.reason).toBe("F♯ leads to G under the dominant of G major (bar 7, G major): the leading tone; it rises a half step to G in bar 7.");
  });

  it("ranks each phrase's suggestions by strength, strongest first", () => {
    const p = analyzeScore(score, "t.musicxml").parts[0];
    for (const s of p.suggestions) {
      expect(s.strength).toBeGreaterThanOrEqual(0);
      expect(s.strength).toBeLessThanOrEqual(s.confidence);
      expect(s.rank).toBeGreaterThanOrEqual(1);
    }
    // Rank 1 exists once per phrase, and a rank-1 suggestion is at least as strong as any other.
    const top = p.suggestions.filter((s) => s.rank === 1);
    expect(top.length).toBe(p.phrases.length);
    const strongest = Math.max(...p.suggestions.map((s) => s.strength ?? 0));
    expect(top.some((s) => s.strength === strongest)).toBe(true);
  });
});
