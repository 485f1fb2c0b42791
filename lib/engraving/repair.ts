/**
 * The text handed to the engraver, made drawable. OpenSheetMusicDisplay 2.1.3 (with VexFlow) stops
 * on some valid MusicXML found in real editions: a grace note without a `<type>` (it derives a
 * zero length and VexFlow refuses the note), a trill's wavy line that starts and never stops (it
 * looks for a staff that does not exist). Those are mended here before drawing. What still fails is
 * found in the browser by trying (see components/score/engrave.ts) and its bars are drawn as rest
 * bars with `blankMeasures`.
 *
 * Input is the reader's normalized partwise text (no comments, no CDATA, one element per tag), so
 * plain text scanning is exact. Measures are never added or removed and notes keep their order,
 * pitch, voice and onset, so the note keys of the notes drawn stay the server's.
 */

/** A measure's span in the text, with its index in its part (0-based, written order). */
export interface MeasureSpan {
  start: number;
  end: number;
  /** 0-based position in its part, the note keys' measure index. */
  index: number;
  /** The written bar number (`number` attribute), as the player reads it on the score. */
  number: string;
}

const MEASURE = /<measure\b[^>]*>[\s\S]*?<\/measure>/g;
const PART_OPEN = /<part\b[^>]*>/g;

/** Every measure of every part, in text order. */
export function measureSpans(xml: string): MeasureSpan[] {
  const partStarts: number[] = [];
  for (const m of xml.matchAll(PART_OPEN)) partStarts.push(m.index ?? 0);
  const spans: MeasureSpan[] = [];
  let part = -1;
  let index = 0;
  for (const m of xml.matchAll(MEASURE)) {
    const start = m.index ?? 0;
    let p = part;
    while (p + 1 < partStarts.length && partStarts[p + 1] < start) p++;
    if (p !== part) {
      part = p;
      index = 0;
    }
    const number = /^<measure\b[^>]*\bnumber="([^"]*)"/.exec(m[0])?.[1] ?? String(index + 1);
    spans.push({ start, end: start + m[0].length, index: index++, number });
  }
  return spans;
}

/** How many measures the (single) part has: the first part's count. */
export function measureCount(xml: string): number {
  let count = 0;
  for (const s of measureSpans(xml)) if (s.index === count) count++;
  return count;
}

/** A grace note with no `<type>` gets an eighth's, the usual look of a grace note. */
function typeGraceNotes(xml: string): string {
  return xml.replace(/<note\b[^>]*>(?:(?!<\/note>)[\s\S])*?<grace\b[\s\S]*?<\/note>/g, (note) =>
    /<type\b/.test(note) ? note : note.replace(/<\/note>$/, "<type>eighth</type></note>"),
  );
}

const WAVY = /<wavy-line\b[^>]*\/>|<wavy-line\b[^>]*>[\s\S]*?<\/wavy-line>/g;

/** Wavy lines whose start has no stop (or stop no start) in the same part are left out. */
function pairWavyLines(xml: string): string {
  const drop = new Set<number>();
  const parts = [...xml.matchAll(/<part\b[^>]*>[\s\S]*?<\/part>/g)];
  for (const part of parts) {
    const base = part.index ?? 0;
    const open = new Map<string, number>();
    for (const w of part[0].matchAll(WAVY)) {
      const at = base + (w.index ?? 0);
      const type = /\btype="([^"]*)"/.exec(w[0])?.[1];
      const number = /\bnumber="([^"]*)"/.exec(w[0])?.[1] ?? "1";
      if (type === "start") {
        const before = open.get(number);
        if (before !== undefined) drop.add(before);
        open.set(number, at);
      } else if (type === "stop") {
        if (open.has(number)) open.delete(number);
        else drop.add(at);
      }
    }
    for (const at of open.values()) drop.add(at);
  }
  if (drop.size === 0) return xml;
  return xml.replace(WAVY, (w, offset: number) => (drop.has(offset) ? "" : w));
}

const HARMONY = /<harmony\b([^>]*)>([\s\S]*?)<\/harmony>/g;
const attr = (tag: string, name: string) => new RegExp(`\\b${name}="([^"]*)"`).exec(tag)?.[1];

/**
 * The words a harmony with kind "none" asks to be shown, or null for a plain "no chord".
 * MusicXML 4.0: `kind`'s `text` attribute spells the chord kind as printed, `root-step`'s `text`
 * the root (the root of kind "none" is a placeholder unless spelled), and `function` (3.1, kept for older files) holds a Roman
 * numeral. Analyses encoded this way (When in Rome's scores: `<kind text="V6">none</kind>`) would
 * otherwise be drawn "N.C." at every chord.
 */
function harmonyWords(body: string): string | null {
  const kind = /<kind\b([^>]*)>\s*none\s*<\/kind>/.exec(body);
  if (!kind) return null;
  const fn = /<function\b[^>]*>([^<]*)<\/function>/.exec(body)?.[1]?.trim();
  let words = fn ?? "";
  if (!fn) {
    const rootTag = /<root-step\b([^>]*)>([^<]*)<\/root-step>/.exec(body);
    // Kind "none" needs a root by the schema; it is shown only where the file spells it.
    const root = rootTag ? (attr(rootTag[1], "text") ?? "") : "";
    const kindText = attr(kind[1], "text");
    // Without a spelling of its own, kind "none" is the "no chord" sign the engraver draws.
    if (kindText === undefined) return null;
    words = `${root}${kindText}`.trim();
  }
  return words && words !== "N.C." ? words : null;
}

/**
 * A harmony of kind "none" that spells itself (a Roman numeral, a function) is handed to the
 * engraver as a numeral carrying the same words: OpenSheetMusicDisplay 2.1.3 draws a numeral's
 * `text` as written and ignores the spelling of kind "none". Offsets and staff stay.
 */
function spellHarmonies(xml: string): string {
  if (!xml.includes("<harmony")) return xml;
  return xml.replace(HARMONY, (whole, attrs: string, body: string) => {
    if (body.includes("<numeral")) return whole;
    const words = harmonyWords(body);
    if (words === null) return whole;
    const rest = body
      .replace(/<root\b[^>]*>[\s\S]*?<\/root>/g, "")
      .replace(/<function\b[^>]*>[^<]*<\/function>/g, "")
      .replace(/<kind\b[^>]*>[^<]*<\/kind>/g, "");
    const text = words.replace(/"/g, "&quot;");
    return `<harmony${attrs}><numeral><numeral-root text="${text}">1</numeral-root></numeral><kind>none</kind>${rest}</harmony>`;
  });
}

const NOTE_SIGNS: Record<string, string> = { quarter: "♩", eighth: "♪" };

/**
 * A tempo written as words and a metronome mark in one direction ("Andante ♩ = 72", the way
 * notation programs export a tempo text) is drawn by OpenSheetMusicDisplay 2.1.3 with both at the
 * same spot, one over the other. The mark is handed over as part of the words instead. Only the
 * plain forms (a quarter or eighth, dotted or not, per minute) are joined; others stay as written.
 */
function joinTempoWords(xml: string): string {
  if (!xml.includes("<metronome")) return xml;
  return xml.replace(/<direction\b[^>]*>[\s\S]*?<\/direction>/g, (direction) => {
    if (!direction.includes("<metronome") || !direction.includes("<words")) return direction;
    const metronomeType = /<direction-type>\s*(<metronome\b[^>]*>([\s\S]*?)<\/metronome>)\s*<\/direction-type>/.exec(direction);
    if (!metronomeType) return direction;
    const body = metronomeType[2];
    const units = [...body.matchAll(/<beat-unit>\s*([a-z0-9]+)\s*<\/beat-unit>/g)].map((m) => m[1]);
    const perMinute = /<per-minute>\s*([^<]*?)\s*<\/per-minute>/.exec(body)?.[1];
    if (units.length !== 1 || !NOTE_SIGNS[units[0]] || !perMinute) return direction;
    const dots = ".".repeat((body.match(/<beat-unit-dot\b/g) ?? []).length);
    const mark = `${NOTE_SIGNS[units[0]]}${dots} = ${perMinute}`;
    const words = [...direction.matchAll(/<words\b[^>]*>([^<]*)<\/words>/g)];
    const last = words[words.length - 1];
    if (!last || last.index === undefined) return direction;
    const closeAt = last.index + last[0].length - "</words>".length;
    const joined = `${direction.slice(0, closeAt).replace(/\s+$/, "")} ${mark}${direction.slice(closeAt)}`;
    return joined.replace(metronomeType[0], "");
  });
}

/** The known mends, always applied: they change how a note looks, never which notes there are. */
export function mendForEngraving(xml: string): string {
  return joinTempoWords(spellHarmonies(pairWavyLines(typeGraceNotes(xml))));
}

/** A measure's length in its divisions: the furthest any voice reaches. */
function measureLength(body: string): number {
  let at = 0;
  let max = 0;
  let lastDuration = 0;
  for (const m of body.matchAll(/<(note|backup|forward)\b[^>]*>([\s\S]*?)<\/\1>/g)) {
    const duration = Number(/<duration>\s*([\d.]+)\s*<\/duration>/.exec(m[2])?.[1] ?? 0);
    if (m[1] === "backup") at -= duration;
    else if (m[1] === "forward") at += duration;
    else if (/<grace\b/.test(m[2])) continue;
    else if (/<chord\b/.test(m[2])) {
      // A chord note shares the onset of the note before it.
      at = at - lastDuration + duration;
    } else at += duration;
    if (m[1] === "note") lastDuration = duration;
    max = Math.max(max, at);
  }
  return max;
}

/**
 * The given measures (by index in their part) drawn as rest bars: their notes, directions and
 * everything else but attributes, barlines and layout marks are left out, so what the engraver
 * cannot draw there no longer stops the rest of the part.
 */
export function blankMeasures(xml: string, indices: ReadonlySet<number>): string {
  if (indices.size === 0) return xml;
  let out = "";
  let from = 0;
  for (const span of measureSpans(xml)) {
    if (!indices.has(span.index)) continue;
    const text = xml.slice(span.start, span.end);
    const open = /^<measure\b[^>]*>/.exec(text)![0];
    const keep = [...text.matchAll(/<(attributes|barline|print)\b[^>]*\/>|<(attributes|barline|print)\b[^>]*>[\s\S]*?<\/\2>/g)].map((m) => m[0]);
    const length = measureLength(text);
    const rest = length > 0 ? `<note><rest measure="yes"/><duration>${length}</duration><voice>1</voice></note>` : "";
    // Attributes first (clef, key and time apply from the bar's start), then the rest, then barlines.
    const attrs = keep.filter((k) => !k.startsWith("<barline"));
    const lines = keep.filter((k) => k.startsWith("<barline"));
    out += xml.slice(from, span.start) + open + attrs.join("") + rest + lines.join("") + "</measure>";
    from = span.end;
  }
  return out + xml.slice(from);
}

/** The measures from `first` on, drawn as rest bars: used to find where drawing fails. */
export function blankFrom(xml: string, first: number, also: ReadonlySet<number>): string {
  const all = new Set(also);
  for (const s of measureSpans(xml)) if (s.index >= first) all.add(s.index);
  return blankMeasures(xml, all);
}

/** Only the first `count` measures of each part: the opening drawn before the whole part. */
export function firstMeasures(xml: string, count: number): string {
  let out = "";
  let from = 0;
  for (const span of measureSpans(xml)) {
    if (span.index < count) continue;
    out += xml.slice(from, span.start);
    from = span.end;
  }
  return out + xml.slice(from);
}

/** Written bar numbers of the given measure indices (first part), in order. */
export function barNumbers(xml: string, indices: Iterable<number>): string[] {
  const wanted = new Set(indices);
  const seen = new Set<number>();
  const out: string[] = [];
  for (const s of measureSpans(xml)) {
    if (!wanted.has(s.index) || seen.has(s.index)) continue;
    seen.add(s.index);
    out.push(s.number);
  }
  return out;
}

/** "bar 12", "bars 12 and 40", "bars 3, 12 and 40". */
export function listBars(numbers: readonly string[]): string {
  if (numbers.length === 1) return `bar ${numbers[0]}`;
  return `bars ${numbers.slice(0, -1).join(", ")} and ${numbers[numbers.length - 1]}`;
}
