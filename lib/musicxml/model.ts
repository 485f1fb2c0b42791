/**
 * The normalized model of a MusicXML score, shared by the reader (lib/musicxml), the analysis
 * (lib/analysis), the server routes and the browser. Times are exact fractions of a whole note.
 */

/** An exact, reduced fraction of a whole note (den > 0). "3/8" = a dotted quarter. */
export interface Fraction {
  num: number;
  den: number;
}

export type BarlineStyle = "regular" | "double" | "final" | "repeat-start" | "repeat-end" | "other";

export interface KeySignature {
  fifths: number;
  /** MusicXML `mode`; null when the file gives none (or "none"). */
  mode: string | null;
}

export interface Measure {
  /** 0-based position in the part (written order; repeats are not unfolded). */
  index: number;
  /** The MusicXML `number` attribute, as written ("1", "12a", "X1"…). */
  number: string;
  /** `implicit="yes"`: the bar's number is not printed (a pickup, or a bar split by a repeat). */
  implicit?: boolean;
  /** Divisions per quarter note in force at the start of the measure. */
  divisions: number;
  key: KeySignature;
  /** True when a `key` element appears in this measure (a change, or the first). */
  keyChanged: boolean;
  time: { beats: number; beatType: number } | null;
  timeChanged: boolean;
  /** Quarter notes per minute in force at the start of the measure. */
  tempo: number;
  /** Measure length as written by its time signature (whole notes). */
  length: Fraction;
  /** Style of the barline that ends the measure. */
  barlineRight: BarlineStyle;
  barlineLeft: BarlineStyle;
  /** Seconds from the start of the part to the start of this measure, at the written tempi. */
  startSeconds: number;
}

export interface Pitch {
  step: "A" | "B" | "C" | "D" | "E" | "F" | "G";
  /** Semitones; microtones rounded to the nearest semitone for MIDI. */
  alter: number;
  octave: number;
  /** MIDI number, C4 = 60. */
  midi: number;
  /** Spelled name like "F#4", "Bb3", "A4", "C##5", "Dbb4". */
  name: string;
}

export interface PhraseMarks {
  fermata: boolean;
  breathMark: boolean;
  caesura: boolean;
  /** Slur numbers started / stopped on this note. */
  slurStarts: number[];
  slurStops: number[];
  /** Dynamics in force from this note ("p", "mf"…), when one is written at or just before it. */
  dynamics: string | null;
}

export interface Note {
  /** The note key: see lib/musicxml/note-key.ts. Rests have key "" (they are never marked). */
  key: string;
  partId: string;
  measureIndex: number;
  measureNumber: string;
  staff: number;
  voice: string;
  onset: Fraction;
  /** Sounding duration; for a tie chain, the sum of its notes. Grace notes: 0/1. */
  duration: Fraction;
  /** Onset in seconds from the start of the part at the written tempo. */
  onsetSeconds: number;
  durationSeconds: number;
  /** null for a rest. */
  pitch: Pitch | null;
  isRest: boolean;
  isChord: boolean;
  isGrace: boolean;
  /** For grace notes: 1-based position among the grace notes before the same onset. */
  graceIndex: number;
  isCue: boolean;
  /** True when this note's tie chain continues across later notes (merged into this one). */
  tied: boolean;
  marks: PhraseMarks;
}

export interface PartModel {
  id: string;
  name: string;
  measures: Measure[];
  /** Every note and rest in time order (onset, then staff, voice, pitch), tie continuations merged. */
  notes: Note[];
}

/** Something read as written that a player should know about (never a refusal). */
export interface ReadNotice {
  /** `bar_longer` / `bar_shorter`: a bar's notes last more / less than its time signature. */
  code: "bar_longer" | "bar_shorter";
  measureIndex: number;
  /** The bar's number as written (its `number` attribute). */
  measureNumber: string;
  /** In player's words, e.g. "bar 7 lasts 10 beats in 4/4 — read as written". */
  message: string;
}

export interface ScoreModel {
  title: string;
  composer: string;
  parts: PartModel[];
  /** Notes about what was simplified (e.g. repeats kept in written order). */
  remarks: string[];
  /** Bars read as written although they disagree with their time signature, in score order. */
  notices: ReadNotice[];
}
