/**
 * A small reader of RomanText, the plain-text format of Roman-numeral analyses (Tymoczko, Gotham,
 * Cuthbert & Ariza 2019, "The RomanText format", as used by the When-in-Rome corpus), for checking
 * the analysis against experts' keys and chords. It reads what the check needs — the key in force
 * at every bar and beat (`m12 b3 G: V7`), key changes mid-line, applied chords (`V/V`,
 * `viio7/ii`, `V7/V/V`) and repeated bars (`m9-12 = m5-8`) — and skips the rest (metadata,
 * variants `m4var1`, repeat signs, notes). Pure: text in, data out.
 */
import type { Key } from "./key";
import type { Mode } from "./types";
import { lofOf, type Step } from "./spelling";

export interface RomanChord {
  measure: number;
  /** 1 = downbeat, in the beats of the time signature (a dotted quarter in 6/8). */
  beat: number;
  /** The key in force (written before the chord on this line or an earlier one). */
  key: Key;
  /** The figure as written: "V7", "viio65/v", "Cad64". */
  figure: string;
  /** Line-of-fifths position of the chord's leading tone: the third of a V, the root of a
   * vii°, of the key or of the chord it is applied to; null for other chords. */
  leadingToneLof: number | null;
  /** The key the chord points to: the key itself, or the tonicized degree of an applied chord. */
  target: Key;
}

export interface TimeSignature {
  fromMeasure: number;
  beats: number;
  beatType: number;
}

export interface RomanText {
  meta: Record<string, string>;
  chords: RomanChord[];
  timeSignatures: TimeSignature[];
}

const KEY_TOKEN = /^([A-Ga-g])(#+|b+|-+)?:$/;
const BEAT_TOKEN = /^b(\d+(?:\.\d+)?)$/;
const MEASURE_TOKEN = /^m(\d+)$/;
const REPEAT_LINE = /^m(\d+)(?:-(\d+))?\s*=\s*m(\d+)(?:-(\d+))?\s*$/;

/** "G:" → G major, "f#:" → F♯ minor, "bb:" / "b-:" → B♭ minor, "Eb:" → E♭ major. */
export function parseKeyToken(token: string): Key | null {
  const m = KEY_TOKEN.exec(token);
  if (!m) return null;
  const letter = m[1];
  const acc = m[2] ?? "";
  const alter = acc.startsWith("#") ? acc.length : -acc.length;
  const mode: Mode = letter === letter.toUpperCase() ? "major" : "minor";
  return { tonicLof: lofOf(letter.toUpperCase() as Step, alter), mode };
}

const NUMERALS = ["VII", "III", "VI", "IV", "II", "V", "I"] as const;
const DEGREE: Record<string, number> = { I: 1, II: 2, III: 3, IV: 4, V: 5, VI: 6, VII: 7 };
/** Line-of-fifths offsets of degrees 1–7 from the tonic: major scale, natural minor scale. */
const MAJOR_OFFSETS = [0, 2, 4, -1, 1, 3, 5];
const MINOR_OFFSETS = [0, 2, -3, -1, 1, -4, -2];

export interface Numeral {
  accidental: number; // −1 flat, +1 sharp per sign
  degree: number; // 1–7
  upper: boolean;
  /** What follows the numeral: "o7", "ø65", "+", "7[no5]". */
  rest: string;
}

/** The Roman numeral at the start of a figure ("bVI6", "viio7", "V+"), or null ("Cad64", "It6", "N6"). */
export function parseNumeral(text: string): Numeral | null {
  const m = /^([b#-]*)(.*)$/.exec(text) as RegExpExecArray;
  const accidental = [...m[1]].reduce((a, c) => a + (c === "#" ? 1 : -1), 0);
  const body = m[2];
  for (const n of NUMERALS) {
    for (const form of [n, n.toLowerCase()]) {
      if (!body.startsWith(form)) continue;
      const rest = body.slice(form.length);
      // "It6", "Ger65": a letter after the numeral means another word, not a numeral.
      if (/^[A-Za-z]/.test(rest) && !/^(o|ø|h)/.test(rest)) return null;
      return { accidental, degree: DEGREE[n], upper: form === n, rest };
    }
  }
  return null;
}

/**
 * The line-of-fifths root of a numeral in a key. In minor, an unmarked VI/VII and plain vi/vii
 * take the natural-minor degree and a diminished vii°/viiø (or vi°) the raised one; a flat on 6
 * or 7 in minor only confirms the natural-minor degree and a sharp raises it (the "quality" and
 * "cautionary" readings of RomanText in minor).
 */
export function rootOf(n: Numeral, key: Key): number {
  const i = n.degree - 1;
  if (key.mode === "major") return key.tonicLof + MAJOR_OFFSETS[i] + 7 * n.accidental;
  if (n.degree === 6 || n.degree === 7) {
    const natural = key.tonicLof + MINOR_OFFSETS[i];
    if (n.accidental < 0) return natural;
    if (n.accidental > 0) return natural + 7;
    const diminished = !n.upper && /^(o|ø|h)/.test(n.rest);
    return diminished ? natural + 7 : natural;
  }
  return key.tonicLof + MINOR_OFFSETS[i] + 7 * n.accidental;
}

/** The key an applied chord points to, and its leading tone (V: its third; vii: its root). */
export function interpretFigure(figure: string, key: Key): { target: Key; leadingToneLof: number | null } {
  const parts = figure.split("/");
  let target = key;
  // V7/V/V: apply right to left — the last numeral is read in the key, each earlier one in the
  // key the later one tonicizes.
  for (let j = parts.length - 1; j >= 1; j--) {
    const n = parseNumeral(parts[j]);
    if (!n) return { target: key, leadingToneLof: null };
    target = { tonicLof: rootOf(n, target), mode: n.upper ? "major" : "minor" };
  }
  const chord = parseNumeral(parts[0]);
  if (!chord || chord.accidental !== 0) return { target, leadingToneLof: null };
  const isDominant = chord.degree === 5 && chord.upper;
  const isLeadingToneChord = chord.degree === 7 && !chord.upper;
  return { target, leadingToneLof: isDominant || isLeadingToneChord ? target.tonicLof + 5 : null };
}

/** Reads RomanText. Unknown lines and tokens are skipped; a chord before any key is dropped. */
export function parseRomanText(text: string): RomanText {
  const meta: Record<string, string> = {};
  const chords: RomanChord[] = [];
  const timeSignatures: TimeSignature[] = [];
  let key: Key | null = null;
  let pendingTime: { beats: number; beatType: number } | null = null;
  let lastMeasure = -1;
  for (const raw of text.split(/\r?\n/)) {
    const line = raw.replace(/\s+/g, " ").trim();
    if (!line) continue;
    const repeat = REPEAT_LINE.exec(line);
    if (repeat) {
      const [to0, to1, from0, from1] = [repeat[1], repeat[2] ?? repeat[1], repeat[3], repeat[4] ?? repeat[3]].map(Number);
      const shift = to0 - from0;
      const copied = chords
        .filter((c) => c.measure >= from0 && c.measure <= from1 && c.measure + shift <= to1)
        .map((c) => ({ ...c, measure: c.measure + shift }));
      chords.push(...copied);
      if (copied.length > 0) key = copied[copied.length - 1].key;
      lastMeasure = to1;
      continue;
    }
    const header = /^([A-Za-z][A-Za-z ]*?):\s*(.*)$/.exec(line);
    if (header && !/^m\d/.test(line)) {
      const name = header[1].toLowerCase();
      meta[name] = header[2];
      const ts = name === "time signature" ? /^(\d+)\/(\d+)/.exec(header[2]) : null;
      if (ts) pendingTime = { beats: Number(ts[1]), beatType: Number(ts[2]) };
      continue;
    }
    const tokens = line.split(" ");
    const m = MEASURE_TOKEN.exec(tokens[0]);
    if (!m) continue; // variants (m4var1), notes, anything else
    const measure = Number(m[1]);
    if (pendingTime) {
      timeSignatures.push({ fromMeasure: measure, ...pendingTime });
      pendingTime = null;
    }
    lastMeasure = Math.max(lastMeasure, measure);
    let beat = 1;
    for (const t of tokens.slice(1)) {
      const b = BEAT_TOKEN.exec(t);
      if (b) {
        beat = Number(b[1]);
        continue;
      }
      const k = parseKeyToken(t);
      if (k) {
        key = k;
        continue;
      }
      if (/^[|:]+$/.test(t) || !key) continue;
      const { target, leadingToneLof } = interpretFigure(t, key);
      chords.push({ measure, beat, key, figure: t, leadingToneLof, target });
    }
  }
  chords.sort((a, b) => a.measure - b.measure || a.beat - b.beat);
  void lastMeasure;
  return { meta, chords, timeSignatures };
}

/** Beats in a bar under a time signature: compound metres count dotted beats (6/8 → 2). */
export function beatsPerBar(ts: { beats: number; beatType: number }): number {
  return ts.beats % 3 === 0 && ts.beats > 3 && ts.beatType >= 8 ? ts.beats / 3 : ts.beats;
}

/** The time signature in force in a measure (4/4 when the text gives none). */
export function timeSignatureAt(rt: RomanText, measure: number): { beats: number; beatType: number } {
  let ts = { beats: 4, beatType: 4 };
  for (const t of rt.timeSignatures) if (t.fromMeasure <= measure) ts = t;
  return ts;
}

/** The chord in force at a measure and beat (the last one at or before it), or null before the first. */
export function chordAt(rt: RomanText, measure: number, beat: number): RomanChord | null {
  let lo = 0;
  let hi = rt.chords.length - 1;
  let found: RomanChord | null = null;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    const c = rt.chords[mid];
    if (c.measure < measure || (c.measure === measure && c.beat <= beat + 1e-9)) {
      found = c;
      lo = mid + 1;
    } else hi = mid - 1;
  }
  return found;
}

/**
 * The key of a bar: the key in force for the longest time in it (ties go to the key at the
 * downbeat); before the first chord, the first key.
 */
export function keyOfBar(rt: RomanText, measure: number): Key | null {
  if (rt.chords.length === 0) return null;
  const beats = beatsPerBar(timeSignatureAt(rt, measure));
  const atStart = chordAt(rt, measure, 1)?.key ?? rt.chords[0].key;
  const spans = new Map<string, { key: Key; length: number }>();
  const add = (k: Key, len: number) => {
    const id = `${k.tonicLof}:${k.mode}`;
    const s = spans.get(id) ?? { key: k, length: 0 };
    s.length += len;
    spans.set(id, s);
  };
  let cur = atStart;
  let from = 1;
  for (const c of rt.chords) {
    if (c.measure !== measure || c.beat <= 1) continue;
    add(cur, Math.min(c.beat, beats + 1) - from);
    cur = c.key;
    from = Math.min(c.beat, beats + 1);
  }
  add(cur, beats + 1 - from);
  let best: { key: Key; length: number } | null = null;
  const startId = `${atStart.tonicLof}:${atStart.mode}`;
  for (const [id, s] of spans) {
    if (!best || s.length > best.length + 1e-9 || (Math.abs(s.length - best.length) < 1e-9 && id === startId)) best = s;
  }
  return best ? best.key : atStart;
}
