import type { Role, Suggestion } from "@/lib/analysis/types";
import type { MarkingState } from "./changes";

export interface Decision {
  noteKey: string;
  role: Role;
  decision: "accepted" | "dismissed";
}

/** "suggested" from confidence 0.5 up, "possible" below. */
export function confidenceLabel(confidence: number): "suggested" | "possible" {
  return confidence >= 0.5 ? "suggested" : "possible";
}

/**
 * Suggestions still waiting for the player: not dismissed, and the note does not already carry
 * that role. An accepted suggestion whose marking was undone comes back, so undo loses nothing.
 */
export function pendingSuggestions(suggestions: readonly Suggestion[], decisions: readonly Decision[], markings: MarkingState): Suggestion[] {
  const dismissed = new Set(decisions.filter((d) => d.decision === "dismissed").map((d) => `${d.noteKey}|${d.role}`));
  return suggestions.filter((s) => !dismissed.has(`${s.note}|${s.role}`) && markings[s.note]?.role !== s.role);
}

/** Groups by role in the given order, each group by confidence (highest first) then score order. */
export function groupByRole(suggestions: readonly Suggestion[], order: readonly Role[]): { role: Role; items: Suggestion[] }[] {
  return order
    .map((role) => ({
      role,
      items: suggestions
        .map((s, i) => ({ s, i }))
        .filter(({ s }) => s.role === role)
        .sort((a, b) => (confidenceLabel(b.s.confidence) === confidenceLabel(a.s.confidence) ? a.i - b.i : b.s.confidence - a.s.confidence))
        .map(({ s }) => s),
    }))
    .filter((g) => g.items.length > 0);
}

/** Past this many waiting suggestions a part is long: the panel shows the strongest first. */
export const LONG_PART_SUGGESTIONS = 12;

/**
 * How strong a suggestion is: the analysis' numeric `strength` where it gives one (0–1), else its
 * confidence. Read defensively: older analyses carry no strength.
 */
export function strengthOf(s: Suggestion): number {
  const strength = (s as Suggestion & { strength?: unknown }).strength;
  return typeof strength === "number" && Number.isFinite(strength) ? strength : s.confidence;
}

interface PhraseSpan {
  start: string;
  end: string;
}

/**
 * The suggestions worth a first look on a long part: in each phrase, the strongest one of each
 * role (by strength, then confidence, then score order), at most `cap` of them in all, strongest
 * first; `rest` holds the others in their original order. A short list is shown whole.
 */
export function rankSuggestions(
  pending: readonly Suggestion[],
  phrases: readonly PhraseSpan[],
  noteOrder: readonly string[],
  cap = LONG_PART_SUGGESTIONS,
): { top: Suggestion[]; rest: Suggestion[] } {
  if (pending.length <= cap) return { top: [...pending], rest: [] };
  const position = new Map(noteOrder.map((k, i) => [k, i]));
  const spans = phrases
    .map((p) => ({ from: position.get(p.start) ?? -1, to: position.get(p.end) ?? -1 }))
    .filter((p) => p.from >= 0 && p.to >= p.from)
    .sort((a, b) => a.from - b.from);
  const phraseOf = (note: string): number => {
    const at = position.get(note);
    if (at === undefined) return -1;
    // The last phrase starting at or before the note, if it reaches the note.
    let lo = 0;
    let hi = spans.length - 1;
    let found = -1;
    while (lo <= hi) {
      const mid = (lo + hi) >> 1;
      if (spans[mid].from <= at) {
        found = mid;
        lo = mid + 1;
      } else hi = mid - 1;
    }
    return found >= 0 && spans[found].to >= at ? found : -1;
  };
  const ranked = pending
    .map((s, i) => ({ s, i }))
    .sort((a, b) => strengthOf(b.s) - strengthOf(a.s) || b.s.confidence - a.s.confidence || a.i - b.i);
  const taken = new Set<number>();
  const seen = new Set<string>();
  for (const { s, i } of ranked) {
    if (taken.size >= cap) break;
    // Notes outside every phrase each count as their own group.
    const phrase = phraseOf(s.note);
    const group = `${phrase === -1 ? `note:${s.note}` : phrase}|${s.role}`;
    if (seen.has(group)) continue;
    seen.add(group);
    taken.add(i);
  }
  return {
    top: ranked.filter(({ i }) => taken.has(i)).map(({ s }) => s),
    rest: pending.filter((_, i) => !taken.has(i)),
  };
}
