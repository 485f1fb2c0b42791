/**
 * Note keys: the one identity a marking attaches to, computed identically on the server (from the
 * MusicXML reader) and in the browser (from the engraving library's loaded model).
 *
 * Format: `{partId}:m{measureIndex}:s{staff}:v{voice}:{onset}:{midi}[:g{graceIndex}]`
 *
 * - `partId`: the MusicXML `score-part` id, as written (e.g. `P1`).
 * - `measureIndex`: 0-based position of the measure in the part, in written order (repeats are not
 *   unfolded); not the `number` attribute.
 * - `staff`: the MusicXML `staff` (1 when absent). `voice`: the MusicXML `voice` text (1 when absent,
 *   except on a chord tone, which takes the voice of the note it sounds with).
 * - `onset`: the note's offset from the start of its measure as a reduced fraction of a whole note,
 *   always written `num/den` (`0/1`, `1/4`, `3/8`).
 * - `midi`: the written pitch's MIDI number, C4 = 60 (alter rounded to the nearest semitone).
 * - `:g{n}` only for grace notes: n = 1, 2, … counts the grace notes of that staff and voice that
 *   precede the same onset (a grace note's onset is the onset of the note it leads into). Grace
 *   notes of one grace chord share n.
 *
 * A tie chain is one sounding note and carries the key of its first note. Rests have no key.
 * Example: `P1:m12:s1:v1:3/8:70` is the B♭4 a dotted quarter into the thirteenth written measure.
 *
 * Part ids are NMTOKENs (letters, digits, `.`, `-`, `_`, `:`), so keys are URL-safe once passed
 * through `encodeURIComponent`. Keep this module dependency-free: browser code imports it.
 */
import { gcd } from "./fraction";
export interface NoteKeyParts {
  partId: string;
  measureIndex: number;
  staff: number;
  voice: string;
  onset: { num: number; den: number };
  midi: number;
  /** 0 for ordinary notes, 1… for grace notes. */
  graceIndex: number;
}

/** Builds the key of a note; the onset is reduced here so both sides agree however they hold it. */
export function noteKey(p: NoteKeyParts): string {
  const g = gcd(p.onset.num, p.onset.den) || 1;
  const num = p.onset.num / g;
  const den = p.onset.den / g;
  const onset = num === 0 ? "0/1" : `${num}/${den}`;
  const base = `${p.partId}:m${p.measureIndex}:s${p.staff}:v${p.voice}:${onset}:${p.midi}`;
  return p.graceIndex > 0 ? `${base}:g${p.graceIndex}` : base;
}

// The part id may itself contain ":", so the fixed-shape tail is matched from the end.
const TAIL = /:m(\d+):s(\d+):v([^:]+):(-?\d+)\/(\d+):(-?\d+)(?::g(\d+))?$/;

/** Splits a key back into its parts; null when the text is not a note key. */
export function parseNoteKey(key: string): NoteKeyParts | null {
  const m = TAIL.exec(key);
  if (!m || m.index === 0) return null;
  const den = Number(m[5]);
  if (den === 0) return null;
  return {
    partId: key.slice(0, m.index),
    measureIndex: Number(m[1]),
    staff: Number(m[2]),
    voice: m[3],
    onset: { num: Number(m[4]), den },
    midi: Number(m[6]),
    graceIndex: m[7] ? Number(m[7]) : 0,
  };
}
