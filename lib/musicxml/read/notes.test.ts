import { describe, expect, it } from "vitest";
import type { Measure } from "../model";
import { closeInNote, finishNote, newDraft, openInNote, TieChains, type NotePart } from "./notes";
import { VoiceClock } from "./voices";

const measure = { index: 3, number: "4" } as Measure;

function part(): NotePart {
  const clock = new VoiceClock();
  clock.divisions = { num: 1, den: 1 };
  return { id: "P1", clock, ties: new TieChains(), pendingDynamics: null, lastVoice: "1" };
}

function draft(step: string, octave: number, duration: number, more: (d: ReturnType<typeof newDraft>) => void = () => {}) {
  const d = newDraft();
  closeInNote(d, "step", step, "pitch");
  closeInNote(d, "octave", String(octave), "pitch");
  d.duration = { num: duration, den: 1 };
  more(d);
  return d;
}

describe("notes and ties", () => {
  it("reads pitch, voice and staff text into the draft", () => {
    const d = newDraft();
    closeInNote(d, "step", " B ", "pitch");
    closeInNote(d, "alter", "-1", "pitch");
    closeInNote(d, "octave", "4", "pitch");
    closeInNote(d, "voice", "2", "note");
    closeInNote(d, "staff", "2", "note");
    expect([d.step, d.alter, d.octave, d.voice, d.staff]).toEqual(["B", -1, 4, "2", 2]);
  });

  it("reads flags, ties and phrase marks as their elements open", () => {
    const d = newDraft();
    openInNote(d, "grace", {}, "note");
    openInNote(d, "tied", { type: "continue" }, "notations");
    openInNote(d, "slur", { type: "start", number: "2" }, "notations");
    openInNote(d, "breath-mark", {}, "articulations");
    expect([d.grace, d.tieStart, d.tieStop, d.marks.slurStarts, d.marks.breathMark]).toEqual([true, true, true, [2], true]);
  });

  it("keys a note by part, measure index, staff, voice, onset and MIDI pitch", () => {
    const p = part();
    const n = finishNote(p, measure, draft("A", 4, 2));
    expect(n?.key).toBe("P1:m3:s1:v1:0/1:69");
    expect(n?.duration).toEqual({ num: 1, den: 2 });
  });

  it("merges a tie continuation into its first note: one key, the summed length, the marks of both", () => {
    const p = part();
    const first = finishNote(p, measure, draft("C", 5, 2, (d) => (d.tieStart = true)))!;
    const rest = finishNote(
      p,
      measure,
      draft("C", 5, 1, (d) => {
        d.tieStop = true;
        d.marks.fermata = true;
      }),
    );
    expect(rest).toBeNull();
    expect([first.duration, first.tied, first.marks.fermata]).toEqual([{ num: 3, den: 4 }, true, true]);
  });

  it("gives waiting dynamics to the next sounding note only", () => {
    const p = part();
    p.pendingDynamics = "p";
    const a = finishNote(p, measure, draft("D", 5, 1))!;
    const b = finishNote(p, measure, draft("E", 5, 1))!;
    expect([a.marks.dynamics, b.marks.dynamics, p.pendingDynamics]).toEqual(["p", null, null]);
  });

  it("a rest has no key", () => {
    const d = newDraft();
    d.rest = true;
    d.duration = { num: 1, den: 1 };
    expect(finishNote(part(), measure, d)).toMatchObject({ key: "", isRest: true });
  });

  // MusicXML 4.0, `chord`: a chord tone sounds with the note before it, so without a `<voice>` of
  // its own it is of that note's voice (Schubert's "Der Lindenbaum" in the real corpus writes the
  // lower staff's chord tones so). A note that is no chord tone and names no voice is voice 1.
  it("a chord tone without a voice joins its chord's voice; another note without one is voice 1", () => {
    const p = part();
    const e2 = finishNote(p, measure, draft("E", 2, 4, (d) => closeInNote(d, "voice", "3", "note")));
    const b2 = finishNote(p, measure, draft("B", 2, 4, (d) => (d.chord = true)));
    const c3 = finishNote(p, measure, draft("C", 3, 4));
    expect([e2!.voice, b2!.voice, c3!.voice]).toEqual(["3", "3", "1"]);
    expect(b2!.key).toBe("P1:m3:s1:v3:0/1:47");
  });
});
