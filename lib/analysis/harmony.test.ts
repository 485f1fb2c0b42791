import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { readScoreFile } from "@/lib/musicxml";
import { barEvidence } from "./bar-evidence";
import { CHORD_FIT, chordFitRow, nameChord } from "./chord-fit";
import { analyzePart, analyzeScore } from "./index";
import { type KeySection, LOCAL_KEY, settleMode } from "./local-keys";
import { buildTimeline, extractMelody } from "./melody";
import { lofOfName } from "./spelling";
import { dominantSupport, namesTarget, spelledAsRoot } from "./tension";
import { buildPart, buildScore } from "./test-part";

const hist = (...pcs: number[]) => {
  const h = new Float64Array(12);
  for (const pc of pcs) h[pc] += 1;
  return h;
};
const fitIn = (pcs: number[], keyIndex: number) => {
  const chord = nameChord(hist(...pcs));
  if (!chord) throw new Error("no chord");
  return chordFitRow(chord)[keyIndex];
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
    // One note outside D9 and F♯°7 (C♯, the raised fourth of G) already rules them out.
    expect(dominantSupport(new Set([1]), G)).toBe("against");
    expect(dominantSupport(new Set([11]), G)).toBe("against"); // B, G's third
    // Two notes of F♯°7 (C and E♭ over the melody's F♯) already spell the diminished seventh.
    expect(dominantSupport(new Set([0, 3]), G)).toBe("leading-tone chord");
    // source: Aldwell & Schachter, Harmony and Voice Leading, "V9" (from memory): D–E under F♯ is D9's root and ninth …
    expect(dominantSupport(new Set([2, 4]), G)).toBe("dominant");
    // … but without the dominant's root E is the sixth of G against F♯ (C–E: IV of G).
    expect(dominantSupport(new Set([0, 4]), G)).toBe("against");
  });

  it("asks a full V or vii° before calling a note of the key the leading tone of another degree", () => {
    // source: Open Music Theory v1, "Applied chords": V/x and vii°/x hold the leading tone of x.
    const C = 0;
    expect(namesTarget(new Set([7, 2]), C)).toBe(true); // G–D under B: V of C
    expect(namesTarget(new Set([7, 5]), C)).toBe(true); // G–F: V7 without its fifth
    expect(namesTarget(new Set([2, 5, 8]), C)).toBe(true); // B°7 without B
    expect(namesTarget(new Set([7]), C)).toBe(false); // one note names no chord
    expect(namesTarget(new Set([7, 9]), C)).toBe(false); // root and ninth alone: no triad
    expect(namesTarget(new Set([4, 7]), C)).toBe(false); // E–G: the target's third sounds against B
  });
});

describe("a diminished seventh chord names its root by its spelling", () => {
  it("takes C♯ as the leading tone of D under C♯–E–G–B♭, not under A♯–C♯–E–G", () => {
    // source: Hutchinson, "Secondary dominant chords": vii°7/x is built on x's leading tone, in stacked minor thirds.
    const lof = (name: string) => lofOfName(name);
    expect(spelledAsRoot(new Set([lof("E"), lof("G"), lof("Bb")]), lof("C#"))).toBe(true);
    expect(spelledAsRoot(new Set([lof("A#"), lof("E"), lof("G")]), lof("C#"))).toBe(false);
    expect(spelledAsRoot(new Set([lof("G")]), lof("C#"))).toBe(true); // one note: spelling says nothing
    const flute = buildPart("C5:h C#5:h | D5:w |]", { id: "P1", fifths: 0, mode: "major" });
    const under = (chord: string) => {
      const piano = buildPart(`[C3,E3,G3]:h ${chord}:h | [D3,F3,A3]:w |]`, { id: "P2", fifths: 0, mode: "major", staff: 1 });
      return analyzeScore(buildScore(flute, piano), "t.musicxml").parts[0].suggestions.find((s) => s.role === "tension" && s.pitch === "C#5");
    };
    expect(under("[E3,G3,Bb3]")?.confidence).toBeGreaterThanOrEqual(0.5);
    expect(under("[A#2,E3,G3]")?.confidence ?? 0).toBeLessThan(0.5);
  });
});

describe("applied dominants under a note of the key", () => {
  it("hears B rising to C over G–D–F in A minor as the leading tone of C (V7/III)", () => {
    // source: Hutchinson, "Secondary dominant chords": the third of V/x is the leading tone of x.
    const flute = buildPart("A4:h E5:h | D5:h B4:h | C5:w |]", { id: "P1", fifths: 0, mode: "minor" });
    const piano = buildPart("[A2,C4,E4]:h [A2,C4,E4]:h | [G2,D4,F4]:h [G2,D4,F4]:h | [C3,E4,G4]:w |]", { id: "P2", fifths: 0, mode: "minor", staff: 1 });
    const p = analyzeScore(buildScore(flute, piano), "t.musicxml").parts[0];
    const b = p.suggestions.find((s) => s.role === "tension" && s.pitch === "B4");
    expect(b?.kind).toBe("applied-leading-tone");
    expect(b?.confidence).toBeGreaterThanOrEqual(0.5);
    expect(b?.reason).toContain("leading tone of C");
  });

  it("keeps E rising to F over C–G in C major the third of I, not V/IV (no seventh)", () => {
    // common practice: the tonic triad becomes V7/IV only with its added seventh (B♭).
    const flute = buildPart("G4:h E5:h | F5:h D5:h | C5:w |]", { id: "P1", fifths: 0, mode: "major" });
    const plain = buildPart("[C3,G3,C4]:h [C3,G3,C4]:h | [F3,A3,C4]:h [G2,B3,D4]:h | [C3,G3,C4]:w |]", { id: "P2", fifths: 0, mode: "major", staff: 1 });
    const seventh = buildPart("[C3,G3,C4]:h [C3,G3,Bb3]:h | [F3,A3,C4]:h [G2,B3,D4]:h | [C3,G3,C4]:w |]", { id: "P2", fifths: 0, mode: "major", staff: 1 });
    const eIn = (piano: ReturnType<typeof buildPart>) =>
      analyzeScore(buildScore(flute, piano), "t.musicxml").parts[0].suggestions.find((s) => s.role === "tension" && s.pitch === "E5");
    expect(eIn(plain)?.kind).not.toBe("applied-leading-tone");
    expect(eIn(seventh)?.kind).toBe("applied-leading-tone");
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

  it("hears no cadence on a chord with its minor seventh: C7 after G7 is V7/IV, not I", () => {
    // common practice: the added minor seventh turns a major triad into a dominant (Hutchinson, "Secondary dominant chords").
    const melody = buildPart("D5:h F5:h | E5:h E5:h |]", { id: "P1", fifths: 0, mode: "major" });
    const plain = buildPart("[G2,B3,F4]:h [G2,B3,F4]:h | [C3,C4,E4]:h [C3,C4,E4]:h |]", { id: "P2", fifths: 0, mode: "major", staff: 1 });
    const seventh = buildPart("[G2,B3,F4]:h [G2,B3,F4]:h | [C3,Bb3,E4]:h [C3,Bb3,E4]:h |]", { id: "P2", fifths: 0, mode: "major", staff: 1 });
    const arrival = (piano: ReturnType<typeof buildPart>) => {
      const s = buildScore(melody, piano);
      const part = s.parts[0];
      const timeline = buildTimeline(s, part);
      return barEvidence(s, part, timeline, extractMelody(part, timeline))[1].cadence.get(C_MAJOR) ?? 0;
    };
    expect(arrival(plain)).toBeGreaterThan(0);
    expect(arrival(seventh)).toBe(0);
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

describe("tonicizations, final cadences and an inferred mode", () => {
  it("keeps a tonicized III without a cadence in A minor, as the experts read Rimsky-Korsakov 23d", () => {
    // source: tests/fixtures/harmony/rimsky-korsakov-23d.rntxt (Nápoles López et al. 2020, When-in-Rome
    // conversion, CC BY-SA 4.0): "a: i iv65 | V2/III III6 | V65/vi f: i" — every bar in A minor; the C
    // major chord is III reached from its applied dominant, not a cadence in C major.
    const file = path.resolve(import.meta.dirname, "../../tests/fixtures/harmony/rimsky-korsakov-23d.mxl");
    const { score } = readScoreFile(readFileSync(file), "rimsky-korsakov-23d.mxl");
    const p = analyzePart(score, score.parts[0]);
    expect(p.key).toMatchObject({ tonic: "A", mode: "minor" });
    expect(p.localKeys.filter((k) => k.tonic === "C")).toEqual([]);
  });

  it("starts a closing key at its cadence: the chords before are applied chords of the old key", () => {
    // common practice (textbook analyses of modulations): C: I – V7/V – V/V … G: I, the new key
    // written from the arrival of its tonic from its dominant.
    const flute = "E5:h G5:h | F#5:h A5:h | C5:h D5:h | C5:h B4:h | A4:h F#4:h | G4:w |]";
    const piano = "[C3,G3,C4]:h [C3,G3,E4]:h | [D3,A3,C4]:h [D3,F#3,C4]:h | [E3,G3,E4]:h [D3,F#3,A3]:h | [E3,G3,E4]:h [G2,D3,G3]:h | [D3,A3,C4]:h [D3,A3,C4]:h | [G2,D3,B3]:w |]";
    const score = buildScore(buildPart(flute, { id: "P1", fifths: 0, mode: "major" }), buildPart(piano, { id: "P2", fifths: 0, mode: "major", staff: 1 }));
    const at = (closingAtCadence: number) => analyzePart(score, score.parts[0], { localKey: { ...LOCAL_KEY, closingAtCadence } }).localKeys.find((k) => k.tonic === "G");
    expect(at(1)?.fromMeasure).toBe("6");
    expect(Number(at(0)?.fromMeasure ?? 6)).toBeLessThan(6);
  });

  it("settles an inferred mode on the key the section opens in", () => {
    // common practice: music opens on its tonic chord; C major and A minor share the signature.
    const score = buildScore(
      buildPart("E5:h G5:h | A5:h F5:h | D5:h B4:h | C5:w |]", { id: "P1", fifths: 0, mode: null }),
      buildPart("[C3,G3,C4]:h [C3,G3,E4]:h | [F3,A3,C4]:h [F3,A3,C4]:h | [G2,F3,B3]:h [G2,F3,B3]:h | [C3,G3,C4]:w |]", { id: "P2", fifths: 0, mode: null, staff: 1 }),
    );
    const part = score.parts[0];
    const timeline = buildTimeline(score, part);
    const bars = barEvidence(score, part, timeline, extractMelody(part, timeline));
    const guess: KeySection = { fromIndex: 0, toIndex: 3, fifths: 0, key: { tonicLof: 3, mode: "minor" }, source: "inferred" };
    expect(settleMode(guess, bars).key).toEqual({ tonicLof: 0, mode: "major" });
    expect(settleMode({ ...guess, key: { tonicLof: 0, mode: "major" } }, bars).key).toEqual({ tonicLof: 0, mode: "major" });
    // A signature's key is never second-guessed.
    expect(settleMode({ ...guess, source: "signature" }, bars).key).toEqual({ tonicLof: 3, mode: "minor" });
  });
});
