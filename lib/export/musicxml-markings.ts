import type { MarkingValues } from "@/lib/markings/schema";
import { decodeCarrier, encodeCarrier, escapeXml, markingLabel } from "./marking-text";
import { ONDULA_ID_PREFIX, scanNoteSites, type NoteSite } from "./note-sites";

/**
 * Writes markings into a score-partwise text as standard MusicXML 4.0 (mapping in
 * lib/export/README.md) and reads them back. Insertions only: removing every element whose id
 * starts with "ondula-" gives the original text back, so a re-export replaces, never doubles.
 */

/** Wavy-line numbers are `number-level` (1–16) in the schema. */
const MAX_LINE_NUMBER = 16;
const SMUFL_VIBRATO_LINE = "wiggleVibrato";

interface Insertion {
  at: number;
  text: string;
  order: number;
}

function splice(xml: string, removals: Array<[number, number]>, insertions: Insertion[]): string {
  const edits = [
    ...removals.map(([from, to], i) => ({ at: from, to, text: "", order: -1 - i })),
    ...insertions.map((ins) => ({ at: ins.at, to: ins.at, text: ins.text, order: ins.order })),
  ].sort((a, b) => a.at - b.at || a.order - b.order);
  let out = "";
  let cursor = 0;
  for (const e of edits) {
    out += xml.slice(cursor, e.at) + e.text;
    cursor = Math.max(cursor, e.to);
  }
  return out + xml.slice(cursor);
}

/** The text with every element Ondula wrote into it earlier removed. */
export function stripMarkings(partwiseXml: string): string {
  const { ondulaRanges } = scanNoteSites(partwiseXml);
  return splice(partwiseXml, ondulaRanges, []);
}

export interface EmbedReport {
  xml: string;
  /** Keys of markings whose note is not in the part (they are left out, never misplaced). */
  unplaced: string[];
}

/** Gives each concurrent wavy line its own number, in document order. */
function lineNumbers(starts: NoteSite[], sites: NoteSite[]): Map<number, number> {
  const numbers = new Map<number, number>();
  const open: Array<{ end: number; number: number }> = [];
  for (const site of starts) {
    // Lines on notes of one chord sound together, so they count as open for each other.
    const ended = (end: number) => end < site.index && sites[end].anchor !== site.anchor;
    for (let i = open.length - 1; i >= 0; i--) if (ended(open[i].end)) open.splice(i, 1);
    const used = new Set(open.map((o) => o.number));
    let n = 1;
    while (used.has(n) && n < MAX_LINE_NUMBER) n++;
    numbers.set(site.index, n);
    open.push({ end: site.chainEndIndex, number: n });
  }
  return numbers;
}

/** Like {@link embedMarkings}, also naming the markings that found no note. */
export function embedMarkingsWithReport(
  partwiseXml: string,
  markings: Map<string, MarkingValues>,
): EmbedReport {
  const { sites, ondulaRanges } = scanNoteSites(partwiseXml);
  const firstByKey = new Map<string, NoteSite>();
  for (const site of sites) if (!site.isContinuation && !firstByKey.has(site.key)) firstByKey.set(site.key, site);

  const placed = sites.filter((s) => !s.isContinuation && firstByKey.get(s.key) === s && markings.has(s.key));
  const unplaced = [...markings.keys()].filter((k) => !firstByKey.has(k));
  const numbers = lineNumbers(placed, sites);
  const insertions: Insertion[] = [];
  let order = 0;

  placed.forEach((site, i) => {
    const m = markings.get(site.key)!;
    const id = `${ONDULA_ID_PREFIX}vib-${i + 1}`;
    const n = numbers.get(site.index)!;
    const words = [`<words>${escapeXml(markingLabel(m))}</words>`];
    if (m.comment.trim() !== "") words.push(`<words font-style="italic"> “${escapeXml(m.comment.trim())}”</words>`);
    const voice = site.hasVoice ? `<voice>${escapeXml(site.voice)}</voice>` : "";
    const staff = site.hasStaff ? `<staff>${site.staff}</staff>` : "";
    insertions.push({
      at: site.anchor,
      order: order++,
      text: `<direction placement="above" id="${id}"><direction-type>${words.join("")}</direction-type>${voice}${staff}</direction>`,
    });

    const start = `<wavy-line type="start" number="${n}" smufl="${SMUFL_VIBRATO_LINE}" placement="above"/>`;
    const stopHere = site.chainEndIndex === site.index ? `<wavy-line type="stop" number="${n}"/>` : "";
    insertions.push({
      at: site.notationsAt,
      order: order++,
      text:
        `<notations id="${id}-start"><ornaments>${start}${stopHere}</ornaments>` +
        `<other-notation type="single" print-object="no">${escapeXml(encodeCarrier(m))}</other-notation></notations>`,
    });
    if (site.chainEndIndex !== site.index) {
      insertions.push({
        at: sites[site.chainEndIndex].notationsAt,
        order: order++,
        text: `<notations id="${id}-stop"><ornaments><wavy-line type="stop" number="${n}"/></ornaments></notations>`,
      });
    }
  });

  return { xml: splice(partwiseXml, ondulaRanges, insertions), unplaced };
}

/**
 * The part with each marking written as standard MusicXML: a `<words>` direction above the note
 * and a vibrato wavy line spanning it (tie chain included), plus a hidden `<other-notation>` that
 * {@link extractMarkings} reads back exactly. Earlier Ondula markings in the text are replaced.
 */
export function embedMarkings(partwiseXml: string, markings: Map<string, MarkingValues>): string {
  return embedMarkingsWithReport(partwiseXml, markings).xml;
}

export interface ExtractReport {
  markings: Map<string, MarkingValues>;
  /** Carriers that could not be read, with the note they sit on. */
  problems: Array<{ noteKey: string; reason: string }>;
}

/** Like {@link extractMarkings}, also naming the carriers it could not read. */
export function extractMarkingsWithReport(partwiseXml: string): ExtractReport {
  return markingsFromSites(scanNoteSites(partwiseXml).sites);
}

/** The markings carried by notes the reader already found (an upload reads its file once). */
export function markingsFromSites(sites: readonly NoteSite[]): ExtractReport {
  const markings = new Map<string, MarkingValues>();
  const problems: ExtractReport["problems"] = [];
  for (const site of sites) {
    for (const carrier of site.carriers) {
      const decoded = decodeCarrier(carrier);
      if (decoded.ok) markings.set(site.key, decoded.value);
      else problems.push({ noteKey: site.key, reason: decoded.reason });
    }
  }
  return { markings, problems };
}

/** Every marking an Ondula export carries, by note key. */
export function extractMarkings(partwiseXml: string): Map<string, MarkingValues> {
  return extractMarkingsWithReport(partwiseXml).markings;
}
