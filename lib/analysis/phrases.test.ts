import { describe, expect, it } from "vitest";
import { analyzeScore } from "./index";
import { buildTimeline, extractMelody } from "./melody";
import { PHRASE, findPhrases, peakOf } from "./phrases";
import { buildPart, buildScore } from "./test-part";

const phrasesOf = (text: string, opts: Parameters<typeof buildPart>[1] = {}) => {
  const part = buildPart(text, opts);
  const seq = extractMelody(part, buildTimeline(buildScore(part), part)).filter((n) => !n.grace);
  return { seq, phrases: findPhrases(seq, part.measures) };
};
const starts = (r: ReturnType<typeof phrasesOf>) => r.phrases.map((p) => r.seq[p.start].note.pitch?.name + "@" + r.seq[p.start].note.measureNumber);

describe("phrase boundaries", () => {
  it("starts a phrase after a rest", () => {
    // source: GTTM GPR 2a (slur/rest) — Lerdahl & Jackendoff 1983, via check-values §4.2.
    const r = phrasesOf("C4:q D4:q E4:q F4:q | G4:h r:q E4:q | D4:q C4:q D4:q E4:q | C4:w |]");
    expect(starts(r)).toEqual(["C4@1", "E4@2"]);
    expect(r.phrases[1].cue).toBe("rest");
  });

  it("starts a phrase after a breath mark, a caesura or a fermata", () => {
    // source: MusicXML 4.0 <breath-mark> "indicates a place to take a breath"; <caesura>; <fermata> (check-values §3).
    for (const mark of [",", "^", "!"]) {
      const r = phrasesOf(`C5:q D5:q E5:q F5:q | G5:h A5:q G5:q${mark} | F5:q E5:q D5:q E5:q | C5:w |]`);
      expect(starts(r)).toEqual(["C5@1", "F5@3"]);
    }
  });

  it("starts a phrase after a double barline", () => {
    // source: check-values §4 / analysis.md §4 — double and final barlines bound phrases.
    const r = phrasesOf("C5:q D5:q E5:q F5:q | G5:q F5:q E5:q D5:q || E5:q F5:q G5:q A5:q | G5:w |]");
    expect(starts(r)).toEqual(["C5@1", "E5@3"]);
    expect(r.phrases[1].cue).toBe("barline");
  });

  it("leaves no slivers: a rest before the last two notes does not cut them off", () => {
    // source: GTTM GPR 1 "strongly avoid groups containing a single event" (check-values §4.2).
    const r = phrasesOf("C5:q D5:q E5:q F5:q | G5:q F5:q E5:q D5:q | C5:q r:q B4:q C5:q |]");
    expect(r.phrases).toHaveLength(1);
    expect(r.phrases[0].end - r.phrases[0].start + 1).toBeGreaterThanOrEqual(PHRASE.minNotes);
  });

  it("splits a long unmarked melody at the strongest LBDM boundary", () => {
    // source: Cambouropoulos 2001 (LBDM); the long note then the leap and quick notes form the boundary.
    const r = phrasesOf(
      "C5:q D5:q E5:q F5:q | G5:q E5:q C5:q D5:q | E5:q F5:q D5:q E5:q | C5:w | A5:e G5:e F5:e E5:e D5:q E5:q | F5:q G5:q A5:q F5:q | E5:q D5:q B4:q D5:q | C5:w |]",
    );
    expect(starts(r)).toEqual(["C5@1", "A5@5"]);
    expect(r.phrases[1].cue).toBe("contour");
  });

  it("picks the peak: highest, then longer, then metrically stronger", () => {
    // source: check-values §4.4 test idea (ties broken by the longest note), our brief for the metric tie-break.
    const r = phrasesOf("C5:q G5:e F5:e G5:q E5:q | D5:q G5:h C5:q |]");
    const peak = r.seq[peakOf(r.seq, 0, r.seq.length - 1)];
    expect(peak.note.pitch?.name).toBe("G5");
    expect(peak.note.measureNumber).toBe("2");
    const r2 = phrasesOf("C5:q G5:q E5:q G5:q | D5:q E5:q C5:h |]");
    const p2 = r2.seq[peakOf(r2.seq, 0, r2.seq.length - 1)];
    expect(p2.onset).toBe(1 / 4); // beat 2 and beat 4 tie in length and strength → the earlier one
    const r3 = phrasesOf("C5:q E5:q G5:q E5:q | G5:q E5:q C5:h |]");
    expect(r3.seq[peakOf(r3.seq, 0, r3.seq.length - 1)].note.measureNumber).toBe("2"); // the downbeat G beats beat 3
  });
});

describe("phrase suggestions", () => {
  it("suggests each phrase start and peak with a reason naming key, degree and bar", () => {
    // common practice: a phrase begins after a rest.
    const p = analyzeScore(buildScore(buildPart("D4:q F4:q Bb4:q C5:q | D5:h r:q F4:q | G4:q A4:q Bb4:q C5:q | Bb4:w |]", { fifths: -2 })), "t").parts[0];
    const s = p.suggestions.filter((x) => x.role === "phrase-start");
    expect(s.map((x) => `${x.pitch}@${x.measure}`)).toEqual(["D4@1", "F4@2"]);
    expect(s[1].reason).toBe("A phrase begins on F in bar 2, the dominant (fifth degree) of B♭ major, after a rest.");
    expect(s.every((x) => x.confidence >= 0.5)).toBe(true);
    const peaks = p.suggestions.filter((x) => x.role === "peak");
    expect(peaks.map((x) => x.pitch)).toEqual(["D5", "C5"]);
    expect(p.phrases).toHaveLength(2);
    expect(peaks[0].reason).toContain("bar 2");
  });
});
