/**
 * Which notes an audition plays and when (pure): the selected notes, or the phrase around one
 * note, timed from their bar and onset at the part's tempo.
 */
import type { AnalyzedNote, PhraseResult } from "@/lib/analysis/types";
import { valueOfText } from "@/lib/musicxml/fraction";
import { parseNoteKey } from "@/lib/musicxml/note-key";
import type { MarkingValues } from "./schema";

/** Beats per minute when the part writes no tempo: the same default as the reader and the MIDI export. */
export const FALLBACK_TEMPO = 120;

export interface PlannedAuditionNote {
  key: string;
  midi: number;
  startSeconds: number;
  durationSeconds: number;
  marking?: MarkingValues;
}

const frac = (s: string) => valueOfText(s) || 0;

/** The analysis phrase holding `key`, as the keys from its start to its end; null when none does. */
export function phraseAround(key: string, notes: readonly Pick<AnalyzedNote, "key">[], phrases: readonly PhraseResult[]): string[] | null {
  const index = new Map(notes.map((n, i) => [n.key, i]));
  const at = index.get(key);
  if (at === undefined) return null;
  for (const p of phrases) {
    const from = index.get(p.start);
    const to = index.get(p.end);
    if (from !== undefined && to !== undefined && from <= at && at <= to) return notes.slice(from, to + 1).map((n) => n.key);
  }
  return null;
}

/**
 * The chosen notes in score order with start times in seconds from the first. A bar lasts as long
 * as the part's usual bar (the most common end of the last note in a bar), or longer when its own
 * notes run on, so rests inside a phrase keep their time.
 */
export function planAuditionNotes(
  keys: readonly string[],
  notes: readonly AnalyzedNote[],
  markings: Readonly<Record<string, MarkingValues | undefined>>,
  tempo: number | null,
): PlannedAuditionNote[] {
  const bpm = tempo && tempo > 0 ? tempo : FALLBACK_TEMPO;
  const wholeSeconds = (4 * 60) / bpm;
  const barOf = (n: AnalyzedNote) => parseNoteKey(n.key)?.measureIndex ?? 0;

  const barEnds = new Map<number, number>();
  for (const n of notes) barEnds.set(barOf(n), Math.max(barEnds.get(barOf(n)) ?? 0, frac(n.onset) + frac(n.duration)));
  const counts = new Map<number, number>();
  for (const end of barEnds.values()) counts.set(end, (counts.get(end) ?? 0) + 1);
  const usual = [...counts].sort((a, b) => b[1] - a[1] || b[0] - a[0])[0]?.[0] ?? 1;
  const lastBar = Math.max(0, ...barEnds.keys());
  const barStart: number[] = [0];
  for (let m = 0; m <= lastBar; m++) barStart[m + 1] = barStart[m] + Math.max(usual, barEnds.get(m) ?? 0);

  const wanted = new Set(keys);
  const chosen = notes.filter((n) => wanted.has(n.key));
  if (chosen.length === 0) return [];
  const at = (n: AnalyzedNote) => (barStart[barOf(n)] + frac(n.onset)) * wholeSeconds;
  const origin = Math.min(...chosen.map(at));
  return chosen.map((n) => ({
    key: n.key,
    midi: n.midi,
    startSeconds: at(n) - origin,
    durationSeconds: frac(n.duration) * wholeSeconds,
    marking: markings[n.key],
  }));
}
