/**
 * Keys in force through a part: one section per key signature (a signature change mid-part
 * starts a new key), and inside each section the local keys that windowed K–S correlation finds
 * clearly stronger than the section's key (tonicizations and modulations).
 */
import type { Measure } from "@/lib/musicxml/model";
import { inKey } from "./degree";
import { type Key, fifthsOf, inferMode, keyFromSignature, majorOf } from "./key";
import { type BarEvidence, CADENCE_WEIGHT, type Segment } from "./bar-evidence";
import { CHORD_FIT, chordFitRow, nameChord } from "./chord-fit";
import { keyScoresMean } from "./key-finding";
import type { MelodyNote } from "./melody";
import { TEMPERLEY_2007_PRESENCE } from "./profiles";
import { pcOfLof } from "./spelling";

export interface KeySection {
  fromIndex: number;
  toIndex: number;
  fifths: number;
  key: Key;
  source: "signature" | "inferred";
}

export interface LocalKeySpan {
  fromIndex: number;
  toIndex: number;
  key: Key;
  /** Bars (indices) before the new key's first foreign note whose notes fit both keys; null when none. */
  pivotFrom: number | null;
  pivotTo: number | null;
}

/**
 * Local keys as a path through the 24 keys, one key per bar, found by dynamic programming (Viterbi
 * over bars): each bar scores each key by the mean K–S correlation of its pitch classes (every part;
 * the bar weighted fully and its neighbours within the window less) plus any cadence on that key's
 * tonic; changing key costs `margin`; the section's key gets `homeBonus` in every bar. Linear in the
 * number of bars (24 keys × 2 per bar, the best predecessor found once per bar). A span in another
 * key is kept only when it holds a note foreign to the section key that belongs to the new one
 * (pitch content alone — a bar of G and D — is no modulation) and lasts `minMeasures`, or ends the
 * section. Its pivot region is the run of bars just before the first such note whose notes fit
 * both keys.
 * Besides the correlation: `presenceWeight` × log P(the beat's pitch-class set | key) (Temperley
 * 2007), `foreignWeight` × the share of the window's time outside the key's scale
 * (Longuet-Higgins & Steedman 1971), `chordWeight` × the chord's fit. `startAtCadence`: a new key
 * starts at its tonic's arrival from its dominant when that comes within so many bars (0 = off);
 * `closingAtCadence` 1: a new key that ends the section starts at that arrival however far it is
 * (common practice in textbook analyses: the chords before the final cadence are applied chords of
 * the old key). `remoteKeys` 1: that holds only for a new tonic on a degree of the old key's scale
 * (applied chords tonicize the key's own degrees); a key outside it starts at the first chord
 * foreign to the old key. A run in the relative key needs a cadence or `minMeasures` bars (see below).
 * `requireEvidence` 1 asks a foreign note of harmonised spans too (off: the tuning rejected it).
 * The values were set by scripts/tune-harmony.ts on the tuning half of tests/fixtures/harmony.
 */
export const LOCAL_KEY = { windowMeasures: 2, margin: 0.6, homeBonus: 0.1, neighbourWeight: 0.35, minMeasures: 3, openingChord: 0.3, chordWeight: 1, presenceWeight: 0.2, startAtCadence: 2, requireEvidence: 0, foreignWeight: 1, closingAtCadence: 1, remoteKeys: 1 } as const;

export type LocalKeyParams = { [K in keyof typeof LOCAL_KEY]: number };

export function keySections(measures: readonly Measure[], melody: readonly MelodyNote[]): KeySection[] {
  const sections: KeySection[] = [];
  // A section without a mode reads its own notes: one pass hands each section its notes (in melody
  // order), however many sections there are.
  const sectionAt = new Int32Array(measures.length);
  const unknown: number[] = [];
  let start = 0;
  for (let i = 1; i <= measures.length; i++) {
    const cur = measures[i];
    const prev = measures[start];
    const boundary =
      i === measures.length || (cur.keyChanged && (cur.key.fifths !== prev.key.fifths || cur.key.mode !== prev.key.mode));
    if (!boundary) continue;
    const sig = prev.key;
    const fromSig = keyFromSignature(sig.fifths, sig.mode);
    sectionAt.fill(sections.length, start, i);
    if (!fromSig) unknown.push(sections.length);
    sections.push({
      fromIndex: start,
      toIndex: i - 1,
      fifths: sig.fifths,
      key: fromSig ?? majorOf(sig.fifths),
      source: fromSig ? "signature" : "inferred",
    });
    start = i;
  }
  if (unknown.length > 0) {
    const notes = sections.map((): MelodyNote[] => []);
    for (const n of melody) if (n.measureIndex >= 0 && n.measureIndex < measures.length) notes[sectionAt[n.measureIndex]].push(n);
    for (const k of unknown) sections[k].key = inferMode(sections[k].fifths, notes[k]).key;
  }
  if (sections.length === 0) sections.push({ fromIndex: 0, toIndex: -1, fifths: 0, key: { tonicLof: 0, mode: "major" }, source: "inferred" });
  return sections;
}

/** The spelling of a pitch-class tonic whose signature lies nearest the section's. */
function spellTonic(pc: number, mode: Key["mode"], nearFifths: number): Key {
  let best: Key | null = null;
  for (let lof = -15; lof <= 15; lof++) {
    if (pcOfLof(lof) !== pc) continue;
    const k: Key = { tonicLof: lof, mode };
    if (!best || Math.abs(fifthsOf(k) - nearFifths) < Math.abs(fifthsOf(best) - nearFifths)) best = k;
  }
  return best as Key;
}

const PRESENCE_LOG = (["major", "minor"] as const).map((mode) =>
  TEMPERLEY_2007_PRESENCE[mode].map((p) => ({ yes: Math.log(p), no: Math.log(1 - p) })),
);

/**
 * Temperley's (2007) probabilistic key-finding, for one segment: log P(the segment's pitch-class
 * set | key) for the 24 keys, each pitch class present or absent independently with the key's
 * probability, shifted so that the best key scores 0.
 */
function presenceScores(hist: ArrayLike<number>, out: Float64Array): void {
  let max = -Infinity;
  for (let k = 0; k < 24; k++) {
    const table = PRESENCE_LOG[k < 12 ? 0 : 1];
    const t = k % 12;
    let lp = 0;
    for (let pc = 0; pc < 12; pc++) {
      const e = table[(pc - t + 12) % 12];
      lp += hist[pc] > 0 ? e.yes : e.no;
    }
    out[k] = lp;
    if (lp > max) max = lp;
  }
  for (let k = 0; k < 24; k++) out[k] -= max;
}

/** How far each pitch class (above the tonic) lies outside the key's scale: 0 inside, 1 outside;
 * in minor the raised seventh belongs (harmonic minor) and the raised sixth half (melodic minor). */
const OUTSIDE = {
  major: [0, 1, 0, 1, 0, 0, 1, 0, 1, 0, 1, 0],
  minor: [0, 1, 0, 0, 1, 0, 1, 0, 0, 0.5, 0, 0],
} as const;

/**
 * The share of the sounding time spent on notes outside each key's scale (Longuet-Higgins &
 * Steedman 1971, "On interpreting Bach": a key is ruled out by the notes its scale lacks).
 */
function foreignShares(hist: ArrayLike<number>, out: Float64Array): void {
  let total = 0;
  for (let pc = 0; pc < 12; pc++) total += hist[pc];
  for (let k = 0; k < 24; k++) {
    if (total <= 0) {
      out[k] = 0;
      continue;
    }
    const table = k < 12 ? OUTSIDE.major : OUTSIDE.minor;
    const t = k % 12;
    let f = 0;
    for (let pc = 0; pc < 12; pc++) f += hist[pc] * table[(pc - t + 12) % 12];
    out[k] = f / total;
  }
}

/**
 * Where the file gives no mode, the guess (keySections) and its relative key share the notes of
 * one signature and stand alike in the reading; the one the section opens in is its key (common
 * practice: music opens on its tonic chord). The relative key's bars then read as a local key.
 */
export function settleMode(section: KeySection, bars: readonly BarEvidence[], params: LocalKeyParams = LOCAL_KEY): KeySection {
  if (section.source !== "inferred") return section;
  const relative: Key = section.key.mode === "major" ? { tonicLof: section.key.tonicLof + 3, mode: "minor" } : { tonicLof: section.key.tonicLof - 3, mode: "major" };
  const first = localKeysOf(section, bars, params)[0];
  const opensRelative = first !== undefined && first.fromIndex === section.fromIndex && keyIndexOf(first.key) === keyIndexOf(relative);
  return opensRelative ? { ...section, key: relative } : section;
}

/** Key index 0–11 = major on that pitch class, 12–23 = minor. */
const keyIndexOf = (k: Key) => (k.mode === "major" ? 0 : 12) + pcOfLof(k.tonicLof);

/**
 * Local keys of one section, from the bars' evidence (bar-evidence.ts). The section key is the
 * home of the path: bars that fit it as well as another key stay in it.
 */
export function localKeysOf(section: KeySection, bars: readonly BarEvidence[], params: LocalKeyParams = LOCAL_KEY): LocalKeySpan[] {
  const { windowMeasures, margin, homeBonus, neighbourWeight, minMeasures, openingChord, chordWeight, presenceWeight, startAtCadence, requireEvidence, foreignWeight, closingAtCadence, remoteKeys } = params;
  const n = section.toIndex - section.fromIndex + 1;
  if (n < 1) return [];
  const home = keyIndexOf(section.key);
  // A mode the file did not give is only a guess: the relative key shares the home bonus.
  const alsoHome = section.source === "inferred" ? keyIndexOf(section.key.mode === "major" ? { tonicLof: section.key.tonicLof + 3, mode: "minor" } : { tonicLof: section.key.tonicLof - 3, mode: "major" }) : home;
  const bar = (i: number) => bars[section.fromIndex + i];
  // The section's beats in order, each remembering its bar.
  const segs: Segment[] = [];
  for (let i = 0; i < n; i++) for (const sg of bar(i).segments) segs.push(sg);
  const m = segs.length;
  const barOfSeg = new Int32Array(m);
  for (let i = 0, s = 0; i < n; i++) for (let c = bar(i).segments.length; c > 0; c--) barOfSeg[s++] = i;
  // Common practice: music opens on its tonic chord. Where the file gives no mode, the first
  // chord struck (its bass the root, its third major or minor) names the key the section opens in.
  const openingBonus = new Float64Array(24);
  if (section.source === "inferred") {
    const opening = segs.find((sg) => sg.firstBass >= 0);
    if (opening) {
      const t = opening.firstBass;
      const has = (iv: number) => (opening.firstPcs & (1 << ((t + iv) % 12))) !== 0;
      if (has(4)) openingBonus[t] += openingChord;
      if (has(3)) openingBonus[12 + t] += openingChord;
    }
  }
  // Emission: correlation of the beat's pitch classes with its neighbours' (within half the
  // window each side, weighted down geometrically per beat) mixed in, plus cadences. Each beat's
  // row is made and used at once by the Viterbi step (no table of every beat's 24 scores).
  const radius = Math.max(1, Math.round((windowMeasures / 2) * (m / n)));
  const h = new Float64Array(12);
  const row0 = new Float64Array(24);
  const presence = new Float64Array(24);
  const foreign = new Float64Array(24);
  // Each beat's chord fit in the 24 keys (null: no chord named), a shared row per chord.
  const fitOf = new Array<Readonly<Float64Array> | null>(m).fill(null);
  const emission = (i: number, row: Float64Array) => {
    h.fill(0);
    let any = false;
    const perBar = bar(barOfSeg[i]).segments.length;
    for (let j = Math.max(0, i - radius); j <= Math.min(m - 1, i + radius); j++) {
      const w = neighbourWeight ** (Math.abs(j - i) / perBar);
      const hj = segs[j].hist;
      for (let pc = 0; pc < 12; pc++) h[pc] += w * hj[pc];
    }
    for (let pc = 0; pc < 12; pc++) if (h[pc] > 0) any = true;
    if (any) keyScoresMean(h, row0);
    // Scores are per bar, shared by its beats (cadences are events and count whole).
    const named = nameChord(segs[i].hist);
    const fr = named ? chordFitRow(named) : null;
    fitOf[i] = fr;
    if (presenceWeight > 0) presenceScores(segs[i].hist, presence);
    if (foreignWeight > 0) foreignShares(h, foreign);
    const cadence = segs[i].cadence;
    for (let k = 0; k < 24; k++) row[k] = ((any ? row0[k] : 0) + (fr ? chordWeight * fr[k] : 0) + (k === home || k === alsoHome ? homeBonus : 0) + (presenceWeight > 0 ? presenceWeight * presence[k] : 0) - (foreignWeight > 0 ? foreignWeight * foreign[k] : 0)) / perBar + (cadence.size > 0 ? (cadence.get(k) ?? 0) : 0);
  };
  // Viterbi with a flat change cost: best[k] = score + max(best_prev[k], max_prev − margin).
  const back = new Int8Array(m * 24);
  const row = new Float64Array(24);
  let best = new Float64Array(24);
  let next = new Float64Array(24);
  emission(0, best);
  for (let k = 0; k < 24; k++) best[k] += openingBonus[k];
  best[home] += margin; // the section starts in its key unless the music says otherwise
  if (alsoHome !== home) best[alsoHome] += margin;
  for (let i = 1; i < m; i++) {
    emission(i, row);
    let arg = 0;
    for (let k = 1; k < 24; k++) if (best[k] > best[arg]) arg = k;
    const move = best[arg] - margin;
    for (let k = 0; k < 24; k++) {
      const stay = best[k];
      next[k] = row[k] + (stay >= move ? stay : move);
      back[i * 24 + k] = stay >= move ? k : arg;
    }
    [best, next] = [next, best];
  }
  let last = 0;
  for (let k = 1; k < 24; k++) if (best[k] > best[last]) last = k;
  const segPath = new Int8Array(m);
  segPath[m - 1] = last;
  for (let i = m - 1; i > 0; i--) segPath[i - 1] = back[i * 24 + segPath[i]];
  // Common practice in Roman-numeral analysis: the chords that lead to a new tonic are applied
  // chords of the old key (V/V, vii°/ii) until the tonic arrives from its dominant; the new key is
  // written from that arrival. A run of beats in a key with such an arrival starts there.
  if (startAtCadence > 0) {
    for (let s = 1; s < m; ) {
      let e = s;
      while (e + 1 < m && segPath[e + 1] === segPath[s]) e++;
      if (segPath[s] !== segPath[s - 1]) {
        let arrival = -1;
        for (let t = s; t <= e && arrival < 0; t++) if ((segs[t].cadence.get(segPath[s]) ?? 0) >= CADENCE_WEIGHT.bassCadence) arrival = t;
        const closing = e === m - 1 && segPath[s] !== home && closingAtCadence > 0;
        if (arrival > s && (closing || arrival - s <= startAtCadence * (m / n))) {
          const old = segPath[s - 1];
          // Applied chords tonicize the triads of a key's own degrees (Kostka & Payne, Tonal Harmony,
          // "Secondary functions"; Open Music Theory v1, "Applied chords"): a new tonic outside the old
          // key's scale cannot be reached by them, so from the first chord foreign to the old key
          // the music is already in the new one.
          const remote = remoteKeys > 0 && (old < 12 ? OUTSIDE.major : OUTSIDE.minor)[(segPath[s] - old + 24) % 12] > 0;
          for (let t = s; t < arrival; t++) {
            const f = fitOf[t];
            if (remote && f && f[old] <= CHORD_FIT.foreign) break;
            segPath[t] = old;
          }
        }
      }
      s = e + 1;
    }
  }
  // The relative key shares every note of the key's scale: pitch content cannot tell a tonicized
  // vi (or III) from a modulation, a cadence can. A run in the relative key of the key before it,
  // shorter than `minMeasures` with no arrival on its tonic from its dominant, stays in that key
  // (common practice: a tonicization is written as applied chords, V/vi – vi).
  for (let s = 1; s < m; ) {
    let e = s;
    while (e + 1 < m && segPath[e + 1] === segPath[s]) e++;
    const before = segPath[s - 1];
    const k = segPath[s];
    const relative = before < 12 ? k === 12 + ((before + 9) % 12) : k === (before + 3) % 12;
    if (relative && k !== home && e - s + 1 < minMeasures * (m / n)) {
      let arrival = false;
      for (let t = s; t <= e && !arrival; t++) if ((segs[t].cadence.get(k) ?? 0) >= CADENCE_WEIGHT.bassCadence) arrival = true;
      if (!arrival) for (let t = s; t <= e; t++) segPath[t] = before;
    }
    s = e + 1;
  }
  // A bar's key: the key of most of its beats (ties go to the downbeat's).
  const path = new Int8Array(n);
  const tally = new Int32Array(24);
  for (let i = 0, s0 = 0; i < n; i++) {
    const len = bar(i).segments.length;
    for (let s = s0; s < s0 + len; s++) tally[segPath[s]]++;
    // The first key to reach the highest count in beat order: the downbeat's on a tie.
    let pick = segPath[s0];
    for (let s = s0; s < s0 + len; s++) if (tally[segPath[s]] > tally[pick]) pick = segPath[s];
    for (let s = s0; s < s0 + len; s++) tally[segPath[s]] = 0;
    path[i] = pick;
    s0 += len;
  }

  // Spelling and evidence: the key spelled nearest the section's signature must have a note
  // foreign to the section key in its span.
  // The tonic spelled as the span's notes are (G♭ major, not F♯, when the notes are flats); on a
  // tie, nearest the section's signature.
  const spell = (k: number, from: number, to: number) => {
    const mode = k < 12 ? "major" : "minor";
    const near = spellTonic(k % 12, mode, section.fifths);
    let pick = near;
    let bestFit = -1;
    for (const lof of [near.tonicLof, near.tonicLof - 12, near.tonicLof + 12]) {
      const cand: Key = { tonicLof: lof, mode };
      let fit = 0;
      for (let b = from; b <= to; b++) for (const l of bar(b).lofs) if (inKey(l, cand)) fit++;
      if (fit > bestFit) {
        bestFit = fit;
        pick = cand;
      }
    }
    return pick;
  };
  const evidence = (i: number, k: Key) => {
    for (const l of bar(i).lofs) if (!inKey(l, section.key) && inKey(l, k)) return true;
    return false;
  };
  const fitsBoth = (i: number, a: Key, b: Key) => {
    for (const l of bar(i).lofs) if (!inKey(l, a) || !inKey(l, b)) return false;
    return true;
  };
  const spans: LocalKeySpan[] = [];
  for (let i = 0; i < n; ) {
    let j = i;
    while (j + 1 < n && path[j + 1] === path[i]) j++;
    if (path[i] !== home || (alsoHome !== home && path[i] === alsoHome)) {
      const key = spell(path[i], i, j);
      let first = -1;
      for (let b = i; b <= j && first < 0; b++) if (evidence(b, key)) first = b;
      let cadence = false;
      for (let b = i; b <= j; b++) if ((bar(b).cadence.get(path[i]) ?? 0) >= CADENCE_WEIGHT.bassCadence) cadence = true;
      const closing = j === n - 1 && cadence;
      const long = j - i + 1 >= minMeasures || closing;
      // Where other parts give the harmony, chord fit and cadences already carry the evidence;
      // a melody alone must show a foreign note and hold the key for a while.
      let harmonic = false;
      for (let b = i; b <= j; b++) if (!bar(b).melodyOnly) harmonic = true;
      // A signature names the key the section starts in: a span from its first bar would only
      // contradict it.
      const againstSignature = i === 0 && section.source === "signature";
      if (((harmonic && (requireEvidence === 0 || first >= 0)) || (first >= 0 && long)) && !againstSignature) {
        // Pivot: bars before the first evidence whose notes fit both the old key and the new one.
        const prevKey = spans.length > 0 && spans[spans.length - 1].toIndex === section.fromIndex + i - 1 ? spans[spans.length - 1].key : section.key;
        let p = first;
        while (p - 1 >= Math.max(0, i - windowMeasures) && fitsBoth(p - 1, prevKey, key)) p--;
        spans.push({ fromIndex: section.fromIndex + i, toIndex: section.fromIndex + j, key, pivotFrom: p < first ? section.fromIndex + p : null, pivotTo: p < first ? section.fromIndex + first - 1 : null });
      }
    }
    i = j + 1;
  }
  return spans;
}
