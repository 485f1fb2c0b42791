/**
 * Scale degrees by spelling: the degree is counted by letter from the tonic (so A♯ is a raised
 * sixth and B♭ a lowered seventh in C major), the inflection by the note's distance on the line
 * of fifths from the diatonic note of that degree.
 */
import type { Key } from "./key";
import { asciiName, displayName, mod, stepIndex, stepOfLof } from "./spelling";

/** Line-of-fifths offsets of degrees 1–7 from the tonic: major scale, natural minor scale. */
const MAJOR_OFFSETS = [0, 2, 4, -1, 1, 3, 5];
const MINOR_OFFSETS = [0, 2, -3, -1, 1, -4, -2];

/** Degree 1–7 of a spelled note in a key. */
export function degreeOf(noteLof: number, key: Key): number {
  return mod(stepIndex(stepOfLof(noteLof)) - stepIndex(stepOfLof(key.tonicLof)), 7) + 1;
}

/** Line-of-fifths position of the diatonic note of a degree (natural minor for minor keys). */
export function diatonicLof(degree: number, key: Key): number {
  return key.tonicLof + (key.mode === "major" ? MAJOR_OFFSETS : MINOR_OFFSETS)[degree - 1];
}

/** 0 diatonic, +1 raised a chromatic semitone, −1 lowered (against natural minor in minor). */
export function inflectionOf(noteLof: number, key: Key): number {
  return (noteLof - diatonicLof(degreeOf(noteLof, key), key)) / 7;
}

/** The scale as ASCII names: major, or natural minor. */
export function scaleOf(key: Key): string[] {
  return [1, 2, 3, 4, 5, 6, 7].map((d) => asciiName(diatonicLof(d, key)));
}

/** The note a half step below the tonic — in minor the raised seventh. */
export function leadingToneLof(key: Key): number {
  return key.tonicLof + 5;
}

/** True when a spelled note belongs to the key: the scale, and in minor also raised 6 and 7
 * (melodic and harmonic minor; Hutchinson treats them as diatonic). */
export function inKey(noteLof: number, key: Key): boolean {
  const off = noteLof - key.tonicLof;
  const set = key.mode === "major" ? MAJOR_OFFSETS : MINOR_IN_KEY;
  return set.includes(off);
}

const MINOR_IN_KEY = [...MINOR_OFFSETS, 3, 5];

const NAMES = ["tonic", "supertonic", "mediant", "subdominant", "dominant", "submediant", "seventh"];
const ORDINALS = ["first", "second", "third", "fourth", "fifth", "sixth", "seventh"];

const describeCache = new Map<number, string>();

/** "the leading tone", "the subdominant (fourth degree)", "a raised fourth degree". */
export function describeDegree(noteLof: number, key: Key): string {
  // Line-of-fifths positions stay far inside ±1000: one number identifies note, tonic and mode.
  const id = ((noteLof + 1000) * 2000 + (key.tonicLof + 1000)) * 2 + (key.mode === "major" ? 0 : 1);
  let text = describeCache.get(id);
  if (text === undefined) {
    text = describe(noteLof, key);
    describeCache.set(id, text);
  }
  return text;
}

function describe(noteLof: number, key: Key): string {
  const d = degreeOf(noteLof, key);
  const inf = inflectionOf(noteLof, key);
  if (noteLof === leadingToneLof(key)) return key.mode === "minor" ? "the raised seventh, the leading tone," : "the leading tone";
  if (inf === 0) {
    if (d === 7) return key.mode === "minor" ? "the subtonic (seventh degree)" : "the leading tone";
    if (d === 1) return "the tonic";
    return `the ${NAMES[d - 1]} (${ORDINALS[d - 1]} degree)`;
  }
  if (key.mode === "minor" && d === 6 && inf === 1) return "the raised sixth degree";
  const how = inf > 0 ? (inf === 1 ? "raised" : "doubly raised") : inf === -1 ? "lowered" : "doubly lowered";
  return `a ${how} ${ORDINALS[d - 1]} degree`;
}

const keyNameCache = new Map<number, string>();

/** "B♭ major", "F♯ minor". */
export function displayKey(key: Key): string {
  // Asked for every candidate tension tone of a long part: one string per key.
  const id = key.tonicLof * 2 + (key.mode === "major" ? 0 : 1);
  let text = keyNameCache.get(id);
  if (text === undefined) {
    text = `${displayName(key.tonicLof)} ${key.mode}`;
    keyNameCache.set(id, text);
  }
  return text;
}
