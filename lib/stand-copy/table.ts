import { VALUE_WORDS, onsetAndShape } from "@/lib/markings/labels";
import type { AnalyzedNote } from "@/lib/analysis/types";
import { notePitchName } from "@/lib/markings/note-labels";
import { barName, type WrittenBar } from "@/lib/musicxml/bar-names";
import { parseNoteKey } from "@/lib/musicxml/note-key";
import { pulsesPerBeat } from "@/lib/analysis/vibrato";
import { formatNumber } from "@/lib/markings/pulses";
import { ROLE_INFO } from "@/lib/markings/roles";
import type { MarkingValues } from "@/lib/markings/schema";

/** One line of the stand copy's table of marked notes, already in the words a person reads. */
export interface MarkedNoteRow {
  noteKey: string;
  bar: string;
  note: string;
  role: string;
  depth: string;
  speed: string;
  placement: string;
  onsetShape: string;
  comment: string;
}

type Marked = MarkingValues & { noteKey: string };

/**
 * The marked notes in score order (the analysis' note order; notes it does not know come last, by
 * key). Speed carries pulses per beat when the tempo is known: pulses = Hz × 60 / bpm.
 */
export function markedNoteRows(markings: readonly Marked[], notes: readonly AnalyzedNote[], tempo: number | null, bars: readonly WrittenBar[]): MarkedNoteRow[] {
  const order = new Map(notes.map((n, i) => [n.key, i]));
  const byKey = new Map(notes.map((n) => [n.key, n]));
  const sorted = [...markings].sort((a, b) => {
    const ia = order.get(a.noteKey) ?? Number.MAX_SAFE_INTEGER;
    const ib = order.get(b.noteKey) ?? Number.MAX_SAFE_INTEGER;
    return ia - ib || a.noteKey.localeCompare(b.noteKey);
  });
  return sorted.map((m) => {
    const measureIndex = parseNoteKey(m.noteKey)?.measureIndex;
    const bar = measureIndex === undefined ? "" : barName(bars, measureIndex, "heading").replace(/^Bar /, "");
    const note = notePitchName(m.noteKey, byKey.get(m.noteKey)) ?? m.noteKey;
    const none = m.depthCents === 0 || m.speedHz === 0;
    const pulses = tempo ? pulsesPerBeat(m.speedHz, tempo) : Number.NaN;
    return {
      noteKey: m.noteKey,
      bar,
      note,
      role: m.role ? ROLE_INFO[m.role].label : "",
      depth: none ? "none" : `${formatNumber(m.depthCents, 1)}¢`,
      speed: none ? "–" : `${formatNumber(m.speedHz, 2)} Hz${Number.isFinite(pulses) ? ` · ${formatNumber(pulses, 2)}/beat` : ""}`,
      placement: none ? "–" : VALUE_WORDS.placement[m.placement],
      onsetShape: none ? "–" : onsetAndShape(m),
      comment: m.comment.trim(),
    };
  });
}
