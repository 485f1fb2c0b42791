import { describe, expect, it } from "vitest";
import { analyzeScore } from "./index";
import { alterOfLof, lofOfName, stepOfLof } from "./spelling";
import { buildPart, buildScore } from "./test-part";
import type { PartAnalysis, Suggestion } from "./types";

const analyze = (text: string, fifths: number, mode: string | null = "major", more: Parameters<typeof buildPart>[1] = {}) =>
  analyzeScore(buildScore(buildPart(text, { fifths, mode, ...more })), "t.musicxml").parts[0];

const tensions = (p: PartAnalysis) => p.suggestions.filter((s) => s.role === "tension");
const pitchOf = (p: PartAnalysis, key: string | null) => p.notes.find((n) => n.key === key)?.pitch ?? null;
const find = (p: PartAnalysis, pitch: string, measure?: string) =>
  tensions(p).find((s) => s.pitch === pitch && (measure === undefined || s.measure === measure)) as Suggestion;

describe("leading tones (Open Music Theory; Hutchinson)", () => {
  it("A is the leading tone of B♭ major and rises a half step to B♭", () => {
    // source: Open Music Theory v1, "Tendency tones": "when ti appears it tends to be followed by do".
    // source: Hutchinson, Music Theory for the 21st-Century Classroom §3.3: the leading tone is a half step below the tonic.
    const p = analyze("D5:q C5:q Bb4:q G4:q | F4:q G4:q A4:q Bb4:q |]", -2);
    const a = find(p, "A4");
    expect(a.confidence).toBeGreaterThanOrEqual(0.5);
    expect(pitchOf(p, a.resolvesTo)).toBe("Bb4");
    expect(a.reason).toBe("A is the leading tone of B♭ major; it rises a half step to B♭ in bar 2.");
    const res = p.suggestions.find((s) => s.role === "resolution" && s.pitch === "Bb4" && s.measure === "2");
    expect(res?.reason).toContain("tonic of B♭ major");
  });

  it("in G minor the raised seventh F♯ is the leading tone; the subtonic F is not", () => {
    // source: Hutchinson §3.3 — "the subtonic is a whole step below the tonic, while the leading tone is only a half step below";
    // harmonic and melodic minor raise the seventh (Hutchinson, "Minor scales").
    const p = analyze("G4:q F4:q G4:q Bb4:q | A4:q F#4:q G4:h |]", -2, "minor");
    const fs = find(p, "F#4");
    expect(fs.confidence).toBeGreaterThanOrEqual(0.5);
    expect(pitchOf(p, fs.resolvesTo)).toBe("G4");
    expect(fs.reason).toContain("leading tone");
    expect(fs.reason).toContain("G minor");
    expect(tensions(p).some((s) => s.pitch === "F4")).toBe(false);
    expect(p.notes.find((n) => n.pitch === "F4")?.degree).toBe(7);
  });

  it("reports a leading tone the melody leaves by leap, with no resolution and a reason that says so", () => {
    // source: Open Music Theory v1 — the "frustrated leading tone" drops away instead of rising to do.
    const p = analyze("C5:q E5:q D5:q B4:q | G4:h C5:h |]", 0);
    const b = find(p, "B4");
    expect(b.resolvesTo).toBeNull();
    expect(b.reason).toMatch(/does not resolve/);
    expect(b.reason).toContain("bar 1");
    expect(b.reason).toContain("C major");
  });

  it("lets a short turn delay the resolution, but not one through the same letter inflected (B, B♭, C)", () => {
    // common practice: an ornament decorates the leading tone before it rises; its own chromatic
    // inflection (B♮ → B♭) cancels the leading tone — Hutchinson §3.3, the leading tone is the
    // note a half step below the tonic, and B♭ is the subtonic.
    const turned = analyze("E5:q D5:q B4:q A4:e C5:e | C5:w |]", 0);
    expect(pitchOf(turned, find(turned, "B4").resolvesTo)).toBe("C5");
    const inflected = analyze("E5:q D5:q B4:q Bb4:e C5:e | C5:w |]", 0);
    expect(find(inflected, "B4").resolvesTo).toBeNull();
  });
});

describe("other tendency tones", () => {
  it("scale degree 4 falls to 3 in major", () => {
    // source: Open Music Theory v1, "Functional dissonances": in dominant function 4 (fa) resolves down to 3 (mi).
    const p = analyze("G4:q A4:q G4:q F4:q | E4:h C4:h |]", 0);
    const f = find(p, "F4");
    expect(f.confidence).toBeGreaterThanOrEqual(0.5);
    expect(pitchOf(p, f.resolvesTo)).toBe("E4");
    expect(f.reason).toContain("subdominant");
  });

  it("the lowered sixth falls to 5 in minor", () => {
    // source: Open Music Theory v1, "Tendency tones": "when le appears, it tends to be followed by sol".
    const p = analyze("A4:q C5:q B4:q A4:q | F5:q E5:q C5:q A4:q |]", 0, "minor");
    const f = find(p, "F5");
    expect(f.confidence).toBeGreaterThanOrEqual(0.5);
    expect(pitchOf(p, f.resolvesTo)).toBe("E5");
    expect(f.reason).toContain("lowered sixth");
  });

  it("in C major F♯ rising to G is a secondary leading tone", () => {
    // source: Open Music Theory v1, "Applied chords": "the chromatically raised tone tends to be the leading-tone of the tonicized key";
    // check-values §2.3 test idea.
    const p = analyze("C5:q B4:q A4:q F#4:q | G4:h E4:h |]", 0);
    const fs = find(p, "F#4");
    expect(fs.confidence).toBeGreaterThanOrEqual(0.5);
    expect(pitchOf(p, fs.resolvesTo)).toBe("G4");
    expect(fs.reason).toContain("leading tone to G");
  });

  it("a chromatically lowered note falls a half step (B♭ → A in C major)", () => {
    // source: Hutchinson, "Secondary dominant chords": the lowered note of V7/IV acts as 4 of the tonicized chord and falls.
    const p = analyze("C5:q Bb4:q A4:q G4:q | F4:h E4:h |]", 0);
    const bb = find(p, "Bb4");
    expect(bb.confidence).toBeGreaterThanOrEqual(0.5);
    expect(pitchOf(p, bb.resolvesTo)).toBe("A4");
  });

  it("spells: A♯ (raised sixth) rises to B, B♭ (lowered seventh) falls to A", () => {
    // source: check-values §2.3 — A♯ and B♭ are different degrees (♯6 vs ♭7 in C).
    const p = analyze("G4:q A#4:q B4:q C5:q | C5:q Bb4:q A4:q G4:q |]", 0);
    expect(pitchOf(p, find(p, "A#4").resolvesTo)).toBe("B4");
    expect(pitchOf(p, find(p, "Bb4").resolvesTo)).toBe("A4");
    expect(p.notes.find((n) => n.pitch === "A#4")?.degree).toBe(6);
    expect(p.notes.find((n) => n.pitch === "Bb4")?.degree).toBe(7);
  });

  it("measures resolution to the next sounding note, skipping grace notes", () => {
    // common practice: a grace note ornaments the note it leads into.
    const p = analyze("C5:q D5:q B4:q C5:g D5:g C5:q | G4:w |]", 0);
    expect(pitchOf(p, find(p, "B4").resolvesTo)).toBe("C5");
  });
});

describe("possible appoggiaturas and the other parts", () => {
  const melody = "C5:q E5:q D5:q C5:q | A5:h G5:q E5:q | F5:q D5:q B4:q D5:q | C5:w |]";

  it("keeps a melodic-only appoggiatura below 0.5", () => {
    // common practice: without the harmony an accented leap-then-step note is only possibly dissonant.
    const p = analyze(melody, 0);
    const a = find(p, "A5");
    expect(a.confidence).toBeLessThan(0.5);
    expect(a.reason).toContain("possibly an appoggiatura");
    expect(pitchOf(p, a.resolvesTo)).toBe("G5");
  });

  it("raises it when the other part sounds a chord without the note, lowers it when the chord holds it", () => {
    // common practice: a note outside the sounding chord is a non-chord tone.
    const flute = buildPart(melody, { fifths: 0, mode: "major" });
    const outside = buildPart("[C3,E3,G3]:w | [C3,E3,G3]:w | [G2,B2,D3]:w | [C3,E3,G3]:w |]", { id: "P2", name: "Piano", fifths: 0 });
    const inside = buildPart("[C3,E3,G3]:w | [A2,C3,E3]:w | [G2,B2,D3]:w | [C3,E3,G3]:w |]", { id: "P2", name: "Piano", fifths: 0 });
    const conf = (acc: typeof outside) => find(analyzeScore(buildScore(flute, acc), "t").parts[0], "A5").confidence;
    expect(conf(outside)).toBeGreaterThanOrEqual(0.5);
    expect(conf(inside)).toBeLessThan(find(analyze(melody, 0), "A5").confidence);
  });

  it("counts the top of a written chord as a chord tone of its own part", () => {
    // common practice: the notes of one written chord sound together, so none is a non-chord tone against the others.
    const piano = buildPart("[E4,G4,C5]:q [G4,E5]:q [F4,D5]:q [E4,C5]:q | [C5,F5,A5]:h [C5,E5,G5]:q [C5,E5]:q | [F4,A4,C5]:w |]", { name: "Piano", fifths: 0 });
    const a = find(analyzeScore(buildScore(piano), "t").parts[0], "A5");
    expect(a.confidence).toBeLessThan(find(analyze(melody, 0), "A5").confidence);
  });
});

/**
 * check-values §2.3 "Table of tension notes and resolutions for every signature" [computed from
 * Hutchinson and Open Music Theory, spelled on the line of fifths]: major LT→1, ♯4→5, 4→3;
 * minor raised 7→1, ♭6→5.
 */
const TABLE: Array<[number, string, string, string, string, string, string, string]> = [
  [-7, "Cb", "Bb>Cb", "F>Gb", "Fb>Eb", "Ab", "G>Ab", "Fb>Eb"],
  [-6, "Gb", "F>Gb", "C>Db", "Cb>Bb", "Eb", "D>Eb", "Cb>Bb"],
  [-5, "Db", "C>Db", "G>Ab", "Gb>F", "Bb", "A>Bb", "Gb>F"],
  [-4, "Ab", "G>Ab", "D>Eb", "Db>C", "F", "E>F", "Db>C"],
  [-3, "Eb", "D>Eb", "A>Bb", "Ab>G", "C", "B>C", "Ab>G"],
  [-2, "Bb", "A>Bb", "E>F", "Eb>D", "G", "F#>G", "Eb>D"],
  [-1, "F", "E>F", "B>C", "Bb>A", "D", "C#>D", "Bb>A"],
  [0, "C", "B>C", "F#>G", "F>E", "A", "G#>A", "F>E"],
  [1, "G", "F#>G", "C#>D", "C>B", "E", "D#>E", "C>B"],
  [2, "D", "C#>D", "G#>A", "G>F#", "B", "A#>B", "G>F#"],
  [3, "A", "G#>A", "D#>E", "D>C#", "F#", "E#>F#", "D>C#"],
  [4, "E", "D#>E", "A#>B", "A>G#", "C#", "B#>C#", "A>G#"],
  [5, "B", "A#>B", "E#>F#", "E>D#", "G#", "F##>G#", "E>D#"],
  [6, "F#", "E#>F#", "B#>C#", "B>A#", "D#", "C##>D#", "B>A#"],
  [7, "C#", "B#>C#", "F##>G#", "F#>E#", "A#", "G##>A#", "F#>E#"],
];

/** A spelled note with the octave that puts it nearest `near` (MIDI). */
function withOctave(name: string, near: number): string {
  const lof = lofOfName(name);
  const base = { C: 0, D: 2, E: 4, F: 5, G: 7, A: 9, B: 11 }[stepOfLof(lof)] + alterOfLof(lof);
  let best = 0;
  for (let oct = 2; oct <= 7; oct++) {
    const midi = 12 * (oct + 1) + base;
    if (Math.abs(midi - near) < Math.abs(12 * (best + 1) + base - near)) best = oct;
  }
  return `${name}${best}`;
}

/** A two-note figure "X>Y" written so that it moves by a half step in the stated direction. */
function figure(pair: string, near: number, dir: 1 | -1): [string, string] {
  const [a, b] = pair.split(">");
  return [withOctave(a, near), withOctave(b, near + dir)];
}

describe("tension tones in every key signature from 7 flats to 7 sharps (check-values §2.3)", () => {
  for (const [fifths, major, lt, sharp4, four, minor, raised7, flat6] of TABLE) {
    it(`fifths ${fifths}: ${major} major and ${minor} minor`, () => {
      const [lt1, lt2] = figure(lt, 71, 1);
      const [s1, s2] = figure(sharp4, 66, 1);
      const [f1, f2] = figure(four, 65, -1);
      const tonic = withOctave(major, 72);
      const pMaj = analyze(`${tonic}:q ${lt1}:q ${lt2}:q ${f1}:q | ${f2}:q ${s1}:q ${s2}:q ${tonic}:q |]`, fifths, "major");
      expect(pMaj.key.tonic).toBe(major);
      for (const [a, b] of [
        [lt1, lt2],
        [s1, s2],
        [f1, f2],
      ]) {
        const t = find(pMaj, a);
        expect(t, `${a} in ${major} major`).toBeDefined();
        expect(t.confidence).toBeGreaterThanOrEqual(0.5);
        expect(pitchOf(pMaj, t.resolvesTo)).toBe(b);
      }

      const [r1, r2] = figure(raised7, 71, 1);
      const [b1, b2] = figure(flat6, 68, -1);
      const mt = withOctave(minor, 72);
      const pMin = analyze(`${mt}:q ${r1}:q ${r2}:q ${b1}:q | ${b2}:q ${r1}:q ${r2}:h |]`, fifths, "minor");
      expect(pMin.key.tonic).toBe(minor);
      expect(pMin.key.mode).toBe("minor");
      for (const [a, b] of [
        [r1, r2],
        [b1, b2],
      ]) {
        const t = find(pMin, a);
        expect(t, `${a} in ${minor} minor`).toBeDefined();
        expect(t.confidence).toBeGreaterThanOrEqual(0.5);
        expect(pitchOf(pMin, t.resolvesTo)).toBe(b);
      }
    });
  }
});
