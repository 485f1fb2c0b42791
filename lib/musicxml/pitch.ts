import type { Pitch } from "./model";

const STEP_PC: Record<Pitch["step"], number> = { C: 0, D: 2, E: 4, F: 5, G: 7, A: 9, B: 11 };

export function isStep(s: string): s is Pitch["step"] {
  return s.length === 1 && s in STEP_PC;
}

/**
 * MIDI number and spelled name of a written pitch. MusicXML `pitch`: octave 4 starts at middle C,
 * alter in semitones (decimals are microtones, rounded here). C4 = 60.
 */
export function makePitch(step: Pitch["step"], alter: number, octave: number): Pitch {
  const semis = Math.round(alter);
  const midi = 12 * (octave + 1) + STEP_PC[step] + semis;
  const acc = semis > 0 ? "#".repeat(semis) : "b".repeat(-semis);
  return { step, alter, octave, midi, name: `${step}${acc}${octave}` };
}
