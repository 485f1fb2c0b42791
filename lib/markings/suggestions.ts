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
