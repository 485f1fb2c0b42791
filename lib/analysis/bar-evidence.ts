/**
 * Harmonic evidence per bar, from every part of the score (the piano under the flute, the other
 * voices of the staff) and from the melody itself: a duration-weighted pitch-class histogram, the
 * spelled notes present, and cadences — a bass falling a fifth (or rising a fourth) from a chord
 * holding the new tonic's leading tone to a chord on that tonic. Where the melody sounds alone, its
 * own raised degrees that resolve up a half step stand in for the cadence. One pass over the
 * notes, bucketed by bar: linear in their number.
 */
import type { PartModel, ScoreModel } from "@/lib/musicxml/model";
import { toNumber as frac } from "@/lib/musicxml/fraction";
import type { MelodyNote, Timeline } from "./melody";
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

interface Sounding {
  pos: number;
  end: number;
  midi: number;
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
  const bars: BarEvidence[] = Array.from({ length: count }, (_, i) => ({
    hist: new Array<number>(12).fill(0),
    segments: Array.from({ length: Math.max(1, Math.round(timeline.measureLength[i] / beatLength[i] + 0.49)) }, () => ({
      hist: new Float64Array(12),
      cadence: new Map<number, number>(),
      harmony: 0,
      firstBass: -1,
      firstPcs: 0,
    })),
    beatLength: beatLength[i],
    lofs: new Set<number>(),
    cadence: new Map<number, number>(),
    melodyOnly: true,
  }));
  const inMelody = new Set(melody.map((m) => m.note));
  const sounding: Sounding[] = [];
  for (const p of score.parts) {
    for (const n of p.notes) {
      if (n.isRest || n.isCue || n.isGrace || !n.pitch || n.measureIndex >= count) continue;
      const bar = bars[n.measureIndex];
      bar.hist[mod(n.pitch.midi, 12)] += frac(n.duration) * 4;
      bar.lofs.add(lofOf(n.pitch.step, n.pitch.alter));
      const melodyNote = p === part && inMelody.has(n);
      if (!melodyNote) bar.melodyOnly = false;
      const onset = frac(n.onset);
      const pos = timeline.measureStart[n.measureIndex] + onset;
      const dur = frac(n.duration);
      sounding.push({ pos, end: pos + dur, midi: n.pitch.midi });
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
  const segmentAt = (pos: number): Segment => {
    const b = barOf(timeline, pos);
    const segs = bars[b].segments;
    return segs[Math.max(0, Math.min(segs.length - 1, Math.floor((pos - timeline.measureStart[b]) / beatLength[b] + 1e-9)))];
  };
  const mark = (pos: number, key: number, w: number) => {
    const b = barOf(timeline, pos);
    add(bars[b].cadence, key, w);
    add(segmentAt(pos).cadence, key, w);
  };
  const chord = (pos: number, bass: number, pcs: number) => {
    const seg = segmentAt(pos);
    if (seg.firstBass < 0) {
      seg.firstBass = bass;
      seg.firstPcs = pcs;
    }
  };
  addBassCadences(sounding, mark, chord);
  addMelodicLeadingTones(melody, bars, mark);
  return bars;
}

function barOf(timeline: Timeline, pos: number): number {
  // Binary search over bar starts.
  let lo = 0;
  let hi = timeline.measureStart.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (timeline.measureStart[mid] <= pos + 1e-9) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

function add(cadence: Map<number, number>, key: number, w: number): void {
  cadence.set(key, Math.max(cadence.get(key) ?? 0, w));
}

type Mark = (pos: number, key: number, w: number) => void;

/** Chords at each onset (every sounding note), and V → I motions between consecutive chords. */
function addBassCadences(sounding: Sounding[], mark: Mark, chord: (pos: number, bass: number, pcs: number) => void): void {
  if (sounding.length === 0) return;
  sounding.sort((a, b) => a.pos - b.pos);
  const active: Sounding[] = [];
  let prev: { bass: number; pcs: number } | null = null;
  let i = 0;
  while (i < sounding.length) {
    const t = sounding[i].pos;
    while (i < sounding.length && sounding[i].pos <= t + 1e-9) active.push(sounding[i++]);
    // Drop notes that ended; the list holds only what sounds now (a few notes).
    let w = 0;
    for (const s of active) if (s.end > t + 1e-9) active[w++] = s;
    active.length = w;
    let bass = Infinity;
    let pcs = 0;
    for (const s of active) {
      bass = Math.min(bass, s.midi);
      pcs |= 1 << mod(s.midi, 12);
    }
    if (active.length < 2) {
      prev = null;
      continue;
    }
    const cur = { bass: mod(bass, 12), pcs };
    chord(t, cur.bass, pcs);
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
        if ((major || !minor) && !dominantSeventh) mark(t, tonic, CADENCE_WEIGHT.bassCadence);
        if (minor || !major) mark(t, 12 + tonic, CADENCE_WEIGHT.bassCadence);
      }
    }
    prev = cur;
  }
}

/** In bars where the melody sounds alone: a note rising a half step to an arrival names that tonic. */
function addMelodicLeadingTones(melody: readonly MelodyNote[], bars: BarEvidence[], mark: Mark): void {
  for (let i = 0; i + 1 < melody.length; i++) {
    const n = melody[i];
    const next = melody[i + 1];
    if (n.grace || next.grace || next.midi - n.midi !== 1) continue;
    // An arrival: on a strong beat, or held longer than the note before.
    if (next.metric < 2 && next.dur < 2 * n.dur - 1e-9) continue;
    const bar = bars[next.measureIndex];
    if (!bar?.melodyOnly) continue;
    const tonic = mod(next.midi, 12);
    mark(next.pos, tonic, CADENCE_WEIGHT.melodicLeadingTone);
    mark(next.pos, 12 + tonic, CADENCE_WEIGHT.melodicLeadingTone);
  }
}

/** The pitch classes outside the melody sounding in the beat of a position in a bar. */
export function harmonyAt(bars: readonly BarEvidence[], measureIndex: number, onset: number): Set<number> {
  const bar = bars[measureIndex];
  const out = new Set<number>();
  if (!bar) return out;
  const seg = bar.segments[Math.max(0, Math.min(bar.segments.length - 1, Math.floor(onset / bar.beatLength + 1e-9)))];
  for (let pc = 0; pc < 12; pc++) if (seg.harmony & (1 << pc)) out.add(pc);
  return out;
}
