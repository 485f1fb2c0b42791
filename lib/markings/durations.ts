import type { AnalyzedNote } from "@/lib/analysis/types";
import { valueOfText } from "@/lib/musicxml/fraction";

/**
 * Each note's sounding duration in seconds at the part's tempo (quarter notes per minute):
 * a duration of d whole notes lasts d × 4 × 60 / tempo seconds. Empty without a tempo.
 */
export function noteDurations(notes: readonly Pick<AnalyzedNote, "key" | "duration">[], tempo: number | null): Record<string, number> {
  const out: Record<string, number> = {};
  if (!tempo || !(tempo > 0)) return out;
  for (const n of notes) {
    const wholes = valueOfText(n.duration);
    if (wholes >= 0) out[n.key] = (wholes * 4 * 60) / tempo;
  }
  return out;
}

/** A tension tone's resolution, from the analysis' suggestions (drawn as an arc). */
export function resolutionsOf(suggestions: readonly { note: string; role: string; resolvesTo: string | null }[]): Record<string, string> {
  const out: Record<string, string> = {};
  for (const s of suggestions) if (s.role === "tension" && s.resolvesTo) out[s.note] = s.resolvesTo;
  return out;
}
