import { fail } from "../errors";
import { add, frac, parseDecimal, ZERO } from "../fraction";
import type { Fraction, KeySignature, Measure, Note } from "../model";
import { keyTrailingGraces, TieChains } from "./notes";
import { VoiceClock } from "./voices";

/**
 * Step 2 of the reader: measures and attributes. A part's measures in written order, each with
 * the divisions, key and time signature in force (MusicXML 4.0, `attributes`), and its content
 * content length when it closes. A bar longer or shorter than its time signature (a cadenza, an
 * unmeasured bar, a wrong signature) is read as written; the model step names it (bar-lengths.ts).
 */

/** Largest `divisions` accepted: far above real files (which stay under ~100 000), far below overflow. */
const MAX_DIVISIONS = 1_000_000;
export const DEFAULT_TEMPO = 120;

export interface PartState {
  id: string;
  measures: Measure[];
  notes: Note[];
  /** Content length actually reached, per measure index (max position over all voices). */
  reached: Fraction[];
  key: KeySignature;
  time: { beats: number; beatType: number } | null;
  timeLength: Fraction | null;
  measure: Measure | null;
  /** Indices of measures marked `implicit="yes"` (a pickup, or a bar split by a repeat). */
  implicit: Set<number>;
  clock: VoiceClock;
  ties: TieChains;
  pendingDynamics: string | null;
  lastVoice: string;
  /** Source slices of this part's measures, for the normalized text. */
  out: string[];
}

export function newPartState(id: string): PartState {
  return {
    id,
    measures: [],
    notes: [],
    reached: [],
    key: { fifths: 0, mode: null },
    time: null,
    timeLength: null,
    measure: null,
    implicit: new Set(),
    clock: new VoiceClock(),
    ties: new TieChains(),
    pendingDynamics: null,
    lastVoice: "1",
    out: [],
  };
}

export function startMeasure(p: PartState, attrs: Record<string, string>): void {
  const d = p.clock.divisions;
  const m: Measure = {
    index: p.measures.length,
    number: attrs.number ?? String(p.measures.length + 1),
    divisions: d.num / d.den,
    key: p.key,
    keyChanged: false,
    time: p.time,
    timeChanged: false,
    tempo: DEFAULT_TEMPO,
    length: p.timeLength ?? ZERO,
    barlineRight: "regular",
    barlineLeft: "regular",
    startSeconds: 0,
  };
  p.measures.push(m);
  p.measure = m;
  if (attrs.implicit === "yes") {
    p.implicit.add(m.index);
    m.implicit = true;
  }
  p.clock.startMeasure();
}

export function endMeasure(p: PartState): void {
  const m = p.measure;
  if (!m) return;
  const reached = p.clock.maxPos;
  keyTrailingGraces(p.id, m, p.clock);
  if (!p.timeLength) m.length = reached;
  p.reached[m.index] = reached;
  p.measure = null;
}

/**
 * The `attributes` children of one measure: divisions, key (the first key of a part; `number`
 * picks a staff's own key) and time (summed for additive signatures, absent for senza misura).
 */
export class AttributesReader {
  private keyApplies = true;
  private keyFifths: number | null = null;
  private keyMode: string | null = null;
  private timeBeats = 0;
  private timeBeatType = 0;
  private timeLen: Fraction = ZERO;
  private timeSenza = false;
  private chromatic = 0;
  private octaveChange = 0;

  constructor(private readonly remarks: Set<string>) {}

  open(name: string, attrs: Record<string, string>): void {
    if (name === "key") {
      this.keyApplies = !attrs.number || attrs.number === "1";
      this.keyFifths = null;
      this.keyMode = null;
    } else if (name === "transpose") {
      this.chromatic = 0;
      this.octaveChange = 0;
    } else if (name === "time" && (!attrs.number || attrs.number === "1")) {
      this.timeBeats = 0;
      this.timeBeatType = 0;
      this.timeLen = ZERO;
      this.timeSenza = false;
    }
  }

  close(p: PartState | null, name: string, text: string, parent: string): void {
    switch (name) {
      case "divisions": {
        if (!p || parent !== "attributes") return;
        const d = parseDecimal(text);
        if (!d || d.num <= 0 || d.num / d.den > MAX_DIVISIONS) throw fail.divisions(p.measure?.number ?? "?", text.trim());
        p.clock.divisions = d;
        if (p.measure && p.clock.pos.num === 0) p.measure.divisions = d.num / d.den;
        return;
      }
      case "fifths":
        if (parent === "key") this.keyFifths = parseInt(text, 10);
        return;
      case "mode":
        if (parent === "key") this.keyMode = text.trim() || null;
        return;
      case "key":
        if (p?.measure && this.keyApplies && this.keyFifths !== null && Number.isFinite(this.keyFifths)) {
          p.key = { fifths: this.keyFifths, mode: this.keyMode === "none" ? null : this.keyMode };
          p.measure.key = p.key;
          p.measure.keyChanged = true;
        }
        return;
      case "beats":
        // Composite beats like "3+2" add up.
        if (parent === "time") this.timeBeats = text.split("+").reduce((s, x) => s + (parseInt(x, 10) || 0), 0);
        return;
      case "beat-type":
        if (parent === "time") {
          this.timeBeatType = parseInt(text, 10) || 0;
          if (this.timeBeats > 0 && this.timeBeatType > 0) this.timeLen = add(this.timeLen, frac(this.timeBeats, this.timeBeatType));
        }
        return;
      case "senza-misura":
        this.timeSenza = true;
        return;
      case "time":
        if (p?.measure && parent === "attributes") {
          if (this.timeSenza || this.timeLen.num === 0) {
            p.time = null;
            p.timeLength = null;
          } else {
            // Additive signatures (2/4 + 3/8) keep the last pair's beat type with the summed length.
            p.time = { beats: (this.timeLen.num * this.timeBeatType) / this.timeLen.den, beatType: this.timeBeatType };
            p.timeLength = this.timeLen;
          }
          p.measure.time = p.time;
          p.measure.timeChanged = true;
          p.measure.length = p.timeLength ?? ZERO;
        }
        return;
      case "chromatic":
        if (parent === "transpose") this.chromatic = Number(text) || 0;
        return;
      case "octave-change":
        if (parent === "transpose") this.octaveChange = parseInt(text, 10) || 0;
        return;
      case "transpose": {
        // Sounding = written + chromatic + 12 × octave-change (MusicXML 4.0, transpose).
        const c = this.chromatic + 12 * this.octaveChange;
        if (p && c) this.remarks.add(`Part ${p.id} is written for a transposing instrument (it sounds ${interval(c)} ${c < 0 ? "lower" : "higher"} than written); pitches and keys are reported as written.`);
        return;
      }
    }
  }
}

function interval(semitones: number): string {
  const n = Math.abs(semitones);
  if (n % 12 === 0) return n === 12 ? "an octave" : `${n / 12} octaves`;
  return `${n} semitone${n === 1 ? "" : "s"}`;
}
