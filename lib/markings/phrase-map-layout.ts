/**
 * Where the phrase map draws what, in pixels, so that nothing overlaps at any length: phrases too
 * narrow for their own glyphs are drawn together as one span ("Phrases 12–18"), marked notes
 * closer than a dot's width share one dot, and local keys are spans with a name where it fits.
 */

export interface PhraseIndices {
  /** Positions in the part's note order. */
  start: number;
  peak: number;
  end: number;
}

export type PhraseMapItem =
  | { kind: "phrase"; index: number; left: number; width: number; peak: number | null }
  | { kind: "group"; first: number; last: number; left: number; width: number };

/** A phrase with its own start and peak glyphs needs this many px (two 24 px glyphs apart). */
export const PHRASE_MIN_PX = 48;
const GLYPH_PX = 24;

/** x in px of note position `i` of `count` notes on a strip `width` px wide. */
export function xOf(i: number, count: number, width: number): number {
  return count <= 1 ? 0 : (i / (count - 1)) * width;
}

/**
 * Phrases in order, each on its own where it is at least `PHRASE_MIN_PX` wide, else gathered with
 * its neighbours until the group is; a peak glyph only where it clears the start glyph and the next
 * phrase's.
 */
export function layoutPhrases(phrases: readonly PhraseIndices[], count: number, width: number): PhraseMapItem[] {
  const items: PhraseMapItem[] = [];
  let i = 0;
  while (i < phrases.length) {
    const left = xOf(phrases[i].start, count, width);
    const right = xOf(phrases[i].end, count, width);
    if (right - left >= PHRASE_MIN_PX) {
      const peakX = xOf(phrases[i].peak, count, width) - left;
      const clear = peakX >= GLYPH_PX && right - left - peakX >= GLYPH_PX;
      items.push({ kind: "phrase", index: i, left, width: right - left, peak: clear ? peakX : null });
      i++;
      continue;
    }
    let j = i;
    while (j + 1 < phrases.length && xOf(phrases[j].end, count, width) - left < PHRASE_MIN_PX) j++;
    const end = xOf(phrases[j].end, count, width);
    if (j === i) items.push({ kind: "phrase", index: i, left, width: Math.max(end - left, 2), peak: null });
    else items.push({ kind: "group", first: i, last: j, left, width: Math.max(end - left, 2) });
    i = j + 1;
  }
  return items;
}

/** Marked notes by pixel: one dot per `dotPx`, carrying the first note it stands for and how many. */
export function layoutDots(positions: readonly number[], count: number, width: number, dotPx = 8): { x: number; first: number; count: number }[] {
  const sorted = [...positions].sort((a, b) => a - b);
  const dots: { x: number; first: number; count: number }[] = [];
  for (const p of sorted) {
    const x = xOf(p, count, width);
    const last = dots[dots.length - 1];
    if (last && x - last.x < dotPx) last.count++;
    else dots.push({ x, first: p, count: 1 });
  }
  return dots;
}

/** "F#" → "F♯ major", "bb" minor → "B♭ minor". */
export function keyName(tonic: string, mode: "major" | "minor"): string {
  const letter = tonic.charAt(0).toUpperCase();
  const accidentals = tonic.slice(1).replace(/##/g, "𝄪").replace(/#/g, "♯").replace(/b/g, "♭");
  return `${letter}${accidentals} ${mode}`;
}

/** Roughly the width of one character of the map's 11 px labels, and a label's side padding. */
const LABEL_CHAR_PX = 7;
const LABEL_PAD_PX = 10;

/**
 * The name written inside a local key's box of `widthPx`: the full name where it fits, else the
 * short chord-symbol form ("Em", "B♭") a player reads at a glance, else nothing (the box's title
 * and label still name it in full).
 */
export function keyLabel(tonic: string, mode: "major" | "minor", widthPx: number): string {
  const full = keyName(tonic, mode);
  if (widthPx >= full.length * LABEL_CHAR_PX + LABEL_PAD_PX) return full;
  const short = full.replace(/ major$/, "").replace(/ minor$/, "m");
  return widthPx >= short.length * LABEL_CHAR_PX + LABEL_PAD_PX ? short : "";
}

/**
 * Each local key's span in note positions: from the first note of its first bar to the last note
 * of its last bar (bars named by their written numbers, as the analysis gives them).
 */
export function localKeySpans<K extends { fromMeasure: string; toMeasure: string }>(keys: readonly K[], noteMeasures: readonly string[]): (K & { from: number; to: number })[] {
  const first = new Map<string, number>();
  const last = new Map<string, number>();
  noteMeasures.forEach((m, i) => {
    if (!first.has(m)) first.set(m, i);
    last.set(m, i);
  });
  return keys.flatMap((k) => {
    const from = first.get(k.fromMeasure);
    const to = last.get(k.toMeasure);
    return from === undefined || to === undefined || to < from ? [] : [{ ...k, from, to }];
  });
}
