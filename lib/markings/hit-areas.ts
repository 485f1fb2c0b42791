/**
 * How wide each note's touch target is. A finger needs about 44 CSS px (WCAG 2.2 SC 2.5.5,
 * Target Size, Enhanced), but at the default zoom eighth notes sit 22–30 px apart: targets that
 * wide would overlap and the later note would swallow the earlier one's taps. So each note's
 * target reaches up to 22 px either side of its centre, but never past half-way to the next note
 * in its system (notes at one x, a chord or two voices, share it), and is never narrower than
 * `minWidth` (there it may overlap, as before). Together they tile the system without gaps or
 * overlaps wherever the notes are far enough apart.
 */
export const TOUCH_TARGET_PX = 44;

export interface HitInput {
  key: string;
  /** Centre of the note in x. */
  centre: number;
  /** Which system (row) it is on. */
  row: number;
  /** The narrowest it may be (e.g. the notehead with some room). */
  minWidth: number;
}

export interface HitSpan {
  left: number;
  width: number;
}

/** Distinct x positions closer than this count as one column (a chord's heads differ by less). */
const SAME_COLUMN_PX = 1;

export function hitSpans(notes: readonly HitInput[], target = TOUCH_TARGET_PX): Map<string, HitSpan> {
  const byRow = new Map<number, number[]>();
  for (const n of notes) {
    const xs = byRow.get(n.row) ?? [];
    xs.push(n.centre);
    byRow.set(n.row, xs);
  }
  for (const xs of byRow.values()) xs.sort((a, b) => a - b);

  const out = new Map<string, HitSpan>();
  const half = target / 2;
  for (const n of notes) {
    const xs = byRow.get(n.row)!;
    let previous = -Infinity;
    let next = Infinity;
    for (const x of xs) {
      if (x < n.centre - SAME_COLUMN_PX) previous = x;
      else if (x > n.centre + SAME_COLUMN_PX) {
        next = x;
        break;
      }
    }
    let left = Math.max(n.centre - half, (previous + n.centre) / 2);
    let right = Math.min(n.centre + half, (n.centre + next) / 2);
    if (right - left < n.minWidth) {
      left = n.centre - n.minWidth / 2;
      right = n.centre + n.minWidth / 2;
    }
    out.set(n.key, { left, width: right - left });
  }
  return out;
}
