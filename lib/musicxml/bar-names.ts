/**
 * The one place that names a bar for people: by the number printed on the part (the MusicXML
 * `number` attribute), never by its position. Note keys carry the 0-based measure index, so
 * every label of a note, a thread, a notice or a reason goes through here with the part's bars.
 */
import type { Measure } from "./model";
import { parseNoteKey } from "./note-key";

/** What the part writes about one bar, in measure-index order. */
export interface WrittenBar {
  number: string;
  /** `implicit="yes"`: its number is not printed (a pickup, or a bar split by a repeat). */
  implicit?: boolean;
}

export type BarNameForm = "inline" | "heading";

/** The written bars of a part read by the reader. */
export function writtenBars(measures: readonly Pick<Measure, "number" | "implicit">[]): WrittenBar[] {
  return measures.map((m) => (m.implicit ? { number: m.number, implicit: true } : { number: m.number }));
}

const ENTITIES: Record<string, string> = { amp: "&", lt: "<", gt: ">", quot: '"', apos: "'" };

function attr(tag: string, name: string): string | undefined {
  const m = new RegExp(`\\s${name}\\s*=\\s*(?:"([^"]*)"|'([^']*)')`).exec(tag);
  if (!m) return undefined;
  return (m[1] ?? m[2]).replace(/&(amp|lt|gt|quot|apos);/g, (_, e: string) => ENTITIES[e]);
}

/**
 * The written bars of one part from a partwise MusicXML text (the normalized text Ondula
 * stores and sends), without reading the notes: a scan of the `<part>` and `<measure>` start
 * tags; without `partId`, the first part. Agrees with `writtenBars` of the reader's model
 * (tested on the real corpus).
 */
export function writtenBarsFromText(partwiseXml: string, partId?: string): WrittenBar[] {
  const bars: WrittenBar[] = [];
  const tags = /<(part|measure)(?=[\s/>])[^>]*>|<\/part\s*>|<!--[\s\S]*?-->|<!\[CDATA\[[\s\S]*?\]\]>/g;
  let inPart = false;
  for (let m = tags.exec(partwiseXml); m; m = tags.exec(partwiseXml)) {
    const tag = m[0];
    if (tag.startsWith("<!")) continue;
    if (tag.startsWith("</")) {
      if (inPart) break;
      continue;
    }
    if (m[1] === "part") {
      inPart = partId === undefined || attr(tag, "id") === partId;
      continue;
    }
    if (!inPart) continue;
    const number = attr(tag, "number") ?? String(bars.length + 1);
    bars.push(attr(tag, "implicit") === "yes" ? { number, implicit: true } : { number });
  }
  return bars;
}

function isPickup(bars: readonly WrittenBar[], index: number): boolean {
  return index === 0 && bars.length > 0 && !!bars[0].implicit;
}

/**
 * The bar at a measure index as a player names it: "bar 12", "bar 12a", "the pickup" (an
 * unnumbered first bar), "the bar after bar 4" (an unnumbered bar later on, such as the second
 * half of a bar split by a repeat sign, written "X1" by some programs). `heading` starts a label:
 * "Bar 12", "Pickup", "After bar 4". A bar the list does not know is counted from 1.
 */
export function barName(bars: readonly WrittenBar[], index: number, form: BarNameForm = "inline"): string {
  const heading = form === "heading";
  const bar = bars[index];
  if (!bar) return `${heading ? "Bar" : "bar"} ${index + 1}`;
  if (isPickup(bars, index)) return heading ? "Pickup" : "the pickup";
  if (bar.implicit && !sameNumberAsBefore(bars, index)) {
    const before = previousNamed(bars, index);
    if (before !== null) return heading ? `After ${barName(bars, before)}` : `the bar after ${barName(bars, before)}`;
  }
  return `${heading ? "Bar" : "bar"} ${bar.number}`;
}

/** A split bar written with its first half's number is that bar, as printed. */
function sameNumberAsBefore(bars: readonly WrittenBar[], index: number): boolean {
  return index > 0 && bars[index - 1].number === bars[index].number;
}

function previousNamed(bars: readonly WrittenBar[], index: number): number | null {
  for (let i = index - 1; i >= 0; i--) if (!bars[i].implicit || isPickup(bars, i)) return i;
  return null;
}

/** The bar of a note key ("bar 12", "the pickup"…); null when the key cannot be read. */
export function barNameOfNoteKey(bars: readonly WrittenBar[], noteKey: string, form: BarNameForm = "inline"): string | null {
  const parsed = parseNoteKey(noteKey);
  return parsed ? barName(bars, parsed.measureIndex, form) : null;
}

/** A span of bars: "bar 4", "bars 4–6", "the pickup to bar 2". */
export function barSpanName(bars: readonly WrittenBar[], from: number, to: number, form: BarNameForm = "inline"): string {
  if (from === to) return barName(bars, from, form);
  // A bar the list does not know is counted from 1, as in `barName`.
  const numberOf = (i: number) => (bars[i] ? (bars[i].implicit ? null : bars[i].number) : String(i + 1));
  const a = numberOf(from);
  const b = numberOf(to);
  if (a !== null && b !== null) return `${form === "heading" ? "Bars" : "bars"} ${a}–${b}`;
  return `${barName(bars, from, form)} to ${barName(bars, to)}`;
}
