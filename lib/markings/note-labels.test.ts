import { describe, expect, it } from "vitest";
import { midiName, noteInBar, noteLabel, selectionLabel } from "./note-labels";

/** Bars as written: numbered 1, 2, … from the first. */
const plain = Array.from({ length: 20 }, (_, i) => ({ number: String(i + 1) }));
/** A part with a pickup written `number="0" implicit="yes"` (as our sample harbour-song does). */
const withPickup = [{ number: "0", implicit: true }, ...plain];

describe("note labels", () => {
  it("falls back to the key itself when it is not a note key", () => {
    expect(noteLabel("nonsense", plain)).toBe("nonsense");
    expect(noteLabel("P1:m0:s1:v1:0/1:72:g2", plain)).toBe("Bar 1 · C5 (grace)");
  });

  it("names the bar as written, never by its position", () => {
    expect(noteLabel("P1:m0:s1:v1:0/1:72", withPickup)).toBe("Pickup · C5");
    expect(noteLabel("P1:m1:s1:v1:0/1:72", withPickup)).toBe("Bar 1 · C5");
    expect(noteInBar("P1:m0:s1:v1:0/1:72", withPickup)).toBe("C5 in the pickup");
    expect(noteInBar("P1:m3:s1:v1:0/1:74", withPickup, { pitch: "D5" })).toBe("D5 in bar 3");
    expect(noteInBar("nonsense", withPickup)).toBeNull();
  });

  it("names MIDI numbers with C4 = 60 and A4 = 69", () => {
    // MIDI 1.0 specification / scientific pitch notation: note 60 is middle C (C4), 69 is A4.
    expect(midiName(60)).toBe("C4");
    expect(midiName(69)).toBe("A4");
    expect(midiName(70)).toBe("B♭4");
  });

  it("prefers the analysis' spelling and written bar number", () => {
    expect(noteLabel("P1:m12:s1:v1:3/8:70", plain, { pitch: "A#4" })).toBe("Bar 13 · A♯4");
    expect(noteLabel("P1:m12:s1:v1:3/8:70", withPickup, { pitch: "Bb4" })).toBe("Bar 12 · B♭4");
    expect(noteLabel("P1:m12:s1:v1:3/8:70", plain)).toBe("Bar 13 · B♭4");
  });

  it("summarises a selection by its bars", () => {
    const label = (k: string) => noteLabel(k, plain);
    expect(selectionLabel(["P1:m3:s1:v1:0/1:60", "P1:m5:s1:v1:0/1:62"], label, plain)).toBe("2 notes, bars 4–6");
    expect(selectionLabel(["P1:m3:s1:v1:0/1:60", "P1:m3:s1:v1:1/4:62"], label, plain)).toBe("2 notes, bar 4");
    expect(selectionLabel(["P1:m0:s1:v1:0/1:60", "P1:m2:s1:v1:0/1:62"], label, withPickup)).toBe("2 notes, the pickup to bar 2");
  });
});
