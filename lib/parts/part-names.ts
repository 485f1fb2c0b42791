/** A part's name for people: its written name, else "Part 2" by its place in the score (never its id, "P2"). */
export function partDisplayName(name: string, index: number): string {
  return name.trim() || `Part ${index + 1}`;
}

/**
 * The names to choose a part by: each part's name, with its place in the score added where two
 * parts share a name ("Violin (part 2 of 4)").
 */
export function partChoiceLabels(parts: readonly { name: string }[]): string[] {
  const count = new Map<string, number>();
  for (const p of parts) count.set(p.name, (count.get(p.name) ?? 0) + 1);
  return parts.map((p, i) => ((count.get(p.name) ?? 0) > 1 ? `${p.name} (part ${i + 1} of ${parts.length})` : p.name));
}
