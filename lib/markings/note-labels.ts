/** People-facing names for notes: "Bar 12 · A5". */
import type { AnalyzedNote } from "@/lib/analysis/types";
import { parseNoteKey } from "@/lib/musicxml/note-key";

const NAMES = ["C", "C♯", "D", "E♭", "E", "F", "F♯", "G", "A♭", "A", "B♭", "B"];

export function midiName(midi: number): string {
  return `${NAMES[((midi % 12) + 12) % 12]}${Math.floor(midi / 12) - 1}`;
}

/** Prefers the analysis' spelled pitch and written bar number; falls back to the key. */
export function noteLabel(key: string, note?: Pick<AnalyzedNote, "measure" | "pitch">): string {
  if (note) return `Bar ${note.measure} · ${note.pitch.replace("#", "♯").replace(/b(?=-?\d)/, "♭")}`;
  const parsed = parseNoteKey(key);
  if (!parsed) return key;
  return `Bar ${parsed.measureIndex + 1} · ${midiName(parsed.midi)}${parsed.graceIndex ? " (grace)" : ""}`;
}

/** "3 notes, bars 4–6" for a selection. */
export function selectionLabel(keys: readonly string[], labelOf: (key: string) => string): string {
  if (keys.length === 0) return "No note selected";
  if (keys.length === 1) return labelOf(keys[0]);
  const bars = keys.map((k) => /^Bar (\S+)/.exec(labelOf(k))?.[1]).filter(Boolean) as string[];
  const first = bars[0];
  const last = bars[bars.length - 1];
  return `${keys.length} notes, ${first === last ? `bar ${first}` : `bars ${first}–${last}`}`;
}
