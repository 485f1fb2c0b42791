/**
 * Phrase boundaries of a melody: written marks (rests, breath marks, caesuras, fermatas, double
 * and final barlines, a new key signature, the end of a slur where a new one starts) first, then
 * peaks of the LBDM boundary-strength profile to split phrases that run on too long. A minimum
 * length keeps slivers out (Lerdahl & Jackendoff's GPR 1: avoid groups of a single event).
 */
import type { Measure } from "@/lib/musicxml/model";
import { IndexSet } from "./index-set";
import { lbdmBy } from "./lbdm";
import type { MelodyNote } from "./melody";

export const PHRASE = {
  /** Fewest notes in a phrase, and least length as a share of the opening measure. */
  minNotes: 4,
  minMeasureShare: 0.75,
  /** A phrase longer than this many measures is split at its strongest LBDM peak. */
  maxMeasures: 4,
  /** An LBDM peak must reach this to split a long phrase. */
  lbdmThreshold: 0.3,
} as const;

/** Strength of written cues (0–1). */
const CUE = { breath: 1, caesura: 1, fermata: 0.9, barline: 0.9, keyChange: 0.7, slurJoin: 0.45, restBase: 0.6 } as const;

export type BoundaryCue = "start" | "rest" | "breath" | "caesura" | "fermata" | "barline" | "key" | "slur" | "contour";

export interface Phrase {
  start: number;
  end: number;
  peak: number;
  /** What opened it and how strongly (0–1). */
  cue: BoundaryCue;
  strength: number;
}

function beatLength(m: Measure): number {
  const beats = m.time?.beats ?? 4;
  const type = m.time?.beatType ?? 4;
  return beats % 3 === 0 && beats > 3 && type >= 8 ? 3 / type : 1 / type;
}

/** The written cue (if any) for a boundary before note k. */
function writtenCue(seq: readonly MelodyNote[], k: number, measures: readonly Measure[], keyStarts: ReadonlySet<number>): { cue: BoundaryCue; strength: number } | null {
  const a = seq[k - 1];
  const b = seq[k];
  const marks = a.note.marks;
  const gap = b.pos - a.end;
  // Most boundaries carry no written cue: leave before building anything.
  if (gap <= 1e-9 && !marks.breathMark && !marks.caesura && !marks.fermata && b.measureIndex === a.measureIndex && marks.slurStops.length === 0) return null;
  const cues: Array<{ cue: BoundaryCue; strength: number }> = [];
  if (gap > 1e-9) cues.push({ cue: "rest", strength: Math.min(1, CUE.restBase + (0.4 * gap) / beatLength(measures[a.measureIndex])) });
  if (marks.breathMark) cues.push({ cue: "breath", strength: CUE.breath });
  if (marks.caesura) cues.push({ cue: "caesura", strength: CUE.caesura });
  if (marks.fermata) cues.push({ cue: "fermata", strength: CUE.fermata });
  if (b.measureIndex > a.measureIndex) {
    for (let m = a.measureIndex; m < b.measureIndex; m++) {
      const r = measures[m].barlineRight;
      if (r === "double" || r === "final" || r === "repeat-end") cues.push({ cue: "barline", strength: CUE.barline });
    }
    const l = measures[b.measureIndex].barlineLeft;
    if (l === "repeat-start" || l === "double") cues.push({ cue: "barline", strength: CUE.barline });
    for (let m = a.measureIndex + 1; m <= b.measureIndex; m++) if (keyStarts.has(m)) cues.push({ cue: "key", strength: CUE.keyChange });
  }
  if (marks.slurStops.length > 0 && b.note.marks.slurStarts.length > 0) cues.push({ cue: "slur", strength: CUE.slurJoin });
  if (cues.length === 0) return null;
  return cues.sort((x, y) => y.strength - x.strength)[0];
}

/** Highest note; ties → longer, then metrically stronger, then earlier. */
export function peakOf(seq: readonly MelodyNote[], from: number, to: number): number {
  let best = from;
  for (let i = from + 1; i <= to; i++) {
    const n = seq[i];
    const b = seq[best];
    if (n.midi > b.midi || (n.midi === b.midi && (n.dur > b.dur + 1e-9 || (Math.abs(n.dur - b.dur) <= 1e-9 && n.metric > b.metric)))) best = i;
  }
  return best;
}

/**
 * Phrases over the main (non-grace) notes of a melody. `keyStarts` holds the measure indexes
 * where a new key signature takes force.
 */
export function findPhrases(seq: readonly MelodyNote[], measures: readonly Measure[], keyStarts: ReadonlySet<number> = new Set()): Phrase[] {
  const n = seq.length;
  if (n === 0) return [];
  // Quarter notes as the time unit, like the published LBDM examples.
  const b = lbdmBy(
    n,
    (i) => seq[i].midi,
    (i) => seq[i].pos * 4,
    (i) => seq[i].end * 4,
  );
  const firstBar = measures.length > 0 ? Math.max(...measures.slice(0, 2).map((m) => m.length.num / m.length.den)) : 1;
  const minLen = PHRASE.minMeasureShare * firstBar;
  const bounds = new IndexSet(n);
  const info = new Map<number, { cue: BoundaryCue; strength: number }>([[0, { cue: "start", strength: 1 }]]);
  bounds.add(0);
  const long = (from: number, to: number) => to - from >= PHRASE.minNotes && seq[to - 1].end - seq[from].pos >= minLen - 1e-9;
  const fits = (k: number) => long(bounds.prev(k), k) && long(k, bounds.next(k, n));
  const accept = (k: number, cue: BoundaryCue, strength: number) => {
    bounds.add(k);
    info.set(k, { cue, strength });
  };

  const written: Array<{ k: number; cue: BoundaryCue; strength: number }> = [];
  for (let k = 1; k < n; k++) {
    const c = writtenCue(seq, k, measures, keyStarts);
    if (c) written.push({ k, ...c });
  }
  // A slur that ends where the next begins closes a group when the melody also marks it (a
  // longer note, a leap): its strength grows with the LBDM profile there.
  for (const c of written) if (c.cue === "slur") c.strength = Math.min(0.95, c.strength + 0.5 * b[c.k]);
  written.sort((x, y) => y.strength - x.strength || b[y.k] - b[x.k] || x.k - y.k);
  for (const c of written) if (fits(c.k)) accept(c.k, c.cue, c.strength);

  // Split phrases that run on, at the strongest LBDM peak (a slur join adds to the profile).
  const slurJoin = new Set(written.filter((c) => c.cue === "slur").map((c) => c.k));
  const score = (k: number) => b[k] + (slurJoin.has(k) ? CUE.slurJoin * 0.5 : 0);
  const queue: number[] = [];
  for (let k = 0; k < n; k = bounds.next(k, n)) queue.push(k);
  while (queue.length > 0) {
    const from = queue.pop() as number;
    const to = bounds.next(from, n);
    const m = measures[seq[from].measureIndex];
    const barLen = m.length.num / m.length.den || 1;
    if (seq[to - 1].end - seq[from].pos <= PHRASE.maxMeasures * barLen + 1e-9) continue;
    let bestK = -1;
    for (let k = from + 1; k < to; k++) {
      const isPeak = b[k] >= b[k - 1] && (k + 1 >= n || b[k] >= b[k + 1]);
      if (!isPeak || score(k) < PHRASE.lbdmThreshold || !fits(k)) continue;
      if (bestK < 0 || score(k) > score(bestK) + 1e-9) bestK = k;
    }
    if (bestK < 0) continue;
    accept(bestK, slurJoin.has(bestK) ? "slur" : "contour", Math.min(1, score(bestK)));
    queue.push(from, bestK);
  }

  const out: Phrase[] = [];
  for (let start = 0; start < n; ) {
    const next = bounds.next(start, n);
    const c = info.get(start) as { cue: BoundaryCue; strength: number };
    out.push({ start, end: next - 1, peak: peakOf(seq, start, next - 1), cue: c.cue, strength: c.strength });
    start = next;
  }
  return out;
}
