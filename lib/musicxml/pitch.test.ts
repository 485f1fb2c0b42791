import { Note } from "tonal";
import { describe, expect, it } from "vitest";
import { makePitch } from "./pitch";

const STEPS = ["C", "D", "E", "F", "G", "A", "B"] as const;

describe("pitch to MIDI and spelling", () => {
  it("agrees with tonal on every step, octave 2–8 and alteration −2…+2", () => {
    let checked = 0;
    for (let octave = 2; octave <= 8; octave++) {
      for (const step of STEPS) {
        if (octave === 8 && step !== "C") continue; // C2 … C8
        for (let alter = -2; alter <= 2; alter++) {
          const ours = makePitch(step, alter, octave);
          // Reference: tonal 6.5.1, Note.get / Note.midi (scientific pitch notation, C4 = 60).
          const ref = Note.get(ours.name);
          expect(ref.empty, ours.name).toBe(false);
          expect(ours.midi, ours.name).toBe(Note.midi(ours.name));
          expect(ours.name).toBe(ref.name);
          expect(ref.letter).toBe(step);
          expect(ref.alt).toBe(alter);
          expect(ref.oct).toBe(octave);
          checked++;
        }
      }
    }
    expect(checked).toBe(6 * 7 * 5 + 5);
  });

  it("follows the MusicXML pitch definition: octave 4 starts at middle C (MusicXML 4.0, pitch)", () => {
    // https://www.w3.org/2021/06/musicxml40/musicxml-reference/elements/pitch/
    expect(makePitch("C", 0, 4).midi).toBe(60);
    expect(makePitch("B", -1, 4).midi).toBe(70);
    expect(makePitch("B", 1, 3).midi).toBe(60); // B#3 sounds as C4
    expect(makePitch("C", -1, 4).midi).toBe(59); // Cb4 sounds as B3
  });

  it("spells sharps, flats and doubles the way the model documents", () => {
    expect(makePitch("F", 1, 4).name).toBe("F#4");
    expect(makePitch("B", -1, 3).name).toBe("Bb3");
    expect(makePitch("C", 2, 5).name).toBe("C##5");
    expect(makePitch("D", -2, 4).name).toBe("Dbb4");
  });

  it("rounds microtonal alterations to the nearest semitone for MIDI, keeping the written alter", () => {
    const p = makePitch("A", 0.5, 4);
    expect(p.alter).toBe(0.5);
    expect(p.midi).toBe(70);
    expect(makePitch("A", -0.5, 4).midi).toBe(69);
  });
});
