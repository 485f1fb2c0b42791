/** People-facing names for notes: "Bar 12 · A5". */
import type { AnalyzedNote } from "@/lib/analysis/types";

const NAMES = ["C", "C♯", "D", "E♭", "E", "F", "F♯", "G", "A♭", "A", "B♭", "B"];

/** Reads the measure index and MIDI number back out of a note key (`P1:m12:s1:v1:3/8:70`). */
export function parseNoteKey(key: string): { measureIndex: number; midi: number; grace: number } | null {
  const m = /:m(\d+):s\d+:v[^:]+:\d+\/\d+:(\d+)(?::g(\d+))?$/.exec(key);
  if (!m) return null;
  return { measureIndex: Number(m[1]), midi: Number(m[2]), grace: m[3] ? Number(m[3]) : 0 };
}

export function midiName(midi: number): string {
  return `${NAMES[((midi % 12) + 12) % 12]}${Math.floor(midi / 12) - 1}`;
}

/** Prefers the analysis' spelled pitch and written bar number; falls back to the key. */
export function noteLabel(key: string, note?: Pick<AnalyzedNote, "measure" | "pitch">): string {
  if (note) return `Bar ${note.measure} · ${note.pitch.replace("#", "♯").replace(/b(?=-?\d)/, "♭")}`;
  const parsed = parseNoteKey(key);
  if (!parsed) return key;
  return `Bar ${parsed.measureIndex + 1} · ${midiName(parsed.midi)}${parsed.grace ? " (grace)" : ""}`;
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
