/**
 * MIDI 1.0 pitch bend: 14 bits, 0…16383, centre 8192; the sensitivity (RPN 0) is the full-scale
 * bend in semitones (check values §7.1). @tonejs/midi writes the signed value −8192…8191 as given
 * and reads it back divided by 8192 (check values §7.3).
 */

export const BEND_CENTRE = 8192;
export const BEND_MAX = 16383;

/** 14-bit bend value for a deviation in cents at a range of `semitones`, clamped to 0…16383. */
export function centsToBend14(cents: number, semitones: number): number {
  const value = BEND_CENTRE + Math.round((cents / (100 * semitones)) * BEND_CENTRE);
  return Math.min(BEND_MAX, Math.max(0, value));
}

/** The signed value @tonejs/midi's writer expects (−8192…8191). */
export function centsToSignedBend(cents: number, semitones: number): number {
  return centsToBend14(cents, semitones) - BEND_CENTRE;
}

/** Cents of a 14-bit bend value. */
export function bend14ToCents(value: number, semitones: number): number {
  return ((value - BEND_CENTRE) / BEND_CENTRE) * 100 * semitones;
}

/** Cents of a bend as @tonejs/midi reads it (a fraction of the full range, −1…+0.99988). */
export function readBendToCents(value: number, semitones: number): number {
  return value * 100 * semitones;
}
