/**
 * Harmonic evidence per bar, from every part of the score (the piano under the flute, the other
 * voices of the staff) and from the melody itself: a duration-weighted pitch-class histogram, the
 * spelled notes present, and cadences — a bass falling a fifth (or rising a fourth) from a chord
 * holding the new tonic's leading tone to a chord on that tonic. Where the melody sounds alone, its
 * own raised degrees that resolve up a half step stand in for the cadence. One pass over the
 * notes, bucketed by bar: linear in their number.
 */
import type { Note, PartModel, ScoreModel } from "@/lib/musicxml/model";
import { toNumber as frac } from "@/lib/musicxml/fraction";
import type { MelodyNote, Timeline } from "./melody";
import { orderByKey } from "./order";
import { lofOf, mod } from "./spelling";

/** One beat of a bar (the beat of its time signature: a dotted quarter in 6/8). */
export interface Segment {
  /** Duration-weighted pitch classes sounding in the beat (quarter notes), every part. */
  hist: Float64Array;
  /** Key index (0–11 major on that pitch class, 12–23 minor) → cadence weight arriving in the beat. */
  cadence: Map<number, number>;
  /** Pitch classes (bit mask) the notes outside the melody sound in the beat: its harmony. */
  harmony: number;
  /** The first chord struck in the beat (two notes or more): its bass pitch class and its pitch
   * classes (bit mask); bass −1 when none. */
  firstBass: number;
  firstPcs: number;
}

export interface BarEvidence {
  /** Duration-weighted pitch classes (quarter notes), every part. */
  hist: number[];
  /** The bar's beats, in order. */
  segments: Segment[];
  /** Length of one beat (whole notes). */
  beatLength: number;
  /** Spelled notes (line of fifths) sounding in the bar, every part. */
  lofs: Set<number>;
  /** Key index → the strongest cadence weight arriving in this bar. */
  cadence: Map<number, number>;
  /** True when only the melody sounds in the bar. */
  melodyOnly: boolean;
}

/** The notes that sound, every part: start, end and pitch of each, in columns (a long score has
 * a hundred thousand; one object each would be as many allocations). */
interface Sounding {
  pos: Float64Array;
  end: Float64Array;
  midi: Float64Array;
  /** The bar its start falls in (on the analysed part's bar lines). */
  bar: Int32Array;
  count: number;
}

/** Weights of cadential evidence (added to a key's mean correlation in the bar of arrival). */
export const CADENCE_WEIGHT = { bassCadence: 0.35, melodicLeadingTone: 0.15 } as const;

export function barEvidence(score: ScoreModel, part: PartModel, timeline: Timeline, melody: readonly MelodyNote[]): BarEvidence[] {
  const count = part.measures.length;
  const beatLength = part.measures.map((m) => {
    const beats = m.time?.beats ?? 4;
    const beatType = m.time?.beatType ?? 4;
    return beats % 3 === 0 && beats > 3 && beatType >= 8 ? 3 / beatType : 1 / beatType;
  });
  // Every beat's histogram is a view on one buffer, and a cadence map is made when a cadence
  // arrives (few beats hold one): a long part has tens of thousands of beats.
  const beatCount = timeline.measureLength.map((len, i) => Math.max(1, Math.round(len / beatLength[i] + 0.49)));
  const hists = new Float64Array(12 * beatCount.reduce((a, b) => a + b, 0));
  let used = 0;
  const bars: BarEvidence[] = Array.from({ length: count }, (_, i) => ({
    hist: new Array<number>(12).fill(0),
    segments: Array.from({ length: beatCount[i] }, () => ({
      hist: hists.subarray(used, (used += 12)),
      cadence: NO_CADENCE,
      harmony: 0,
      firstBass: -1,
      firstPcs: 0,
    })),
    beatLength: beatLength[i],
    lofs: new Set<number>(),
    cadence: NO_CADENCE,
    melodyOnly: true,
  }));
  const inMelody = melodyMarks(part.notes, melody);
  const total = score.parts.reduce((c, p) => c + p.notes.length, 0);
  const sounding: Sounding = { pos: new Float64Array(total), end: new Float64Array(total), midi: new Float64Array(total), bar: new Int32Array(total), count: 0 };
  for (const p of score.parts) {
    for (let i = 0; i < p.notes.length; i++) {
      const n = p.notes[i];
      if (n.isRest || n.isCue || n.isGrace || !n.pitch || n.measureIndex >= count) continue;
      const bar = bars[n.measureIndex];
      bar.hist[mod(n.pitch.midi, 12)] += frac(n.duration) * 4;
      bar.lofs.add(lofOf(n.pitch.step, n.pitch.alter));
      const melodyNote = p === part && inMelody[i] === 1;
      if (!melodyNote) bar.melodyOnly = false;
      const onset = frac(n.onset);
      const pos = timeline.measureStart[n.measureIndex] + onset;
      const dur = frac(n.duration);
      sounding.pos[sounding.count] = pos;
      sounding.end[sounding.count] = pos + dur;
      sounding.bar[sounding.count] = barFrom(timeline, n.measureIndex, pos);
      sounding.midi[sounding.count++] = n.pitch.midi;
      // Spread the note over the beats it sounds in (within its bar).
      const segs = bar.segments;
      const bl = beatLength[n.measureIndex];
      const pc = mod(n.pitch.midi, 12);
      for (let s = Math.min(segs.length - 1, Math.floor(onset / bl + 1e-9)); s < segs.length; s++) {
        const a = Math.max(onset, s * bl);
        const b = s === segs.length - 1 ? onset + dur : Math.min(onset + dur, (s + 1) * bl);
        if (b <= a + 1e-12) break;
        segs[s].hist[pc] += (b - a) * 4;
        if (!melodyNote) segs[s].harmony |= 1 << pc;
      }
    }
  }
  const segmentAt = (b: number, pos: number): Segment => {
    const segs = bars[b].segments;
    return segs[Math.max(0, Math.min(segs.length - 1, Math.floor((pos - timeline.measureStart[b]) / beatLength[b] + 1e-9)))];
  };
  const mark = (b: number, pos: number, key: number, w: number) => {
    add(bars[b], key, w);
    add(segmentAt(b, pos), key, w);
  };
  const chord = (b: number, pos: number, bass: number, pcs: number) => {
    const seg = segmentAt(b, pos);
    if (seg.firstBass < 0) {
      seg.firstBass = bass;
      seg.firstPcs = pcs;
    }
  };
  addBassCadences(sounding, mark, chord);
  addMelodicLeadingTones(melody, bars, timeline, mark);
  return bars;
}

/** 1 for each of the part's notes that is in the melody. The melody keeps the part's order: one
 * walk matches them, without a set of a long part's notes (a set when the order differs). */
function melodyMarks(notes: readonly Note[], melody: readonly MelodyNote[]): Uint8Array {
  const marks = new Uint8Array(notes.length);
  let j = 0;
  for (let i = 0; i < notes.length && j < melody.length; i++) {
    if (notes[i] === melody[j].note) {
      marks[i] = 1;
      j++;
    }
  }
  if (j < melody.length) {
    const inMelody = new Set(melody.map((m) => m.note));
    for (let i = 0; i < notes.length; i++) marks[i] = inMelody.has(notes[i]) ? 1 : 0;
  }
  return marks;
}

/** The last bar starting at or before `pos`, found from the bar a note is written in: a note
 * running past its bar's written length (a bar read as written) belongs to the bar it reaches.
 * Walks forward from the written bar, so a pass over the notes stays linear. */
function barFrom(timeline: Timeline, written: number, pos: number): number {
  const starts = timeline.measureStart;
  let b = Math.min(written, starts.length - 1);
  while (b > 0 && starts[b] > pos + 1e-9) b--;
  while (b + 1 < starts.length && starts[b + 1] <= pos + 1e-9) b++;
  return b;
}

/** The cadence map of a bar or beat with no cadence yet; never written to. */
const NO_CADENCE: Map<number, number> = new Map();

function add(at: { cadence: Map<number, number> }, key: number, w: number): void {
  if (at.cadence === NO_CADENCE) at.cadence = new Map();
  at.cadence.set(key, Math.max(at.cadence.get(key) ?? 0, w));
}

type Mark = (bar: number, pos: number, key: number, w: number) => void;

/** Chords at each onset (every sounding note), and V → I motions between consecutive chords. */
function addBassCadences(sounding: Sounding, mark: Mark, chord: (bar: number, pos: number, bass: number, pcs: number) => void): void {
  const { pos, end, midi, bar: barOfNote, count } = sounding;
  if (count === 0) return;
  const order = startOrder(pos, barOfNote, count);
  const at = (k: number) => (order ? order[k] : k);
  const active: number[] = [];
  let prev: { bass: number; pcs: number } | null = null;
  let i = 0;
  while (i < count) {
    const t = pos[at(i)];
    const bar = barOfNote[at(i)];
    while (i < count && pos[at(i)] <= t + 1e-9) active.push(at(i++));
    // Drop notes that ended; the list holds only what sounds now (a few notes).
    let w = 0;
    for (const s of active) if (end[s] > t + 1e-9) active[w++] = s;
    active.length = w;
    let bass = Infinity;
    let pcs = 0;
    for (const s of active) {
      bass = Math.min(bass, midi[s]);
      pcs |= 1 << mod(midi[s], 12);
    }
    if (active.length < 2) {
      prev = null;
      continue;
    }
    const cur = { bass: mod(bass, 12), pcs };
    chord(bar, t, cur.bass, pcs);
    if (prev && prev.bass !== cur.bass) {
      const tonic = cur.bass;
      const has = (set: number, pc: number) => (set & (1 << mod(pc, 12))) !== 0;
      // Root position (bass 5 → 1) or first inversion (bass 7 → 1, the leading tone in the bass
      // under the dominant's root).
      const rootPosition = prev.bass === mod(tonic + 7, 12) && has(prev.pcs, tonic + 11);
      const firstInversion = prev.bass === mod(tonic + 11, 12) && has(prev.pcs, tonic + 7);
      if ((rootPosition || firstInversion) && !has(prev.pcs, tonic + 10) && !has(cur.pcs, tonic + 11)) {
        const major = has(cur.pcs, tonic + 4);
        const minor = has(cur.pcs, tonic + 3);
        // A major chord with its minor seventh is itself a dominant (V7/IV), no tonic arriving.
        const dominantSeventh = major && has(cur.pcs, tonic + 10);
        if ((major || !minor) && !dominantSeventh) mark(bar, t, tonic, CADENCE_WEIGHT.bassCadence);
        if (minor || !major) mark(bar, t, 12 + tonic, CADENCE_WEIGHT.bassCadence);
      }
    }
    prev = cur;
  }
}

/**
 * The notes by start, ties in the order read; null when they are in that order already (one part,
 * one voice). Several parts (or voices after a `backup`) come bar by bar out of order: the notes
 * are first counted into their bars, which are in time order (a note's bar is the last one
 * starting at or before it), and only each bar's own few notes are compared. Linear in the notes
 * for bars of bounded length, where one comparison sort of a long score would cost a logarithm
 * more per note.
 */
export function startOrder(pos: ArrayLike<number>, bar: ArrayLike<number>, count: number): number[] | null {
  let sorted = true;
  let bars = 0;
  for (let k = 0; k < count; k++) {
    if (k > 0 && pos[k] < pos[k - 1]) sorted = false;
    if (bar[k] + 1 > bars) bars = bar[k] + 1;
  }
  if (sorted) return null;
  const order = orderByKey(Array.from({ length: count }, (_, k) => k), (k) => bar[k], bars);
  const byStart = (a: number, b: number) => pos[a] - pos[b] || a - b;
  for (let from = 0; from < count; ) {
    let to = from + 1;
    let inOrder = true;
    for (; to < count && bar[order[to]] === bar[order[from]]; to++) if (byStart(order[to - 1], order[to]) > 0) inOrder = false;
    if (!inOrder) {
      const run = order.slice(from, to).sort(byStart);
      for (let k = 0; k < run.length; k++) order[from + k] = run[k];
    }
    from = to;
  }
  return order;
}

/** In bars where the melody sounds alone: a note rising a half step to an arrival names that tonic. */
function addMelodicLeadingTones(melody: readonly MelodyNote[], bars: BarEvidence[], timeline: Timeline, mark: Mark): void {
  for (let i = 0; i + 1 < melody.length; i++) {
    const n = melody[i];
    const next = melody[i + 1];
    if (n.grace || next.grace || next.midi - n.midi !== 1) continue;
    // An arrival: on a strong beat, or held longer than the note before.
    if (next.metric < 2 && next.dur < 2 * n.dur - 1e-9) continue;
    const bar = bars[next.measureIndex];
    if (!bar?.melodyOnly) continue;
    const tonic = mod(next.midi, 12);
    const at = barFrom(timeline, next.measureIndex, next.pos);
    mark(at, next.pos, tonic, CADENCE_WEIGHT.melodicLeadingTone);
    mark(at, next.pos, 12 + tonic, CADENCE_WEIGHT.melodicLeadingTone);
  }
}

/** The pitch classes outside the melody sounding in the beat of a position in a bar. One set per
 * combination of pitch classes, made once and shared (a long part asks for thousands). */
export function harmonyAt(bars: readonly BarEvidence[], measureIndex: number, onset: number): ReadonlySet<number> {
  const bar = bars[measureIndex];
  if (!bar) return pitchClassSet(0);
  const seg = bar.segments[Math.max(0, Math.min(bar.segments.length - 1, Math.floor(onset / bar.beatLength + 1e-9)))];
  return pitchClassSet(seg.harmony);
}

const pitchClassSets = new Map<number, ReadonlySet<number>>();

function pitchClassSet(mask: number): ReadonlySet<number> {
  let set = pitchClassSets.get(mask);
  if (!set) {
    const pcs = new Set<number>();
    for (let pc = 0; pc < 12; pc++) if (mask & (1 << pc)) pcs.add(pc);
    pitchClassSets.set(mask, (set = pcs));
  }
  return set;
}
