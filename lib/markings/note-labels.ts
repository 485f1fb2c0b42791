/** People-facing names for notes: "Bar 12 · A5", "Pickup · D5". */
import type { AnalyzedNote } from "@/lib/analysis/types";
import { barName, barSpanName, type WrittenBar } from "@/lib/musicxml/bar-names";
import { parseNoteKey } from "@/lib/musicxml/note-key";

const NAMES = ["C", "C♯", "D", "E♭", "E", "F", "F♯", "G", "A♭", "A", "B♭", "B"];

export function midiName(midi: number): string {
  return `${NAMES[((midi % 12) + 12) % 12]}${Math.floor(midi / 12) - 1}`;
}

/** The pitch as a player reads it: the analysis' spelling ("A♯4") when known, else from MIDI. */
export function notePitchName(key: string, note?: Pick<AnalyzedNote, "pitch">): string | null {
  if (note) return note.pitch.replace("#", "♯").replace(/b(?=-?\d)/, "♭");
  const parsed = parseNoteKey(key);
  if (!parsed) return null;
  return `${midiName(parsed.midi)}${parsed.graceIndex ? " (grace)" : ""}`;
}

/**
 * "Bar 12 · A♯4": the bar as written on the part (`bars`, see lib/musicxml/bar-names.ts) and the
 * pitch, spelled by the analysis when it is known. A string that is no note key is returned as is.
 */
export function noteLabel(key: string, bars: readonly WrittenBar[], note?: Pick<AnalyzedNote, "pitch">): string {
  const parsed = parseNoteKey(key);
  const pitch = notePitchName(key, note);
  if (!parsed || !pitch) return key;
  return `${barName(bars, parsed.measureIndex, "heading")} · ${pitch}`;
}

/** "D5 in bar 3", "E♭5 in the pickup": a note named inside a sentence; null for no note key. */
export function noteInBar(key: string, bars: readonly WrittenBar[], note?: Pick<AnalyzedNote, "pitch">): string | null {
  const parsed = parseNoteKey(key);
  const pitch = notePitchName(key, note);
  if (!parsed || !pitch) return null;
  return `${pitch} in ${barName(bars, parsed.measureIndex)}`;
}

/** "3 notes, bars 4–6" for a selection (its keys in score order). */
export function selectionLabel(keys: readonly string[], labelOf: (key: string) => string, bars: readonly WrittenBar[]): string {
  if (keys.length === 0) return "No note selected";
  if (keys.length === 1) return labelOf(keys[0]);
  const indices = keys.map((k) => parseNoteKey(k)?.measureIndex).filter((i): i is number => i !== undefined);
  if (indices.length === 0) return `${keys.length} notes`;
  return `${keys.length} notes, ${barSpanName(bars, Math.min(...indices), Math.max(...indices))}`;
}
