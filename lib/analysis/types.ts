/**
 * The analysis result: the JSON shape printed by `npm run analyze`, stored with each part and
 * served by GET /api/parts/[partId]/analysis (one entry of `parts`).
 */
export type Role = "phrase-start" | "peak" | "tension" | "resolution";
export type Mode = "major" | "minor";
export type TensionKind =
  | "leading-tone"
  | "fourth-to-third"
  | "lowered-sixth"
  | "fourth-to-minor-third"
  | "raised"
  | "applied-leading-tone"
  | "lowered"
  | "appoggiatura";

export interface KeyResult {
  tonic: string; // spelled with # and b: "F#", "Bb"
  mode: Mode;
  fifths: number;
  source: "signature" | "inferred";
}

export interface LocalKey {
  tonic: string;
  mode: Mode;
  fromMeasure: string; // MusicXML measure number
  toMeasure: string;
  /** Where a modulation found inside a key section has a pivot: the bars just before the new
   * key's first foreign note whose notes belong to both keys. Absent when there is none. */
  pivotFromMeasure?: string;
  pivotToMeasure?: string;
}

export interface AnalyzedNote {
  key: string;
  measure: string;
  pitch: string;
  midi: number;
  onset: string; // "1/4"
  duration: string;
  degree: number | null; // 1–7 in the key in force
}

export interface PhraseResult {
  start: string;
  peak: string;
  end: string;
}

export interface Suggestion {
  note: string;
  measure: string;
  pitch: string;
  role: Role;
  confidence: number;
  resolvesTo: string | null;
  reason: string;
  /**
   * How strongly to mark it, 0–1: the confidence weighted by the note's weight in the bar (1 on a
   * strong beat or for a quarter note or longer, 0.85 on another beat, 0.7 off the beat), so a
   * sure leading tone on a downbeat outranks a sure one in passing. Always set by this version;
   * optional only for results stored by older ones.
   */
  strength?: number;
  /** 1 = the strongest suggestion of its phrase, 2 the next… (ties: earlier first). The list
   * itself stays in time order. Always set by this version. */
  rank?: number;
  /** For a tension tone, which rule found it: "leading-tone" (of the local key), "raised" (a
   * chromatic note leading up, e.g. the leading tone of an applied dominant),
   * "applied-leading-tone" (a note of the key rising a half step over the other parts' V or vii°
   * of the note it rises to), "fourth-to-third"… */
  kind?: TensionKind;
}

export interface PartAnalysis {
  id: string;
  name: string;
  measureCount: number;
  noteCount: number;
  key: KeyResult;
  localKeys: LocalKey[];
  notes: AnalyzedNote[];
  phrases: PhraseResult[];
  suggestions: Suggestion[];
  /**
   * Present when the staff carries two players (lib/musicxml/lines.ts): how they are written and
   * whose line the notes, phrases and suggestions above follow.
   */
  lines?: { writtenAs: "chords" | "voices"; line: "upper" | "lower" };
}

export interface ScoreAnalysis {
  file: string;
  parts: PartAnalysis[];
}
