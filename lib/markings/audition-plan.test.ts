import { describe, expect, it } from "vitest";
import type { AnalyzedNote } from "@/lib/analysis/types";
import { DEFAULT_MARKING } from "./schema";
import { FALLBACK_TEMPO, phraseAround, planAuditionNotes } from "./audition-plan";

const n = (m: number, onset: string, duration: string, midi: number): AnalyzedNote => ({
  key: `P1:m${m}:s1:v1:${onset}:${midi}`,
  measure: String(m + 1),
  pitch: "C4",
  midi,
  onset,
  duration,
  degree: null,
});

// 4/4: bar 1 full of quarters; bar 2 a half note then a half rest; bar 3 a whole note.
const notes = [n(0, "0/1", "1/4", 62), n(0, "1/4", "1/4", 64), n(0, "1/2", "1/4", 65), n(0, "3/4", "1/4", 67), n(1, "0/1", "1/2", 69), n(2, "0/1", "1/1", 74)];

describe("planAuditionNotes", () => {
  it("times notes at the tempo, keeping a rest's time inside the bar", () => {
    // At 120 bpm a quarter lasts 0.5 s and a 4/4 bar 2 s (arithmetic).
    const plan = planAuditionNotes(notes.map((x) => x.key), notes, {}, 120);
    expect(plan.map((p) => p.startSeconds)).toEqual([0, 0.5, 1, 1.5, 2, 4]);
    expect(plan.map((p) => p.durationSeconds)).toEqual([0.5, 0.5, 0.5, 0.5, 1, 2]);
    expect(plan.map((p) => p.midi)).toEqual([62, 64, 65, 67, 69, 74]);
  });

  it("starts at the first chosen note and carries each note's marking", () => {
    const marking = { ...DEFAULT_MARKING, depthCents: 30 };
    const plan = planAuditionNotes([notes[5].key, notes[3].key], notes, { [notes[5].key]: marking }, 60);
    // At 60 bpm: the fourth quarter of bar 1 starts at 3 s, bar 3 at 8 s; 8 − 3 = 5 s later.
    expect(plan).toEqual([
      { key: notes[3].key, midi: 67, startSeconds: 0, durationSeconds: 1, marking: undefined },
      { key: notes[5].key, midi: 74, startSeconds: 5, durationSeconds: 4, marking },
    ]);
  });

  it("falls back to a moderate tempo when the part has none", () => {
    const [only] = planAuditionNotes([notes[0].key], notes, {}, null);
    expect(only.durationSeconds).toBeCloseTo(60 / FALLBACK_TEMPO, 10);
  });
});

describe("phraseAround", () => {
  const phrases = [
    { start: notes[0].key, peak: notes[3].key, end: notes[3].key },
    { start: notes[4].key, peak: notes[5].key, end: notes[5].key },
  ];
  it("finds the phrase holding the note", () => {
    expect(phraseAround(notes[2].key, notes, phrases)).toEqual(notes.slice(0, 4).map((x) => x.key));
    expect(phraseAround(notes[5].key, notes, phrases)).toEqual([notes[4].key, notes[5].key]);
  });
  it("answers null outside every phrase", () => {
    expect(phraseAround(notes[4].key, notes, phrases.slice(0, 1))).toBeNull();
    expect(phraseAround("nope", notes, phrases)).toBeNull();
  });
});
