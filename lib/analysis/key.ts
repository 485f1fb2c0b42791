/**
 * The key of a part: from the key signature and `mode`, or — where the file gives no mode —
 * inferred from the melody between the signature's major key and its relative minor.
 */
import type { KeyResult, Mode } from "./types";
import { meanCorrelation } from "./key-finding";
import type { MelodyNote } from "./melody";
import { asciiName, mod, pcOfLof } from "./spelling";

/** A key as the analysis uses it: its tonic spelled on the line of fifths. */
export interface Key {
  tonicLof: number;
  mode: Mode;
}

/**
 * Where each MusicXML mode's tonic sits on the line of fifths relative to the signature's major
 * tonic (the `fifths` position), and whether we treat it as major or minor. Church modes keep
 * their own tonic (D dorian stays on D) and take the mode of their third: dorian, phrygian,
 * aeolian and locrian count as minor, lydian, mixolydian and ionian as major. The offsets match
 * the line of fifths (aeolian +3, dorian +2, phrygian +4, lydian −1, mixolydian +1, locrian +5).
 */
const MODE_OFFSETS: Record<string, { offset: number; mode: Mode }> = {
  major: { offset: 0, mode: "major" },
  ionian: { offset: 0, mode: "major" },
  minor: { offset: 3, mode: "minor" },
  aeolian: { offset: 3, mode: "minor" },
  dorian: { offset: 2, mode: "minor" },
  phrygian: { offset: 4, mode: "minor" },
  lydian: { offset: -1, mode: "major" },
  mixolydian: { offset: 1, mode: "major" },
  locrian: { offset: 5, mode: "minor" },
};

/** The key a signature names, or null when the mode is missing, "none" or unknown. */
export function keyFromSignature(fifths: number, mode: string | null): Key | null {
  if (!mode) return null;
  const m = MODE_OFFSETS[mode.trim().toLowerCase()];
  if (!m) return null;
  return { tonicLof: fifths + m.offset, mode: m.mode };
}

export function majorOf(fifths: number): Key {
  return { tonicLof: fifths, mode: "major" };
}

export function relativeMinorOf(fifths: number): Key {
  return { tonicLof: fifths + 3, mode: "minor" };
}

/** The signature (fifths) of a major or minor key. */
export function fifthsOf(key: Key): number {
  return key.mode === "major" ? key.tonicLof : key.tonicLof - 3;
}

export function keyName(key: Key): string {
  return `${asciiName(key.tonicLof)} ${key.mode}`;
}

export function sameKey(a: Key, b: Key): boolean {
  return a.tonicLof === b.tonicLof && a.mode === b.mode;
}

export function toKeyResult(key: Key, fifths: number, source: KeyResult["source"]): KeyResult {
  return { tonic: asciiName(key.tonicLof), mode: key.mode, fifths, source };
}

/** Duration-weighted pitch-class histogram (quarter notes); grace notes count as a sixteenth. */
export function histogramOf(notes: readonly MelodyNote[]): number[] {
  const h = new Array<number>(12).fill(0);
  for (const n of notes) h[mod(n.midi, 12)] += n.grace ? 0.25 : n.dur * 4;
  return h;
}

/** Weights of the extra evidence when choosing between a major key and its relative minor. */
export const MODE_EVIDENCE = {
  /** Share of time on the minor candidate's raised seventh (G♯ for A minor), scaled: 10 % → full. */
  raisedSeventh: 0.25,
  lastNoteTonic: 0.2,
  firstNoteTonic: 0.08,
  /** First note on the fifth (a common opening) adds a little. */
  firstNoteFifth: 0.03,
} as const;

export interface ModeDecision {
  key: Key;
  scores: { major: number; minor: number };
}

/**
 * Major or relative minor for a signature with no mode: mean K–S correlation over the decision
 * profiles, plus the raised seventh of the minor candidate and the tonic at the first and last
 * notes. With no notes at all, major.
 */
export function inferMode(fifths: number, notes: readonly MelodyNote[]): ModeDecision {
  const major = majorOf(fifths);
  const minor = relativeMinorOf(fifths);
  const main = notes.filter((n) => !n.grace);
  if (main.length === 0) return { key: major, scores: { major: 0, minor: 0 } };
  const h = histogramOf(main);
  const score = (k: Key) => meanCorrelation(h, pcOfLof(k.tonicLof), k.mode);
  let sMaj = score(major);
  let sMin = score(minor);
  const total = h.reduce((a, b) => a + b, 0) || 1;
  const raised = main.filter((n) => n.lof === minor.tonicLof + 5).reduce((a, n) => a + n.dur * 4, 0) / total;
  sMin += MODE_EVIDENCE.raisedSeventh * Math.min(1, raised * 10);
  const first = main[0];
  const last = main[main.length - 1];
  const pc = (n: MelodyNote) => mod(n.midi, 12);
  for (const [k, add] of [
    [major, (v: number) => (sMaj += v)],
    [minor, (v: number) => (sMin += v)],
  ] as const) {
    const tonic = pcOfLof(k.tonicLof);
    if (pc(last) === tonic) add(MODE_EVIDENCE.lastNoteTonic);
    if (pc(first) === tonic) add(MODE_EVIDENCE.firstNoteTonic);
    if (pc(first) === mod(tonic + 7, 12)) add(MODE_EVIDENCE.firstNoteFifth);
  }
  return { key: sMin > sMaj ? minor : major, scores: { major: sMaj, minor: sMin } };
}
