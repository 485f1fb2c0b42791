import { SaxesParser } from "saxes";
import { fail, MusicXmlError, type ReadLimits } from "./errors";
import { add, cmp, FractionRangeError, frac, mul, parseDecimal, toString as fracString, ZERO } from "./fraction";
import type { BarlineStyle, Fraction, KeySignature, Measure, Note, PartModel, PhraseMarks, ScoreModel } from "./model";
import { noteKey } from "./note-key";
import { isStep, makePitch } from "./pitch";
import { checkLooksLikeXml, checkProlog } from "./prolog";
import { buildTimeline, type TempoEvent } from "./timeline";

/**
 * The reader: ONE streaming saxes pass that builds the model and the normalized partwise text at
 * the same time. No generic object tree is built (the performance goal is within 3× of a bare
 * tokenizer pass), so every element we care about is handled on its open or close event with the
 * few pieces of context it needs.
 *
 * The normalized text is assembled from the source text of each header element and each measure,
 * exactly as the strict parser accepted it (XML 1.0, no DTD, only XML's own five entities and
 * character references), under a root and part elements written here. Rebuilding every element
 * instead cost 2–3× the whole parse in garbage collection (millions of small strings), and gains
 * nothing: the browser parses the very bytes saxes validated. The DOCTYPE, the XML declaration and
 * anything between top-level elements (comments, processing instructions) are dropped; timewise
 * measures are regrouped by part.
 */

/** A measure may hold up to this multiple of its time signature before its durations count as damaged. */
const OVERFLOW_FACTOR = 2;
/** Largest `divisions` accepted: far above real files (which stay under ~100 000), far below overflow. */
const MAX_DIVISIONS = 1_000_000;
const DEFAULT_TEMPO = 120;
/** Depth of a measure's children in both layouts: root > part > measure > x, root > measure > part > x. */
const CONTENT_DEPTH = 4;

interface CurrentNote {
  grace: boolean;
  chord: boolean;
  cue: boolean;
  rest: boolean;
  unpitched: boolean;
  step: string;
  alter: number;
  octave: number | null;
  duration: Fraction | null;
  voice: string;
  staff: number;
  tieStart: boolean;
  tieStop: boolean;
  marks: PhraseMarks;
}

interface PartState {
  id: string;
  measures: Measure[];
  notes: Note[];
  /** Content length actually reached, per measure index (max position over all voices). */
  reached: Fraction[];
  divisions: Fraction;
  key: KeySignature;
  time: { beats: number; beatType: number } | null;
  timeLength: Fraction | null;
  measure: Measure | null;
  pos: Fraction;
  maxPos: Fraction;
  lastOnset: Fraction;
  graceCounts: Map<string, number>;
  lastGraceIndex: number;
  openTies: Note[];
  pendingDynamics: string | null;
  lastSounding: Note | null;
  /** Source slices of this part's measures (see the note on serialization below). */
  out: string[];
}

function newMarks(): PhraseMarks {
  return { fermata: false, breathMark: false, caesura: false, slurStarts: [], slurStops: [], dynamics: null };
}

const ESC_ATTR = /[&<>"\n\r\t]/;
const ENT: Record<string, string> = { "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "\n": "&#10;", "\r": "&#13;", "\t": "&#9;" };
const escAttr = (s: string) => (ESC_ATTR.test(s) ? s.replace(/[&<>"\n\r\t]/g, (c) => ENT[c]) : s);

function attrString(attrs: Record<string, string>): string {
  let s = "";
  for (const k in attrs) s += ` ${k}="${escAttr(attrs[k])}"`;
  return s;
}

/** Whole-note length of a metronome beat unit (MusicXML note-type-value). */
const BEAT_UNIT: Record<string, Fraction> = {
  maxima: { num: 8, den: 1 },
  long: { num: 4, den: 1 },
  breve: { num: 2, den: 1 },
  whole: { num: 1, den: 1 },
  half: { num: 1, den: 2 },
  quarter: { num: 1, den: 4 },
  eighth: { num: 1, den: 8 },
  "16th": { num: 1, den: 16 },
  "32nd": { num: 1, den: 32 },
  "64th": { num: 1, den: 64 },
  "128th": { num: 1, den: 128 },
  "256th": { num: 1, den: 256 },
  "512th": { num: 1, den: 512 },
  "1024th": { num: 1, den: 1024 },
};

function barStyle(style: string): BarlineStyle {
  switch (style) {
    case "regular":
    case "":
      return "regular";
    case "light-light":
      return "double";
    case "light-heavy":
      return "final";
    default:
      return "other";
  }
}

function compareVoice(a: string, b: string): number {
  const x = Number(a);
  const y = Number(b);
  if (Number.isFinite(x) && Number.isFinite(y)) return x - y;
  return a < b ? -1 : a > b ? 1 : 0;
}

/** Time order inside a part: measure, onset, staff, voice, grace notes before their main note, pitch. */
function compareNotes(a: Note, b: Note): number {
  return (
    a.measureIndex - b.measureIndex ||
    cmp(a.onset, b.onset) ||
    a.staff - b.staff ||
    compareVoice(a.voice, b.voice) ||
    (a.isGrace ? a.graceIndex : Infinity) - (b.isGrace ? b.graceIndex : Infinity) ||
    (a.pitch?.midi ?? -1) - (b.pitch?.midi ?? -1)
  );
}

export interface ReadResult {
  score: ScoreModel;
  partwiseXml: string;
}

export function readMusicXmlText(source: string, limits: ReadLimits): ReadResult {
  checkLooksLikeXml(source);
  checkProlog(source);

  let layout: "partwise" | "timewise" | null = null;
  let rootAttrs = "";
  const head: string[] = [];
  const names: string[] = [];
  let depth = 0;
  let pending = "";
  let sliceStart = 0;
  let noteCount = 0;

  let title = "";
  let movementTitle = "";
  let composer = "";
  let creatorType = "";
  const partNames = new Map<string, string>();
  const partListOrder: string[] = [];
  let scorePartId = "";
  const parts = new Map<string, PartState>();
  const remarks = new Set<string>();
  const tempoEvents: TempoEvent[] = [];

  let part: PartState | null = null;
  let timewiseMeasureAttrs: Record<string, string> = {};
  let note: CurrentNote | null = null;
  // Context of the element being read, reset when its container opens.
  let keyApplies = true;
  let keyFifths: number | null = null;
  let keyMode: string | null = null;
  let timeBeats = 0;
  let timeBeatType = 0;
  let timeLen: Fraction = ZERO;
  let timeSenza = false;
  let moveDuration: Fraction | null = null;
  let dirSoundTempo: number | null = null;
  let dirMetronome: number | null = null;
  let dirDynamics: string | null = null;
  let metUnit: Fraction | null = null;
  let metDots = 0;
  let metPerMinute: number | null = null;
  let barLocation = "right";
  let barStyleText = "";
  let barRepeat = "";
  let barFermata = false;

  function partState(id: string): PartState {
    let p = parts.get(id);
    if (!p) {
      p = {
        id,
        measures: [],
        notes: [],
        reached: [],
        divisions: { num: 1, den: 1 },
        key: { fifths: 0, mode: null },
        time: null,
        timeLength: null,
        measure: null,
        pos: ZERO,
        maxPos: ZERO,
        lastOnset: ZERO,
        graceCounts: new Map(),
        lastGraceIndex: 0,
        openTies: [],
        pendingDynamics: null,
        lastSounding: null,
        out: [],
      };
      parts.set(id, p);
    }
    return p;
  }

  function startMeasure(p: PartState, attrs: Record<string, string>) {
    const m: Measure = {
      index: p.measures.length,
      number: attrs.number ?? String(p.measures.length + 1),
      divisions: p.divisions.num / p.divisions.den,
      key: p.key,
      keyChanged: false,
      time: p.time,
      timeChanged: false,
      tempo: DEFAULT_TEMPO,
      length: p.timeLength ?? ZERO,
      barlineRight: "regular",
      barlineLeft: "regular",
      startSeconds: 0,
    };
    p.measures.push(m);
    p.measure = m;
    p.pos = ZERO;
    p.maxPos = ZERO;
    p.lastOnset = ZERO;
    p.graceCounts.clear();
  }

  function endMeasure(p: PartState) {
    const m = p.measure;
    if (!m) return;
    if (p.timeLength && p.timeLength.num > 0 && cmp(p.maxPos, mul(p.timeLength, { num: OVERFLOW_FACTOR, den: 1 })) > 0) {
      throw fail.measureOverflow(m.number, fracString(p.maxPos), `${m.time?.beats}/${m.time?.beatType}`);
    }
    if (!p.timeLength) m.length = p.maxPos;
    p.reached[m.index] = p.maxPos;
    p.measure = null;
  }

  function toWholes(d: Fraction, p: PartState): Fraction {
    // duration / (4 × divisions) whole notes
    return mul(d, { num: p.divisions.den, den: 4 * p.divisions.num });
  }

  function advance(p: PartState, by: Fraction) {
    p.pos = add(p.pos, by);
    if (p.pos.num < 0) p.pos = ZERO; // a backup never crosses the barline (MusicXML 4.0, backup)
    if (cmp(p.pos, p.maxPos) > 0) p.maxPos = p.pos;
  }

  function mergeMarks(into: PhraseMarks, from: PhraseMarks) {
    into.fermata ||= from.fermata;
    into.breathMark ||= from.breathMark;
    into.caesura ||= from.caesura;
    into.slurStarts.push(...from.slurStarts);
    into.slurStops.push(...from.slurStops);
    into.dynamics ??= from.dynamics;
  }

  function finishNote(p: PartState, n: CurrentNote) {
    const m = p.measure!;
    const dur = n.grace || !n.duration ? ZERO : toWholes(n.duration, p);
    let onset: Fraction;
    if (n.chord) onset = p.lastOnset;
    else {
      onset = p.pos;
      p.lastOnset = p.pos;
      if (!n.grace) advance(p, dur);
    }
    let pitch = null;
    if (!n.rest && isStep(n.step) && n.octave !== null) pitch = makePitch(n.step, n.unpitched ? 0 : n.alter, n.octave);

    if (pitch && n.tieStop && !n.grace) {
      // A tie continuation: the chain is one sounding note, keyed by its first note.
      let i = p.openTies.findIndex((t) => t.pitch!.midi === pitch.midi && t.voice === n.voice && t.staff === n.staff);
      if (i < 0) i = p.openTies.findIndex((t) => t.pitch!.midi === pitch.midi);
      if (i >= 0) {
        const head = p.openTies[i];
        head.duration = add(head.duration, dur);
        mergeMarks(head.marks, n.marks);
        head.tied = true;
        if (!n.tieStart) p.openTies.splice(i, 1);
        if (!n.chord) p.lastSounding = head;
        return;
      }
    }

    let graceIndex = 0;
    if (n.grace) {
      if (n.chord) graceIndex = p.lastGraceIndex;
      else {
        const gk = `${n.staff}|${n.voice}|${onset.num}/${onset.den}`;
        graceIndex = (p.graceCounts.get(gk) ?? 0) + 1;
        p.graceCounts.set(gk, graceIndex);
        p.lastGraceIndex = graceIndex;
      }
    }
    if (pitch && !n.chord && p.pendingDynamics) {
      n.marks.dynamics ??= p.pendingDynamics;
      p.pendingDynamics = null;
    }
    const out: Note = {
      key: pitch
        ? noteKey({ partId: p.id, measureIndex: m.index, staff: n.staff, voice: n.voice, onset, midi: pitch.midi, graceIndex })
        : "",
      partId: p.id,
      measureIndex: m.index,
      measureNumber: m.number,
      staff: n.staff,
      voice: n.voice,
      onset,
      duration: dur,
      onsetSeconds: 0,
      durationSeconds: 0,
      pitch,
      isRest: !pitch,
      isChord: n.chord,
      isGrace: n.grace,
      graceIndex,
      isCue: n.cue,
      tied: false,
      marks: n.marks,
    };
    p.notes.push(out);
    if (pitch) {
      if (n.tieStart && !n.grace) {
        // A new chain on this pitch replaces a stale one that never found its stop.
        const stale = p.openTies.findIndex((t) => t.pitch!.midi === pitch.midi && t.voice === n.voice);
        if (stale >= 0) p.openTies.splice(stale, 1);
        p.openTies.push(out);
      }
      if (!n.chord && !n.grace) p.lastSounding = out;
    }
  }

  function pushTempo(p: PartState, tempo: number) {
    if (!(tempo > 0) || !Number.isFinite(tempo)) return;
    tempoEvents.push({ measureIndex: p.measure?.index ?? 0, offset: p.pos, tempo, order: tempoEvents.length });
  }

  function metronomeTempo(): number | null {
    if (!metUnit || metPerMinute === null) return null;
    let unit = metUnit;
    let dot = metUnit;
    for (let i = 0; i < metDots; i++) {
      dot = mul(dot, { num: 1, den: 2 });
      unit = add(unit, dot);
    }
    // beats per minute × (quarters per beat) = quarters per minute
    return metPerMinute * ((unit.num * 4) / unit.den);
  }

  // XML 1.0 forced: the browser parses the output as XML 1.0, so both must accept the same text.
  const parser = new SaxesParser({ position: false, xmlns: false, defaultXMLVersion: "1.0", forceXMLVersion: true });

  parser.on("opentag", (tag) => {
    const name = tag.name;
    const attrs = tag.attributes as Record<string, string>;
    depth++;
    if (depth > limits.maxDepth) throw fail.nesting(limits.maxDepth);
    names[depth] = name;
    const parent = names[depth - 1];

    if (depth === 1) {
      if (name === "score-partwise") layout = "partwise";
      else if (name === "score-timewise") layout = "timewise";
      else throw fail.wrongRoot(name);
      rootAttrs = attrString(attrs);
    } else if (depth === 2) {
      if (layout === "partwise" && name === "part") part = partState(attrs.id ?? "");
      else if (layout === "timewise" && name === "measure") timewiseMeasureAttrs = attrs;
      else sliceStart = source.lastIndexOf("<", parser.position - 1);
    } else if (depth === 3 && part && layout === "partwise") {
      sliceStart = source.lastIndexOf("<", parser.position - 1);
    } else if (depth === 3 && layout === "timewise" && name === "part") {
      part = partState(attrs.id ?? "");
      part.out.push(`<measure${attrString(timewiseMeasureAttrs)}>`);
      sliceStart = tag.isSelfClosing ? -1 : parser.position;
      startMeasure(part, timewiseMeasureAttrs);
    }
    pending = "";

    if (depth === 3 && layout === "partwise" && name === "measure" && part) {
      startMeasure(part, attrs);
      return;
    }

    switch (name) {
      case "note":
        // Only a note of the measure itself; an unknown element may hold a look-alike.
        if (depth !== CONTENT_DEPTH || !part?.measure) break;
        if (++noteCount > limits.maxNotes) throw fail.tooManyNotes(limits.maxNotes);
        note = {
          grace: false,
          chord: false,
          cue: false,
          rest: false,
          unpitched: false,
          step: "",
          alter: 0,
          octave: null,
          duration: null,
          voice: "1",
          staff: 1,
          tieStart: false,
          tieStop: false,
          marks: newMarks(),
        };
        break;
      case "grace":
      case "chord":
      case "cue":
      case "rest":
      case "unpitched":
        if (note && parent === "note") note[name === "unpitched" ? "unpitched" : name] = true;
        break;
      case "tie":
      case "tied":
        if (note && (parent === "note" || parent === "notations")) {
          const t = attrs.type;
          if (t === "start" || t === "continue") note.tieStart = true;
          if (t === "stop" || t === "continue") note.tieStop = true;
        }
        break;
      case "slur":
        if (note && parent === "notations") {
          const num = Number(attrs.number ?? "1") || 1;
          if (attrs.type === "start") note.marks.slurStarts.push(num);
          else if (attrs.type === "stop") note.marks.slurStops.push(num);
        }
        break;
      case "fermata":
        if (note && parent === "notations") note.marks.fermata = true;
        else if (parent === "barline") barFermata = true;
        break;
      case "breath-mark":
        if (note && parent === "articulations") note.marks.breathMark = true;
        break;
      case "caesura":
        if (note && parent === "articulations") note.marks.caesura = true;
        break;
      case "backup":
      case "forward":
        moveDuration = null;
        break;
      case "key":
        keyApplies = !attrs.number || attrs.number === "1";
        keyFifths = null;
        keyMode = null;
        break;
      case "time":
        if (!attrs.number || attrs.number === "1") {
          timeBeats = 0;
          timeBeatType = 0;
          timeLen = ZERO;
          timeSenza = false;
        }
        break;
      case "direction":
        dirSoundTempo = null;
        dirMetronome = null;
        dirDynamics = null;
        break;
      case "metronome":
        metUnit = null;
        metDots = 0;
        metPerMinute = null;
        break;
      case "sound":
        if (attrs.tempo !== undefined && part?.measure) {
          const t = Number(attrs.tempo);
          if (parent === "direction") dirSoundTempo = t;
          else pushTempo(part, t);
        }
        break;
      case "barline":
        barLocation = attrs.location ?? "right";
        barStyleText = "";
        barRepeat = "";
        barFermata = false;
        break;
      case "repeat":
        if (parent === "barline") {
          barRepeat = attrs.direction ?? "";
          remarks.add("Repeats are kept in written order; they are not unfolded.");
        }
        break;
      case "ending":
      case "segno":
      case "coda":
        remarks.add("Repeats are kept in written order; they are not unfolded.");
        break;
      case "score-part":
        scorePartId = attrs.id ?? "";
        if (depth === 3 && !partListOrder.includes(scorePartId)) partListOrder.push(scorePartId);
        break;
      case "creator":
        creatorType = attrs.type ?? "";
        break;
    }
  });

  parser.on("text", (t) => {
    pending += t;
  });
  parser.on("cdata", (t) => {
    pending += t;
  });

  parser.on("closetag", (tag) => {
    const name = tag.name;
    const text = pending;
    const parent = names[depth - 1];

    pending = "";
    depth--;
    if (depth === 1) {
      // A child of the root closes: a header element, a partwise part, or a timewise measure.
      if (layout === "partwise" && name === "part") part = null;
      else if (layout !== "timewise" || name !== "measure") head.push(source.slice(sliceStart, parser.position));
      return;
    }
    if (depth === 2 && part) {
      if (layout === "partwise") {
        if (name === "measure") endMeasure(part);
        part.out.push(source.slice(sliceStart, parser.position), "\n");
      } else if (name === "part") {
        const end = source.lastIndexOf("<", parser.position - 1);
        if (sliceStart >= 0) part.out.push(source.slice(sliceStart, end));
        part.out.push("</measure>\n");
        endMeasure(part);
        part = null;
      }
      return;
    }

    const p = part;
    switch (name) {
      case "note":
        if (depth + 1 !== CONTENT_DEPTH) return;
        if (note && p?.measure) finishNote(p, note);
        note = null;
        return;
      case "step":
      case "display-step":
        if (note) note.step = text.trim();
        return;
      case "alter":
        if (note && parent === "pitch") note.alter = Number(text) || 0;
        return;
      case "octave":
      case "display-octave":
        if (note && (parent === "pitch" || parent === "unpitched")) {
          const o = parseInt(text, 10);
          note.octave = Number.isFinite(o) ? o : null;
        } else if (parent === "octave-change") {
          // handled by transpose below
        }
        return;
      case "duration": {
        const d = parseDecimal(text);
        if (!d || d.num < 0) throw fail.duration(p?.measure?.number ?? "?", text.trim());
        if (parent === "note" && note) note.duration = d;
        else if (parent === "backup" || parent === "forward") moveDuration = d;
        return;
      }
      case "voice":
        if (note && parent === "note") note.voice = text.trim() || "1";
        return;
      case "staff":
        if (note && parent === "note") note.staff = parseInt(text, 10) || 1;
        return;
      case "backup":
      case "forward":
        if (p?.measure && moveDuration && depth + 1 === CONTENT_DEPTH) {
          const w = toWholes(moveDuration, p);
          advance(p, name === "backup" ? { num: -w.num, den: w.den } : w);
        }
        return;
      case "divisions": {
        if (!p || parent !== "attributes") return;
        const d = parseDecimal(text);
        if (!d || d.num <= 0 || d.num / d.den > MAX_DIVISIONS) throw fail.divisions(p.measure?.number ?? "?", text.trim());
        p.divisions = d;
        if (p.measure && p.pos.num === 0) p.measure.divisions = d.num / d.den;
        return;
      }
      case "fifths":
        if (parent === "key") keyFifths = parseInt(text, 10);
        return;
      case "mode":
        if (parent === "key") keyMode = text.trim() || null;
        return;
      case "key":
        if (p?.measure && keyApplies && keyFifths !== null && Number.isFinite(keyFifths)) {
          p.key = { fifths: keyFifths, mode: keyMode === "none" ? null : keyMode };
          p.measure.key = p.key;
          p.measure.keyChanged = true;
        }
        return;
      case "beats":
      case "beat-type":
        if (parent === "time") {
          if (name === "beats") {
            // Composite beats like "3+2" add up.
            timeBeats = text.split("+").reduce((s, x) => s + (parseInt(x, 10) || 0), 0);
          } else {
            timeBeatType = parseInt(text, 10) || 0;
            if (timeBeats > 0 && timeBeatType > 0) timeLen = add(timeLen, frac(timeBeats, timeBeatType));
          }
        }
        return;
      case "senza-misura":
        timeSenza = true;
        return;
      case "time":
        if (p?.measure && parent === "attributes") {
          if (timeSenza || timeLen.num === 0) {
            p.time = null;
            p.timeLength = null;
          } else {
            // Additive signatures (2/4 + 3/8) keep the last pair's beat type with the summed length.
            p.time = { beats: (timeLen.num * timeBeatType) / timeLen.den, beatType: timeBeatType };
            p.timeLength = timeLen;
          }
          p.measure.time = p.time;
          p.measure.timeChanged = true;
          p.measure.length = p.timeLength ?? ZERO;
        }
        return;
      case "chromatic":
        if (p && parent === "transpose") {
          const c = Number(text);
          if (c) {
            remarks.add(
              `Part ${p.id} is written for a transposing instrument (it sounds ${Math.abs(c)} semitone${Math.abs(c) === 1 ? "" : "s"} ${c < 0 ? "lower" : "higher"} than written); pitches and keys are reported as written.`,
            );
          }
        }
        return;
      case "beat-unit":
        if (parent === "metronome" && !metUnit) metUnit = BEAT_UNIT[text.trim()] ?? null;
        return;
      case "beat-unit-dot":
        if (parent === "metronome" && metPerMinute === null) metDots++;
        return;
      case "per-minute": {
        // "132-144" → the middle of the range (MusicXML 4.0, metronome example pairs it with tempo 69)
        const nums = text.match(/\d+(?:\.\d+)?/g);
        if (nums && nums.length) metPerMinute = nums.slice(0, 2).reduce((s, x) => s + Number(x), 0) / Math.min(nums.length, 2);
        return;
      }
      case "metronome":
        dirMetronome = metronomeTempo();
        return;
      case "other-dynamics":
        if (parent === "dynamics") {
          if (note) note.marks.dynamics = text.trim();
          else dirDynamics = text.trim();
        }
        return;
      case "direction":
        if (p?.measure) {
          const t = dirSoundTempo ?? dirMetronome;
          if (t !== null) pushTempo(p, t);
          if (dirDynamics) p.pendingDynamics = dirDynamics;
        }
        return;
      case "bar-style":
        barStyleText = text.trim();
        return;
      case "barline":
        if (p?.measure) {
          let style = barStyle(barStyleText);
          if (barRepeat === "forward") style = "repeat-start";
          if (barRepeat === "backward") style = "repeat-end";
          if (barLocation === "left") p.measure.barlineLeft = style;
          else if (barLocation === "right") p.measure.barlineRight = style;
          if (barFermata && p.lastSounding) p.lastSounding.marks.fermata = true;
        }
        return;
      case "part-name":
        if (parent === "score-part") partNames.set(scorePartId, text.trim());
        return;
      case "work-title":
        title = text.trim();
        return;
      case "movement-title":
        movementTitle = text.trim();
        return;
      case "creator":
        if (creatorType === "composer" && !composer) composer = text.trim();
        return;
    }
    if (parent === "dynamics") {
      if (note) note.marks.dynamics = name;
      else dirDynamics = name;
    }
  });

  try {
    parser.write(source);
  } catch (err) {
    throw translate(err, source, false);
  }
  try {
    parser.close();
  } catch (err) {
    if (!layout && !(err instanceof MusicXmlError)) throw fail.notXml("it has no root element");
    throw translate(err, source, true);
  }
  if (!layout) throw fail.notXml("it has no root element");

  const order = [...partListOrder.filter((id) => parts.has(id)), ...[...parts.keys()].filter((id) => !partListOrder.includes(id))];
  const states = order.map((id) => parts.get(id)!).filter((p) => p.measures.length > 0);
  if (states.length === 0) throw fail.noParts();

  const timeline = buildTimeline(states, tempoEvents, DEFAULT_TEMPO);
  if (!tempoEvents.length) remarks.add(`No tempo is written; times in seconds assume ${DEFAULT_TEMPO} quarter notes per minute.`);

  const models: PartModel[] = states.map((p) => {
    p.notes.sort(compareNotes);
    for (const m of p.measures) {
      m.startSeconds = timeline.measureStartSeconds(m.index);
      m.tempo = timeline.tempoAtMeasureStart(m.index);
    }
    for (const n of p.notes) {
      const start = timeline.abs(n.measureIndex, n.onset);
      n.onsetSeconds = timeline.seconds(start);
      n.durationSeconds = n.duration.num === 0 ? 0 : timeline.seconds(start + n.duration.num / n.duration.den) - n.onsetSeconds;
    }
    return { id: p.id, name: partNames.get(p.id) ?? p.id, measures: p.measures, notes: p.notes };
  });

  const xml = [`<?xml version="1.0" encoding="UTF-8"?>\n<score-partwise${rootAttrs}>\n`, ...head.map((h) => `${h}\n`)];
  for (const p of states) xml.push(`<part id="${escAttr(p.id)}">\n`, ...p.out, "</part>\n");
  xml.push("</score-partwise>\n");

  return {
    score: { title: title || movementTitle, composer, parts: models, remarks: [...remarks] },
    partwiseXml: xml.join(""),
  };
}

function translate(err: unknown, text: string, closing: boolean): Error {
  if (err instanceof MusicXmlError) return err;
  if (err instanceof FractionRangeError) return fail.duration("?", "out of range");
  const why = err instanceof Error ? err.message : String(err);
  if (closing) return fail.truncated();
  return fail.malformed(locate(text), why.replace(/^[^:]*:\d+:\d+: /, ""));
}

/** Line and column of the first well-formedness error, found by a second pass only on failure. */
function locate(text: string): string {
  const p = new SaxesParser({ position: true });
  let where = "";
  p.on("error", (e) => {
    if (!where) where = `line ${p.line}, column ${p.column}`;
    void e;
  });
  try {
    p.write(text).close();
  } catch {
    /* the first position is all we need */
  }
  return where;
}
