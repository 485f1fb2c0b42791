import { describe, expect, it } from "vitest";
import { midiName, noteLabel, selectionLabel } from "./note-labels";

describe("note labels", () => {
  it("falls back to the key itself when it is not a note key", () => {
    expect(noteLabel("nonsense")).toBe("nonsense");
    expect(noteLabel("P1:m0:s1:v1:0/1:72:g2")).toBe("Bar 1 · C5 (grace)");
  });

  it("names MIDI numbers with C4 = 60 and A4 = 69", () => {
    // MIDI 1.0 specification / scientific pitch notation: note 60 is middle C (C4), 69 is A4.
    expect(midiName(60)).toBe("C4");
    expect(midiName(69)).toBe("A4");
    expect(midiName(70)).toBe("B♭4");
  });

  it("prefers the analysis' spelling and written bar number", () => {
    expect(noteLabel("P1:m12:s1:v1:3/8:70", { measure: "13", pitch: "A#4" })).toBe("Bar 13 · A♯4");
    expect(noteLabel("P1:m12:s1:v1:3/8:70", { measure: "13", pitch: "Bb4" })).toBe("Bar 13 · B♭4");
    expect(noteLabel("P1:m12:s1:v1:3/8:70")).toBe("Bar 13 · B♭4");
  });

  it("summarises a selection by its bars", () => {
    const label = (k: string) => noteLabel(k);
    expect(selectionLabel(["P1:m3:s1:v1:0/1:60", "P1:m5:s1:v1:0/1:62"], label)).toBe("2 notes, bars 4–6");
    expect(selectionLabel(["P1:m3:s1:v1:0/1:60", "P1:m3:s1:v1:1/4:62"], label)).toBe("2 notes, bar 4");
  });
});
