/**
 * Pitch bend as @tonejs/midi writes and reads it. The 14-bit arithmetic of MIDI 1.0 (0…16383,
 * centre 8192, the sensitivity being the full-scale bend in semitones, check values §7.1) lives
 * once, in lib/analysis/vibrato.ts; @tonejs/midi writes the signed value −8192…8191 as given and
 * reads it back divided by 8192 (check values §7.3).
 */

import { BEND_CENTRE, centsToBend } from "@/lib/analysis/vibrato";

/** The signed value @tonejs/midi's writer expects (−8192…8191). */
export function centsToSignedBend(cents: number, semitones: number): number {
  return centsToBend(cents, semitones) - BEND_CENTRE;
}

/** Cents of a bend as @tonejs/midi reads it (a fraction of the full range, −1…+0.99988). */
export function readBendToCents(value: number, semitones: number): number {
  return value * 100 * semitones;
}
