import { describe, expect, it } from "vitest";
import type { AnalyzedNote } from "@/lib/analysis/types";
import { DEFAULT_MARKING } from "@/lib/markings/schema";
import { markedNoteRows } from "./table";

const note = (key: string, measure: string, pitch: string): AnalyzedNote => ({ key, measure, pitch, midi: 60, onset: "0/1", duration: "1/4", degree: 1 });
/** As written: a pickup numbered "0" and bars 1–5. */
const bars = [{ number: "0", implicit: true }, { number: "1" }, { number: "2" }, { number: "3" }, { number: "4" }, { number: "5" }];
const notes = [note("P1:m0:s1:v1:0/1:74", "1", "D5"), note("P1:m0:s1:v1:1/4:78", "1", "F#5"), note("P1:m1:s1:v1:0/1:70", "2", "Bb4")];

describe("markedNoteRows", () => {
  it("lists marked notes in score order with bar, spelled pitch and the numbers", () => {
    const rows = markedNoteRows(
      [
        { ...DEFAULT_MARKING, noteKey: notes[2].key, depthCents: 35, speedHz: 6, role: "peak", placement: "top-on-pitch", shape: "growing", comment: " breathe before " },
        { ...DEFAULT_MARKING, noteKey: notes[0].key },
      ],
      notes,
      120,
      bars,
    );
    expect(rows.map((r) => r.noteKey)).toEqual([notes[0].key, notes[2].key]);
    expect(rows[1]).toEqual({
      noteKey: notes[2].key,
      bar: "1",
      note: "B♭4",
      role: "Peak",
      depth: "35¢",
      // 6 Hz at 120 bpm: 6 × 60 / 120 = 3 pulses per beat (arithmetic).
      speed: "6 Hz · 3/beat",
      placement: "Top on the pitch",
      onsetShape: "From the start, growing",
      comment: "breathe before",
    });
    expect(rows[0]).toMatchObject({ bar: "Pickup", note: "D5", depth: "20¢", speed: "5.5 Hz · 2.75/beat", placement: "Centred on the pitch" });
  });

  it("says none for a deliberate no-vibrato, and leaves pulses out without a tempo", () => {
    const rows = markedNoteRows(
      [
        { ...DEFAULT_MARKING, noteKey: notes[1].key, depthCents: 0, role: "resolution" },
        { ...DEFAULT_MARKING, noteKey: notes[0].key, speedHz: 5 },
      ],
      notes,
      null,
      bars,
    );
    expect(rows[0]).toMatchObject({ note: "D5", speed: "5 Hz" });
    expect(rows[1]).toMatchObject({ note: "F♯5", depth: "none", speed: "–", placement: "–", role: "Resolution" });
  });

  it("keeps a marking whose note the analysis does not know, labelled from its key and the written bar", () => {
    const rows = markedNoteRows([{ ...DEFAULT_MARKING, noteKey: "P1:m4:s1:v1:0/1:69" }], notes, 90, bars);
    expect(rows[0]).toMatchObject({ bar: "4", note: "A4" });
  });
});
