/**
 * The melodic line the analysis works on: one voice of the part (chords reduced to their top
 * note), with absolute positions so that notes of different measures and parts can be compared.
 */
import type { Measure, Note, PartModel, ScoreModel } from "@/lib/musicxml/model";
import { toNumber as frac } from "@/lib/musicxml/fraction";
import { lofOf, type Step } from "./spelling";

export interface MelodyNote {
  note: Note;
  midi: number;
  /** Line-of-fifths position of the spelling (see spelling.ts). */
  lof: number;
  /** 0 = C … 6 = B: the letter, for degree counting. */
  step: Step;
  measureIndex: number;
  /** Position from the start of the part, in whole notes. */
  pos: number;
  dur: number;
  end: number;
  /** Onset inside the measure, whole notes. */
  onset: number;
  /** 3 = downbeat, 2 = other strong beat, 1 = beat, 0 = off the beat. */
  metric: number;
  grace: boolean;
  /** True when the note is the top of a chord written in this voice (for a staff's lower line,
   * the bottom): its chord's other notes sound with it, so it is a chord tone. */
  chordTop: boolean;
}

export interface Timeline {
  /** Start of each measure from the start of the part, whole notes. */
  measureStart: number[];
  measureLength: number[];
}


/**
 * Measure lengths as sounded: the latest note or rest end in that measure across every part,
 * so a pickup bar takes its real length; an empty measure keeps its written length.
 */
export function buildTimeline(score: ScoreModel, part: PartModel): Timeline {
  const count = part.measures.length;
  const written = part.measures.map((m) => frac(m.length));
  const filled = new Array<number>(count).fill(0);
  for (const p of score.parts) {
    for (const n of p.notes) {
      if (n.measureIndex >= count || n.isGrace) continue;
      // A merged tie chain runs past its measure: it fills its own measure to the barline.
      const localEnd = Math.min(frac(n.onset) + frac(n.duration), written[n.measureIndex]);
      filled[n.measureIndex] = Math.max(filled[n.measureIndex], localEnd);
    }
  }
  const measureLength = filled.map((f, i) => (f > 0 ? f : written[i]));
  const measureStart = new Array<number>(count);
  let t = 0;
  for (let i = 0; i < count; i++) {
    measureStart[i] = t;
    t += measureLength[i];
  }
  return { measureStart, measureLength };
}

/** Metric weight of an onset inside a measure under its time signature. */
export function metricStrength(onset: number, measure: Measure): number {
  const eps = 1e-9;
  if (onset < eps) return 3;
  const beats = measure.time?.beats ?? 4;
  const beatType = measure.time?.beatType ?? 4;
  const compound = beats % 3 === 0 && beats > 3 && beatType >= 8;
  const beat = compound ? 3 / beatType : 1 / beatType;
  const beatCount = compound ? beats / 3 : beats;
  const b = onset / beat;
  const onBeat = Math.abs(b - Math.round(b)) < eps;
  if (!onBeat) return 0;
  const k = Math.round(b);
  if (beatCount % 2 === 0 && k === beatCount / 2) return 2;
  return 1;
}

/**
 * Picks the melody voice: on the part's highest staff, the voice with the most sounding time.
 * Cue notes are left out (another instrument plays them).
 */
export function melodyVoice(part: PartModel): { staff: number; voice: string } | null {
  // One pass over the notes: each staff's voices weighed, the highest staff's kept.
  const byStaff = new Map<number, Map<string, number>>();
  let topStaff = Infinity;
  for (const n of part.notes) {
    if (n.isRest || n.isCue || !n.pitch) continue;
    topStaff = Math.min(topStaff, n.staff);
    let staffWeight = byStaff.get(n.staff);
    if (!staffWeight) byStaff.set(n.staff, (staffWeight = new Map()));
    staffWeight.set(n.voice, (staffWeight.get(n.voice) ?? 0) + frac(n.duration) + 1e-6);
  }
  if (topStaff === Infinity) return null;
  const weight = byStaff.get(topStaff) as Map<string, number>;
  let best = "";
  let bestW = -1;
  for (const [voice, w] of [...weight].sort((a, b) => a[0].localeCompare(b[0], "en", { numeric: true }))) {
    if (w > bestW) {
      best = voice;
      bestW = w;
    }
  }
  return { staff: topStaff, voice: best };
}

/**
 * The melody of a part in time order: grace notes before their main note, chords → top note.
 * `line`, for a staff carrying two players, is the chosen player's line (lib/musicxml/lines.ts):
 * its notes are the melody whatever voice each is written in.
 */
export function extractMelody(part: PartModel, timeline: Timeline, line?: PartModel): MelodyNote[] {
  const mv = line ? null : melodyVoice(part);
  if (!line && !mv) return [];
  const out: MelodyNote[] = [];
  let last: MelodyNote | null = null;
  // A line holds one note of each written chord; the chord's other notes still sound with it.
  const slot = (n: Note) => `${n.measureIndex}|${n.staff}|${n.voice}|${n.onset.num}/${n.onset.den}|${n.isGrace ? n.graceIndex : 0}`;
  const chordSize = new Map<string, number>();
  if (line) for (const n of part.notes) if (!n.isRest && n.pitch) chordSize.set(slot(n), (chordSize.get(slot(n)) ?? 0) + 1);
  for (const n of line ? line.notes : part.notes) {
    if (n.isRest || n.isCue || !n.pitch) continue;
    if (mv && (n.staff !== mv.staff || n.voice !== mv.voice)) continue;
    // Chord members share the measure, onset and grace slot of the note they sound with.
    if (
      last &&
      last.measureIndex === n.measureIndex &&
      last.note.onset.num * n.onset.den === n.onset.num * last.note.onset.den &&
      last.grace === n.isGrace &&
      last.note.graceIndex === n.graceIndex
    ) {
      last.chordTop = true;
      if (n.pitch.midi > last.midi) {
        const top: MelodyNote = { ...last, note: n, midi: n.pitch.midi, lof: lofOf(n.pitch.step, n.pitch.alter), step: n.pitch.step };
        out[out.length - 1] = top;
        last = top;
      }
      continue;
    }
    const onset = n.onset.num / n.onset.den;
    const pos = timeline.measureStart[n.measureIndex] + onset;
    const dur = n.isGrace ? 0 : n.duration.num / n.duration.den;
    last = {
      note: n,
      midi: n.pitch.midi,
      lof: lofOf(n.pitch.step, n.pitch.alter),
      step: n.pitch.step,
      measureIndex: n.measureIndex,
      pos,
      dur,
      end: pos + dur,
      onset,
      metric: n.isGrace ? 0 : metricStrength(onset, part.measures[n.measureIndex]),
      grace: n.isGrace,
      chordTop: line !== undefined && (chordSize.get(slot(n)) ?? 0) > 1,
    };
    out.push(last);
  }
  const before = (a: MelodyNote, b: MelodyNote) => a.pos - b.pos || Number(b.grace) - Number(a.grace) || a.note.graceIndex - b.note.graceIndex;
  let sorted = true;
  for (let i = 1; i < out.length && sorted; i++) if (before(out[i - 1], out[i]) > 0) sorted = false;
  if (!sorted) out.sort(before);
  return out;
}

/**
 * Pitch classes sounding with the melody at a position: the other parts, and this part's own
 * notes outside the melody line (chord members under the top note, other voices and staves).
 * Bucketed by measure for speed.
 */
export class Accompaniment {
  private buckets = new Map<number, Array<{ pos: number; end: number; pc: number; lof: number }>>();

  constructor(score: ScoreModel, part: PartModel, timeline: Timeline, melody: readonly MelodyNote[] = []) {
    // This part's own notes count only when it has some outside the melody line.
    let own = 0;
    for (const n of part.notes) if (!n.isRest && !n.isCue && !n.isGrace && n.pitch) own++;
    const melodyMain = melody.reduce((c, m) => c + (m.grace ? 0 : 1), 0);
    const inMelody = own > melodyMain ? new Set(melody.map((m) => m.note)) : null;
    for (const p of score.parts) {
      if (p === part && !inMelody) continue;
      for (const n of p.notes) {
        if (n.isRest || n.isCue || n.isGrace || !n.pitch || (p === part && inMelody?.has(n))) continue;
        const start = timeline.measureStart[n.measureIndex];
        if (start === undefined) continue;
        const pos = start + frac(n.onset);
        const list = this.buckets.get(n.measureIndex) ?? [];
        list.push({ pos, end: pos + frac(n.duration), pc: ((n.pitch.midi % 12) + 12) % 12, lof: lofOf(n.pitch.step, n.pitch.alter) });
        this.buckets.set(n.measureIndex, list);
      }
    }
  }

  get empty(): boolean {
    return this.buckets.size === 0;
  }

  /** Pitch classes sounding at `pos` (notes started in this or the two previous measures). */
  soundingAt(measureIndex: number, pos: number): Set<number> {
    const out = new Set<number>();
    for (let i = measureIndex; i >= Math.max(0, measureIndex - 2); i--) {
      for (const e of this.buckets.get(i) ?? []) if (e.pos <= pos + 1e-9 && e.end > pos + 1e-9) out.add(e.pc);
    }
    return out;
  }

  /** The same notes as `soundingAt`, spelled (line of fifths): E♭ and D♯ apart. */
  spelledAt(measureIndex: number, pos: number): Set<number> {
    const out = new Set<number>();
    for (let i = measureIndex; i >= Math.max(0, measureIndex - 2); i--) {
      for (const e of this.buckets.get(i) ?? []) if (e.pos <= pos + 1e-9 && e.end > pos + 1e-9) out.add(e.lof);
    }
    return out;
  }
}
