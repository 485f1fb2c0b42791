import { describe, expect, it } from "vitest";
import { analyzeScore } from "./index";
import { LOCAL_KEY } from "./local-keys";
import { buildPart, buildScore } from "./test-part";

const analyze = (text: string, fifths: number, mode: string | null = "major") =>
  analyzeScore(buildScore(buildPart(text, { fifths, mode })), "t.musicxml").parts[0];

describe("local keys", () => {
  it("finds a modulation to the dominant, with its span, when the new leading tone appears", () => {
    // common practice: a phrase in G major that cadences in D major with C♯ leading tones has modulated to D.
    const p = analyze(
      "G4:q B4:q D5:q B4:q | C5:q A4:q F#4:q A4:q | G4:q B4:q A4:q F#4:q | G4:w | " +
        "A4:q C#5:q E5:q C#5:q | D5:q F#5:q A5:q F#5:q | E5:q C#5:q A4:q C#5:q | D5:w | " +
        "D5:q B4:q G4:q B4:q | C5:q A4:q F#4:q A4:q | B4:q G4:q A4:q F#4:q | G4:w |]",
      1,
    );
    expect(p.key).toEqual({ tonic: "G", mode: "major", fifths: 1, source: "signature" });
    expect(p.localKeys).toHaveLength(1);
    const d = p.localKeys[0];
    expect([d.tonic, d.mode]).toEqual(["D", "major"]);
    expect(Number(d.fromMeasure)).toBeGreaterThanOrEqual(4);
    expect(Number(d.fromMeasure)).toBeLessThanOrEqual(5);
    expect(Number(d.toMeasure)).toBeGreaterThanOrEqual(8);
    expect(Number(d.toMeasure)).toBeLessThanOrEqual(9);
    // In the key in force (D major) C♯ is the seventh degree, the leading tone.
    expect(p.notes.find((n) => n.pitch === "C#5" && n.measure === "6")?.degree ?? p.notes.find((n) => n.pitch === "C#5")?.degree).toBe(7);
    const cs = p.suggestions.find((s) => s.role === "tension" && s.pitch === "C#5" && s.measure === "7");
    expect(cs?.reason).toContain("D major");
  });

  it("reports nothing for a diatonic melody, however it leans (no foreign note, no modulation)", () => {
    // common practice: without a chromatic note there is no evidence of a new key.
    const p = analyze(
      "C5:q E5:q G5:q E5:q | D5:q G4:q B4:q D5:q | G4:q B4:q D5:q G5:q | D5:q B4:q G4:q B4:q | D5:q G5:q D5:q B4:q | C5:q E5:q G5:q E5:q | C5:w |]",
      0,
    );
    expect(p.localKeys).toEqual([]);
  });

  it("starts a key outside the old key's scale at its first chord foreign to the old key, not at its cadence", () => {
    // Kostka & Payne, Tonal Harmony, chapters on secondary functions and on direct modulation
    // (chapter titles from memory): applied chords tonicize the triads of the key's own degrees, so
    // E♭ (no degree of C major) is not reached by applied chords of C, and a direct modulation shows
    // the new key from the chord that leaves the old one. The E♭ and A♭ triads of bar 3 leave
    // C major; B♭7 → E♭ arrives only in bar 4.
    const p = analyze(
      "[C3,G3,E4,C5]:h [F3,A3,C4,F4]:h | [G3,B3,F4,D5]:h [C3,G3,E4,C5]:h | [Eb3,G3,Bb3,Eb4]:h [Ab3,C4,Eb4,Ab4]:h | " +
        "[Bb2,F3,Ab3,D4]:h [Eb3,G3,Bb3,Eb4]:h | [Ab3,C4,Eb4,C5]:h [Bb2,F3,Ab3,D5]:h | [Eb3,G3,Bb3,Eb4]:w |]",
      0,
    );
    expect(p.localKeys.map((k) => [k.tonic, k.mode, k.fromMeasure, k.toMeasure])).toEqual([["Eb", "major", "3", "6"]]);
  });

  it("states its window and margin (set on the tuning half of the harmony corpus)", () => {
    // scripts/tune-harmony.ts: the constants it found on the tuning half; a change is a re-tuning.
    expect(LOCAL_KEY.windowMeasures).toBe(2);
    expect(LOCAL_KEY.margin).toBeGreaterThan(0.1);
  });

  it("treats a key signature change mid-part as a new key in force", () => {
    // source: MusicXML 4.0 <key> — a key element in a later measure changes the signature from there.
    const p = analyze("D4:q F4:q A4:q C#5:q | D5:h A4:h | Bb4:q A4:q G4:q C#4:q | D4:w || K:2:major D4:q F#4:q A4:q C#5:q | D5:w |]", -1, "minor");
    expect(p.key).toMatchObject({ tonic: "D", mode: "minor", fifths: -1 });
    expect(p.localKeys).toEqual([{ tonic: "D", mode: "major", fromMeasure: "5", toMeasure: "6" }]);
    expect(p.notes.find((n) => n.pitch === "F#4")?.degree).toBe(3);
    const cs = p.suggestions.find((s) => s.role === "tension" && s.pitch === "C#5" && s.measure === "5");
    expect(cs?.reason).toContain("D major");
    expect(p.suggestions.find((s) => s.role === "phrase-start" && s.measure === "5")).toBeDefined();
  });

  it("infers the mode of a new signature that gives none", () => {
    // source: MusicXML 4.0 <mode> is optional; the melody decides (analysis.md §2).
    const p = analyze("C5:q E5:q G5:q E5:q | C5:w || K:0:none A4:q C5:q E5:q G#4:q | A4:q B4:q G#4:q A4:q | A4:w |]", 0, "major");
    expect(p.localKeys).toEqual([{ tonic: "A", mode: "minor", fromMeasure: "3", toMeasure: "5" }]);
  });
});
