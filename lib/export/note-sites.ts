import { SaxesParser, type SaxesTag } from "saxes";
import { noteKey } from "@/lib/musicxml/note-key";

/**
 * Finds every sounding `<note>` of a score-partwise text together with its note key and the
 * character offsets where markings can be written into it, without rebuilding the document: the
 * export splices text into the original so everything Ondula does not own stays byte for byte.
 *
 * Keys are built by the shared `noteKey` with the reader's rules (measure index, staff, voice,
 * onset, pitch, grace index; a tie continuation takes its first note's key); a test checks that
 * they equal the reader's keys on every sample.
 */

/** Prefix of every `id` attribute on an element Ondula writes, so a later export can remove them. */
export const ONDULA_ID_PREFIX = "ondula-";

/** Text that opens the machine-readable marking carried by `<other-notation>`. */
export const CARRIER_PREFIX = "ondula-marking";

export interface NoteSite {
  /** Index in document order among the sites of the whole score. */
  index: number;
  partId: string;
  key: string;
  staff: number;
  voice: string;
  /** Whether the note names its staff / voice (a direction for it then names them too). */
  hasStaff: boolean;
  hasVoice: boolean;
  isGrace: boolean;
  /** A tie continuation: it shares the key of the first note of its chain. */
  isContinuation: boolean;
  /** Index of the last note of this note's tie chain (itself when not tied). */
  chainEndIndex: number;
  /** Offset of `<note`. */
  start: number;
  /** Offset of the `<note` that begins this note's chord (a direction must not split a chord). */
  anchor: number;
  /** Offset where a new `<notations>` may go: before `<lyric>`, `<play>`, `<listen>` or `</note>`. */
  notationsAt: number;
  /** Texts of `<other-notation>` children that carry an Ondula marking. */
  carriers: string[];
}

export interface ScanResult {
  sites: NoteSite[];
  /** [start, end) ranges of elements Ondula wrote earlier (ids starting with ONDULA_ID_PREFIX). */
  ondulaRanges: Array<[number, number]>;
}

const STEP_PC: Record<string, number> = { C: 0, D: 2, E: 4, F: 5, G: 7, A: 9, B: 11 };
/** Children of `<note>` that the schema places after `<notations>`. */
const AFTER_NOTATIONS = new Set(["lyric", "play", "listen"]);

interface Frac {
  num: number;
  den: number;
}

function gcd(a: number, b: number): number {
  a = Math.abs(a);
  b = Math.abs(b);
  while (b) [a, b] = [b, a % b];
  return a || 1;
}
function frac(num: number, den: number): Frac {
  const g = gcd(num, den);
  return { num: num / g, den: den / g };
}
function add(a: Frac, b: Frac): Frac {
  return frac(a.num * b.den + b.num * a.den, a.den * b.den);
}

interface NoteState {
  start: number;
  chord: boolean;
  grace: boolean;
  rest: boolean;
  unpitched: boolean;
  step: string;
  alter: number;
  octave: number;
  duration: number;
  staff: number | null;
  voice: string | null;
  tieStart: boolean;
  tieStop: boolean;
  notationsAt: number | null;
  carriers: string[];
}

/** Scans a score-partwise document. Throws on text that is not well-formed XML. */
export function scanNoteSites(partwiseXml: string): ScanResult {
  const parser = new SaxesParser({ position: true });
  const sites: NoteSite[] = [];
  const ondulaRanges: Array<[number, number]> = [];

  const stack: string[] = [];
  let text = "";
  let tagStart = 0;

  let partId = "";
  let measureIndex = -1;
  let divisions = 1;
  let pos: Frac = { num: 0, den: 1 };
  let lastOnset: Frac = { num: 0, den: 1 };
  let lastAnchor = 0;
  let graceCounts = new Map<string, number>();
  let lastGraceIndex = 0;
  // Open tie chains, by their first site; matched as the reader matches them.
  let openTies: Array<{ first: number; staff: number; voice: string; midi: number }> = [];
  let note: NoteState | null = null;
  let moveDuration = 0;
  // Depth at which an Ondula-owned element started; everything inside it is skipped.
  let skipDepth = -1;
  let skipStart = 0;

  const startOfTag = () => partwiseXml.lastIndexOf("<", parser.position - 1);

  parser.on("opentagstart", () => {
    tagStart = startOfTag();
  });

  parser.on("opentag", (tag: SaxesTag) => {
    const name = tag.name;
    const attrs = tag.attributes as Record<string, string>;
    stack.push(name);
    text = "";
    if (skipDepth >= 0) return;
    if (attrs.id?.startsWith(ONDULA_ID_PREFIX)) {
      skipDepth = stack.length;
      skipStart = tagStart;
      return;
    }
    const parent = stack[stack.length - 2];
    switch (name) {
      case "part":
        if (parent === "score-partwise") {
          partId = attrs.id ?? "";
          measureIndex = -1;
          openTies = [];
        }
        break;
      case "measure":
        if (parent === "part") {
          measureIndex += 1;
          pos = { num: 0, den: 1 };
          lastOnset = pos;
          graceCounts = new Map();
        }
        break;
      case "note":
        note = {
          start: tagStart,
          chord: false,
          grace: false,
          rest: false,
          unpitched: false,
          step: "",
          alter: 0,
          octave: Number.NaN,
          duration: 0,
          staff: null,
          voice: null,
          tieStart: false,
          tieStop: false,
          notationsAt: null,
          carriers: [],
        };
        break;
      case "backup":
      case "forward":
        moveDuration = 0;
        break;
      default:
        if (note && parent === "note") {
          if (name === "chord") note.chord = true;
          else if (name === "grace") note.grace = true;
          else if (name === "rest") note.rest = true;
          else if (name === "unpitched") note.unpitched = true;
          else if (AFTER_NOTATIONS.has(name) && note.notationsAt === null) note.notationsAt = tagStart;
        }
        // Sound (`tie`) and notation (`tied`) both bind a chain, as the reader takes them.
        if (note && (name === "tie" || name === "tied") && (parent === "note" || parent === "notations")) {
          if (attrs.type === "start" || attrs.type === "continue") note.tieStart = true;
          if (attrs.type === "stop" || attrs.type === "continue") note.tieStop = true;
        }
    }
  });

  parser.on("text", (t: string) => {
    text += t;
  });

  parser.on("closetag", (tag: SaxesTag) => {
    const name = tag.name;
    const depth = stack.length;
    stack.pop();
    const parent = stack[stack.length - 1];
    // Carriers sit inside Ondula's own `<notations>`: read them even while skipping those.
    if (note && name === "other-notation" && text.trim().startsWith(CARRIER_PREFIX)) {
      note.carriers.push(text);
    }
    if (skipDepth >= 0) {
      if (depth === skipDepth) {
        ondulaRanges.push([skipStart, parser.position]);
        skipDepth = -1;
      }
      return;
    }
    const value = text.trim();
    if (name === "divisions" && parent === "attributes") {
      const d = Number(value);
      if (d > 0) divisions = d;
      return;
    }
    if (name === "duration" && (parent === "backup" || parent === "forward")) {
      moveDuration = Number(value) || 0;
      return;
    }
    if (name === "backup" || name === "forward") {
      const delta = frac(Math.round(moveDuration * 1000), divisions * 4 * 1000);
      pos = add(pos, name === "backup" ? { num: -delta.num, den: delta.den } : delta);
      if (pos.num < 0) pos = { num: 0, den: 1 }; // a backup never crosses the barline
      return;
    }
    if (note && (parent === "pitch" || parent === "unpitched")) {
      // An unpitched note is keyed by its display position, as the reader keys it.
      if (name === "step" || name === "display-step") note.step = value;
      else if (name === "alter" && parent === "pitch") note.alter = Number(value) || 0;
      else if (name === "octave" || name === "display-octave") note.octave = parseInt(value, 10);
      return;
    }
    if (note && parent === "note") {
      if (name === "duration") note.duration = Number(value) || 0;
      else if (name === "staff") note.staff = Number(value) || 1;
      else if (name === "voice") note.voice = value || "1";
      return;
    }
    if (name === "note" && note) {
      finishNote(note, partwiseXml.lastIndexOf("<", parser.position - 1));
      note = null;
    }
  });

  function finishNote(n: NoteState, closeAt: number) {
    const onset = n.chord ? lastOnset : pos;
    if (!n.chord) {
      lastOnset = pos;
      lastAnchor = n.start;
      if (!n.grace) {
        // Durations may carry fractions of a division in the wild; keep them exact to 1/1000.
        pos = add(pos, frac(Math.round(n.duration * 1000), divisions * 4 * 1000));
      }
    }
    if (n.rest || !Object.hasOwn(STEP_PC, n.step) || !Number.isFinite(n.octave)) return;
    const staff = n.staff ?? 1;
    const voice = n.voice ?? "1";
    const midi = 12 * (n.octave + 1) + STEP_PC[n.step] + Math.round(n.alter);
    let graceIndex = 0;
    if (n.grace) {
      if (n.chord) graceIndex = lastGraceIndex;
      else {
        const slot = `${staff}|${voice}|${onset.num}/${onset.den}`;
        graceIndex = (graceCounts.get(slot) ?? 0) + 1;
        graceCounts.set(slot, graceIndex);
      }
      lastGraceIndex = graceIndex;
    }
    const index = sites.length;
    let key = noteKey({ partId, measureIndex, staff, voice, onset, midi, graceIndex });
    let isContinuation = false;
    if (n.tieStop && !n.grace) {
      let i = openTies.findIndex((t) => t.midi === midi && t.voice === voice && t.staff === staff);
      if (i < 0) i = openTies.findIndex((t) => t.midi === midi);
      if (i >= 0) {
        const first = openTies[i].first;
        key = sites[first].key;
        isContinuation = true;
        sites[first].chainEndIndex = index;
        if (!n.tieStart) openTies.splice(i, 1);
      }
    }
    sites.push({
      index,
      partId,
      key,
      staff,
      voice,
      hasStaff: n.staff !== null,
      hasVoice: n.voice !== null,
      isGrace: n.grace,
      isContinuation,
      chainEndIndex: index,
      start: n.start,
      anchor: n.chord ? lastAnchor : n.start,
      notationsAt: n.notationsAt ?? closeAt,
      carriers: n.carriers,
    });
    if (n.tieStart && !n.grace && !isContinuation) {
      // A new chain on this pitch replaces a stale one that never found its stop.
      const stale = openTies.findIndex((t) => t.midi === midi && t.voice === voice);
      if (stale >= 0) openTies.splice(stale, 1);
      openTies.push({ first: index, staff, voice, midi });
    }
  }

  parser.write(partwiseXml).close();
  return { sites, ondulaRanges };
}
