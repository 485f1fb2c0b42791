/**
 * One ordering of note keys, shared by the server and the browser so that two lists of keys can be
 * compared note for note: part order (as in the score's part list), measure index, staff, voice,
 * onset, then grace notes before the note they lead into (g1, g2, … then the note itself), then
 * MIDI number (chord members from the bottom up). Keep this module dependency-free: browser code
 * imports it.
 */
import { parseNoteKey, type NoteKeyParts } from "./note-key";

function compareVoices(a: string, b: string): number {
  const na = Number(a);
  const nb = Number(b);
  if (Number.isInteger(na) && Number.isInteger(nb)) return na - nb;
  return a < b ? -1 : a > b ? 1 : 0;
}

/** Grace notes come before the note at their onset; the note itself (graceIndex 0) comes last. */
const graceRank = (graceIndex: number) => (graceIndex > 0 ? graceIndex : Number.POSITIVE_INFINITY);

export function compareKeyParts(a: NoteKeyParts, b: NoteKeyParts, partOrder: readonly string[]): number {
  const pa = partOrder.indexOf(a.partId);
  const pb = partOrder.indexOf(b.partId);
  if (pa !== pb) return pa - pb;
  if (a.measureIndex !== b.measureIndex) return a.measureIndex - b.measureIndex;
  if (a.staff !== b.staff) return a.staff - b.staff;
  const voice = compareVoices(a.voice, b.voice);
  if (voice !== 0) return voice;
  // Cross-multiplied: onsets are small fractions, far from the range where this loses precision.
  const onset = a.onset.num * b.onset.den - b.onset.num * a.onset.den;
  if (onset !== 0) return onset;
  const ga = graceRank(a.graceIndex);
  const gb = graceRank(b.graceIndex);
  if (ga !== gb) return ga < gb ? -1 : 1;
  return a.midi - b.midi;
}

/**
 * Sorts note keys into the shared order. `partOrder` lists the part ids in score order; a key that
 * is not a note key is an error, not something to hide at the end of the list.
 */
export function sortNoteKeys(keys: readonly string[], partOrder: readonly string[]): string[] {
  const parsed = keys.map((key) => {
    const parts = parseNoteKey(key);
    if (!parts) throw new Error(`not a note key: ${JSON.stringify(key)}`);
    return { key, parts };
  });
  parsed.sort((a, b) => compareKeyParts(a.parts, b.parts, partOrder));
  return parsed.map((p) => p.key);
}

/** The part of the normalized model this module reads (a `ScoreModel` fits). */
interface KeyedScore {
  parts: ReadonlyArray<{ id: string; notes: ReadonlyArray<{ key: string; isRest: boolean }> }>;
}

/**
 * The keys of every sounding note of every part (rests left out, tie chains already merged by the
 * reader), in the shared order: the server's side of the comparison with the engraving.
 */
export function scoreNoteKeys(score: KeyedScore): string[] {
  const keys = score.parts.flatMap((part) => part.notes.filter((note) => !note.isRest).map((note) => note.key));
  return sortNoteKeys(
    keys,
    score.parts.map((part) => part.id),
  );
}
