/**
 * Which numbers under the waves are printed, on paper where they must stay large: each label
 * starts at its note and may run past its wave, but never into the label before it on the same
 * system. Left to right, a label that would touch the previous one is left out (the table of
 * marked notes still lists its numbers).
 */
export interface LabelCandidate {
  key: string;
  /** The system it is on: labels on different systems never meet. */
  row: number;
  x: number;
  text: string;
}

/** Width of a label in px at `fontPx`: digits and "¢" are about 0.6 em, a space 0.3 em. */
export function labelWidth(text: string, fontPx: number): number {
  let em = 0;
  for (const ch of text) em += ch === " " ? 0.3 : ch === "." ? 0.3 : 0.6;
  return em * fontPx;
}

/** The keys whose label is drawn. `limit` is the right edge no label may cross (the margin). */
export function fitLabels(items: readonly LabelCandidate[], fontPx: number, gap: number, limit = Infinity): Set<string> {
  const shown = new Set<string>();
  const ends = new Map<number, number>();
  const sorted = [...items].sort((a, b) => a.row - b.row || a.x - b.x);
  for (const item of sorted) {
    const end = item.x + labelWidth(item.text, fontPx);
    if (end > limit) continue;
    if (item.x < (ends.get(item.row) ?? -Infinity) + gap) continue;
    shown.add(item.key);
    ends.set(item.row, end);
  }
  return shown;
}
