import { add, mul } from "../fraction";
import type { BarlineStyle, Fraction } from "../model";
import type { TempoEvent } from "../timeline";
import type { PartState } from "./measures";

/**
 * Part of step 2 (measures and attributes): what a measure says beside its notes. Tempo from
 * `sound` and `metronome` (sound wins), dynamics waiting for their note, barline styles and
 * repeats, which are kept in written order with a remark.
 */

/** Whole-note length of a metronome beat unit (MusicXML note-type-value). */
const BEAT_UNIT: Record<string, Fraction> = {
  maxima: { num: 8, den: 1 },
  long: { num: 4, den: 1 },
  breve: { num: 2, den: 1 },
  whole: { num: 1, den: 1 },
  half: { num: 1, den: 2 },
  quarter: { num: 1, den: 4 },
  eighth: { num: 1, den: 8 },
  "16th": { num: 1, den: 16 },
  "32nd": { num: 1, den: 32 },
  "64th": { num: 1, den: 64 },
  "128th": { num: 1, den: 128 },
  "256th": { num: 1, den: 256 },
  "512th": { num: 1, den: 512 },
  "1024th": { num: 1, den: 1024 },
};

export const REPEATS_REMARK = "Repeats are kept in written order; they are not unfolded.";

export function barStyle(style: string): BarlineStyle {
  switch (style) {
    case "regular":
    case "":
      return "regular";
    case "light-light":
      return "double";
    case "light-heavy":
      return "final";
    default:
      return "other";
  }
}

/** Quarter notes per minute of a metronome mark: beats per minute × quarters per beat. */
export function metronomeTempo(unit: Fraction | null, dots: number, perMinute: number | null): number | null {
  if (!unit || perMinute === null) return null;
  let length = unit;
  let dot = unit;
  for (let i = 0; i < dots; i++) {
    dot = mul(dot, { num: 1, den: 2 });
    length = add(length, dot);
  }
  return perMinute * ((length.num * 4) / length.den);
}

export class DirectionsReader {
  readonly tempoEvents: TempoEvent[] = [];
  private soundTempo: number | null = null;
  private metronome: number | null = null;
  private dynamics: string | null = null;
  private metUnit: Fraction | null = null;
  private metDots = 0;
  private metPerMinute: number | null = null;
  private barLocation = "right";
  private barStyleText = "";
  private barRepeat = "";
  private barFermata = false;

  constructor(private readonly remarks: Set<string>) {}

  pushTempo(p: PartState, tempo: number): void {
    if (!(tempo > 0) || !Number.isFinite(tempo)) return;
    this.tempoEvents.push({ measureIndex: p.measure?.index ?? 0, offset: p.clock.pos, tempo, order: this.tempoEvents.length });
  }

  open(p: PartState | null, name: string, attrs: Record<string, string>, parent: string): void {
    switch (name) {
      case "direction":
        this.soundTempo = null;
        this.metronome = null;
        this.dynamics = null;
        return;
      case "metronome":
        this.metUnit = null;
        this.metDots = 0;
        this.metPerMinute = null;
        return;
      case "sound":
        if (attrs.tempo !== undefined && p?.measure) {
          const t = Number(attrs.tempo);
          if (parent === "direction") this.soundTempo = t;
          else this.pushTempo(p, t);
        }
        return;
      case "barline":
        this.barLocation = attrs.location ?? "right";
        this.barStyleText = "";
        this.barRepeat = "";
        this.barFermata = false;
        return;
      case "fermata":
        if (parent === "barline") this.barFermata = true;
        return;
      case "repeat":
        if (parent === "barline") {
          this.barRepeat = attrs.direction ?? "";
          this.remarks.add(REPEATS_REMARK);
        }
        return;
      case "ending":
      case "segno":
      case "coda":
        this.remarks.add(REPEATS_REMARK);
        return;
    }
  }

  /** Dynamics written in a direction (the element's name, or `other-dynamics` text). */
  setDynamics(value: string): void {
    this.dynamics = value;
  }

  close(p: PartState | null, name: string, text: string, parent: string): void {
    switch (name) {
      case "beat-unit":
        if (parent === "metronome" && !this.metUnit) this.metUnit = BEAT_UNIT[text.trim()] ?? null;
        return;
      case "beat-unit-dot":
        if (parent === "metronome" && this.metPerMinute === null) this.metDots++;
        return;
      case "per-minute": {
        // "132-144" → the middle of the range (MusicXML 4.0, metronome example pairs it with tempo 69)
        const nums = text.match(/\d+(?:\.\d+)?/g);
        if (nums && nums.length) this.metPerMinute = nums.slice(0, 2).reduce((s, x) => s + Number(x), 0) / Math.min(nums.length, 2);
        return;
      }
      case "metronome":
        this.metronome = metronomeTempo(this.metUnit, this.metDots, this.metPerMinute);
        return;
      case "direction":
        if (p?.measure) {
          const t = this.soundTempo ?? this.metronome;
          if (t !== null) this.pushTempo(p, t);
          if (this.dynamics) p.pendingDynamics = this.dynamics;
        }
        return;
      case "bar-style":
        this.barStyleText = text.trim();
        return;
      case "barline":
        if (p?.measure) {
          let style = barStyle(this.barStyleText);
          if (this.barRepeat === "forward") style = "repeat-start";
          if (this.barRepeat === "backward") style = "repeat-end";
          if (this.barLocation === "left") p.measure.barlineLeft = style;
          else if (this.barLocation === "right") p.measure.barlineRight = style;
          if (this.barFermata && p.ties.lastSounding) p.ties.lastSounding.marks.fermata = true;
        }
        return;
    }
  }
}
