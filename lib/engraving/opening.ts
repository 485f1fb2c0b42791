/**
 * A long part is engraved in two steps: its opening first (a screen or two of music, so notes can
 * be selected at once), the whole when the page is idle. The workspace page carries only the
 * opening of such a part; the whole text is fetched beside it.
 */
import { firstMeasures, measureCount } from "./repair";
import { parseNoteKey } from "@/lib/musicxml/note-key";

/**
 * The bars drawn first: four lines of music, which fill a laptop's screen under the workspace's
 * toolbar (each bar drawn costs the first paint a few milliseconds; a taller screen shows the
 * rest a moment later, with the whole part).
 */
export const OPENING_BARS = 16;

/** A part of more bars than this is drawn in two steps. */
export const TWO_STEP_BARS = 48;

/** Whether the (single-part) text is drawn in two steps. */
export function isLongPart(xml: string): boolean {
  return measureCount(xml) > TWO_STEP_BARS;
}

/** What a page first engraves of a part: the opening of a long part, else the whole text. */
export interface FirstText {
  /** The whole text, when the part is short enough to be drawn at once. */
  whole: string | null;
  /** The opening bars of a long part (its whole text is fetched apart). */
  opening: string | null;
}

/**
 * The first text of the chosen part of a stored score, without reading the whole of a long one:
 * `select` keeps the chosen part (the reader's `selectPartsXml`, a full parse) and runs on the
 * score cut after one bar more than a short part has. Cutting measures and keeping one part
 * commute on normalized text, so the opening is the same as cutting the chosen part's whole text.
 */
export function firstTextOf(stored: string, select: (xml: string) => string): FirstText {
  const head = select(firstMeasures(stored, TWO_STEP_BARS + 1));
  if (!isLongPart(head)) return { whole: head, opening: null };
  return { whole: null, opening: firstMeasures(head, OPENING_BARS) };
}

/**
 * The note keys of a part's opening: what a page that carries only the opening needs to key its
 * notes as the server does (the whole list comes with the whole text).
 */
export function openingNoteKeys(keys: readonly string[]): string[] {
  return keys.filter((key) => {
    const parts = parseNoteKey(key);
    return parts !== null && parts.measureIndex < OPENING_BARS;
  });
}
