/**
 * How well a beat's chord fits each of the 24 keys, as an analyst would read it: the tonic and
 * dominant chords fit best, the other diatonic chords well, an applied dominant (V/x or vii°/x of
 * a diatonic degree x) still fits — a tonicization inside the key, not a new key — and any other
 * chord speaks against the key. Chords are named by template matching over the pitch classes that
 * fill the beat (passing notes, lighter than a quarter of the strongest, left out). Common
 * practice (Open Music Theory v1, "Applied chords"; Hutchinson, "Secondary dominant chords").
 */

/** Chord templates: intervals above the root. */
const TEMPLATES: ReadonlyArray<{ quality: Quality; iv: readonly number[] }> = [
  { quality: "major", iv: [0, 4, 7] },
  { quality: "minor", iv: [0, 3, 7] },
  { quality: "diminished", iv: [0, 3, 6] },
  { quality: "dominant7", iv: [0, 4, 7, 10] },
  { quality: "major", iv: [0, 4, 7, 11] },
  { quality: "minor", iv: [0, 3, 7, 10] },
  { quality: "diminished", iv: [0, 3, 6, 10] },
  { quality: "diminished", iv: [0, 3, 6, 9] },
];

export type Quality = "major" | "minor" | "diminished" | "dominant7";

export interface NamedChord {
  root: number;
  quality: Quality;
}

/** The best-matching chord of a weighted pitch-class set (at least three pitch classes), or null. */
export function nameChord(hist: ArrayLike<number>): NamedChord | null {
  let max = 0;
  for (let pc = 0; pc < 12; pc++) max = Math.max(max, hist[pc]);
  if (max <= 0) return null;
  let mask = 0;
  let strongest = 0;
  for (let pc = 0; pc < 12; pc++) {
    if (hist[pc] >= 0.25 * max) mask |= 1 << pc;
    if (hist[pc] === max) strongest = pc;
  }
  // 4096 masks × 12 strongest notes: the answer depends on nothing else, so it is remembered.
  const id = mask * 12 + strongest;
  let named = chordCache.get(id);
  if (named === undefined) {
    named = nameMask(mask, strongest);
    chordCache.set(id, named);
  }
  return named;
}

const chordCache = new Map<number, NamedChord | null>();

function nameMask(mask: number, strongest: number): NamedChord | null {
  if (popcount(mask) < 3) return null;
  let best: NamedChord | null = null;
  let bestScore = -Infinity;
  for (let root = 0; root < 12; root++) {
    for (const t of TEMPLATES) {
      let tmask = 0;
      for (const i of t.iv) tmask |= 1 << ((root + i) % 12);
      const hit = popcount(mask & tmask);
      const extra = popcount(mask & ~tmask);
      const missing = popcount(tmask & ~mask);
      // The root must sound; a missing fifth costs little.
      if (!(mask & (1 << root))) continue;
      // Ties go to the root that sounds longest.
      const score = hit - extra - 0.4 * missing + (root === strongest ? 0.01 : 0);
      if (score > bestScore) {
        bestScore = score;
        best = { root, quality: t.quality };
      }
    }
  }
  return bestScore >= 2 ? best : null;
}

function popcount(x: number): number {
  let c = 0;
  for (let v = x; v; v &= v - 1) c++;
  return c;
}

/** Chord fit weights: tonic, dominant, other diatonic, applied dominant, foreign. */
export const CHORD_FIT = { tonic: 1, dominant: 0.8, diatonic: 0.5, applied: 0.2, foreign: -0.6 } as const;

/** Diatonic triads: degree interval above the tonic → allowed qualities. */
const MAJOR_CHORDS: ReadonlyMap<number, readonly Quality[]> = new Map([
  [0, ["major"]], [2, ["minor"]], [4, ["minor"]], [5, ["major"]], [7, ["major", "dominant7"]], [9, ["minor"]], [11, ["diminished"]],
]);
const MINOR_CHORDS: ReadonlyMap<number, readonly Quality[]> = new Map([
  [0, ["minor"]], [2, ["diminished"]], [3, ["major"]], [5, ["minor", "major"]], [7, ["major", "dominant7", "minor"]], [8, ["major"]], [10, ["major", "dominant7"]], [11, ["diminished"]],
]);

const QUALITY_INDEX: Readonly<Record<Quality, number>> = { major: 0, minor: 1, diminished: 2, dominant7: 3 };
const fitCache = new Map<number, Float64Array>();

/** Fit of a chord in each key (index 0–11 major on that pitch class, 12–23 minor), as one shared
 * row per chord (48 chords at most): read it, never write it. */
export function chordFitRow(chord: NamedChord): Readonly<Float64Array> {
  // A number, not a string: a long part asks for a row on every beat.
  const id = chord.root * 4 + QUALITY_INDEX[chord.quality];
  let row = fitCache.get(id);
  if (!row) {
    row = fitRow(chord, new Float64Array(24));
    fitCache.set(id, row);
  }
  return row;
}

function fitRow(chord: NamedChord, out: Float64Array): Float64Array {
  for (let k = 0; k < 24; k++) {
    const t = k % 12;
    const table = k < 12 ? MAJOR_CHORDS : MINOR_CHORDS;
    const rel = (chord.root - t + 12) % 12;
    const q = chord.quality;
    let fit: number = CHORD_FIT.foreign;
    if (table.get(rel)?.includes(q)) fit = rel === 0 ? CHORD_FIT.tonic : rel === 7 ? CHORD_FIT.dominant : CHORD_FIT.diatonic;
    else {
      // V/x (major or dominant seventh on x+7) or vii°/x (diminished on x−1) of a diatonic
      // degree x carrying a major or minor triad, other than the tonic.
      const target = q === "diminished" ? (rel + 1) % 12 : q === "major" || q === "dominant7" ? (rel + 5) % 12 : -1;
      const tq = target >= 0 ? table.get(target) : undefined;
      if (target > 0 && tq && (tq.includes("major") || tq.includes("minor"))) fit = CHORD_FIT.applied;
    }
    out[k] = fit;
  }
  return out;
}
