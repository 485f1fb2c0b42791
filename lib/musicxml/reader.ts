import { fail, type ReadLimits } from "./errors";
import { parseDecimal } from "./fraction";
import type { Fraction, ScoreModel } from "./model";
import { checkLooksLikeXml, checkProlog } from "./prolog";
import { attrString, buildModels, orderParts, partwiseText } from "./read/assemble";
import { DirectionsReader } from "./read/directions";
import { HeaderReader } from "./read/header";
import { AttributesReader, endMeasure, newPartState, startMeasure, type PartState } from "./read/measures";
import { closeInNote, finishNote, newDraft, openInNote, type NoteDraft } from "./read/notes";
import { SiteCollector, type SiteOptions, type SiteScan } from "./read/sites";
import { Tokens, type TokenSink } from "./read/tokens";

/**
 * The reader: ONE streaming pass that builds the model and the normalized partwise text at the
 * same time, in named steps (lib/musicxml/read/): tokens → measures and attributes (with the
 * header and directions) → voices and time → notes and ties → model. No generic object tree is
 * built (the performance goal is within 3× of a bare tokenizer pass): this module only routes
 * each element to its step, with the part and note being read.
 *
 * The normalized text is assembled from the source text of each header element and each measure,
 * exactly as the strict parser accepted it (XML 1.0, no DTD, only XML's own five entities and
 * character references), under a root and part elements written here. Rebuilding every element
 * instead cost 2–3× the whole parse in garbage collection (millions of small strings), and gains
 * nothing: the browser parses the very bytes saxes validated. The DOCTYPE, the XML declaration and
 * anything between top-level elements (comments, processing instructions) are dropped; timewise
 * measures are regrouped by part.
 */

/** Depth of a measure's children in both layouts: root > part > measure > x, root > measure > part > x. */
const CONTENT_DEPTH = 4;

/** Which step reads an element (elements of no step are skipped). */
const enum Step {
  Note = 1,
  Attributes,
  Directions,
  Header,
  Move,
}

// A Map: element names come from the tokenizer as fresh strings, which a Map finds by hash
// without the engine's look-up of a property name.
const STEP = new Map<string, Step>(
  Object.entries({
    grace: Step.Note,
    chord: Step.Note,
    cue: Step.Note,
    rest: Step.Note,
    unpitched: Step.Note,
    tie: Step.Note,
    tied: Step.Note,
    slur: Step.Note,
    "breath-mark": Step.Note,
    caesura: Step.Note,
    step: Step.Note,
    "display-step": Step.Note,
    alter: Step.Note,
    octave: Step.Note,
    "display-octave": Step.Note,
    voice: Step.Note,
    staff: Step.Note,
    divisions: Step.Attributes,
    key: Step.Attributes,
    fifths: Step.Attributes,
    mode: Step.Attributes,
    time: Step.Attributes,
    beats: Step.Attributes,
    "beat-type": Step.Attributes,
    "senza-misura": Step.Attributes,
    chromatic: Step.Attributes,
    "octave-change": Step.Attributes,
    transpose: Step.Attributes,
    direction: Step.Directions,
    metronome: Step.Directions,
    "beat-unit": Step.Directions,
    "beat-unit-dot": Step.Directions,
    "per-minute": Step.Directions,
    sound: Step.Directions,
    barline: Step.Directions,
    "bar-style": Step.Directions,
    repeat: Step.Directions,
    ending: Step.Directions,
    segno: Step.Directions,
    coda: Step.Directions,
    "score-part": Step.Header,
    "part-name": Step.Header,
    creator: Step.Header,
    "work-title": Step.Header,
    "movement-title": Step.Header,
    backup: Step.Move,
    forward: Step.Move,
  }),
);

export interface ReadResult {
  score: ScoreModel;
  partwiseXml: string;
  /** Present when asked for with `sites`: where each note sits in the text read. */
  sites?: SiteScan;
}

export interface ReadOptions {
  /** Collect note sites and the elements an earlier export wrote (see read/sites.ts). */
  sites?: SiteOptions;
  /** Leave the elements an earlier export wrote out of the normalized text (needs `sites`). */
  dropOwn?: boolean;
}

class ScoreReader implements TokenSink {
  layout: "partwise" | "timewise" | null = null;
  rootAttrs = "";
  readonly head: string[] = [];
  readonly parts = new Map<string, PartState>();
  readonly remarks = new Set<string>();
  readonly header = new HeaderReader();
  readonly attributes = new AttributesReader(this.remarks);
  readonly directions = new DirectionsReader(this.remarks);
  private part: PartState | null = null;
  private note: NoteDraft | null = null;
  private noteCount = 0;
  private sliceStart = 0;
  private timewiseMeasureAttrs: Record<string, string> = {};
  private moveDuration: Fraction | null = null;
  private readonly durations = new Map<string, Fraction | null>();

  constructor(
    private readonly tokens: Tokens,
    private readonly limits: ReadLimits,
    readonly sites: SiteCollector | null,
    private readonly dropOwn: boolean,
  ) {}

  private partState(id: string): PartState {
    let p = this.parts.get(id);
    if (!p) {
      p = newPartState(id);
      this.parts.set(id, p);
    }
    return p;
  }

  open(name: string, attrs: Record<string, string>, depth: number, parent: string, selfClosing: boolean): void {
    const { tokens, sites } = this;
    if (sites) {
      const at = tokens.tagStart();
      sites.open(attrs.id, depth, at);
      if (name === "note" && depth === CONTENT_DEPTH) sites.noteOpen(at);
      else if (depth === CONTENT_DEPTH + 1 && this.note && parent === "note") sites.noteChildOpen(name, at);
    }
    if (depth === 1) {
      if (name === "score-partwise") this.layout = "partwise";
      else if (name === "score-timewise") this.layout = "timewise";
      else throw fail.wrongRoot(name);
      this.rootAttrs = attrString(attrs);
    } else if (depth === 2) {
      if (this.layout === "partwise" && name === "part") this.part = this.partState(attrs.id ?? "");
      else if (this.layout === "timewise" && name === "measure") this.timewiseMeasureAttrs = attrs;
      else this.sliceStart = tokens.tagStart();
    } else if (depth === 3 && this.part && this.layout === "partwise") {
      this.sliceStart = tokens.tagStart();
      if (name === "measure") {
        startMeasure(this.part, attrs);
        return;
      }
    } else if (depth === 3 && this.layout === "timewise" && name === "part") {
      const p = (this.part = this.partState(attrs.id ?? ""));
      p.out.push(`<measure${attrString(this.timewiseMeasureAttrs)}>`);
      this.sliceStart = selfClosing ? -1 : tokens.position;
      startMeasure(p, this.timewiseMeasureAttrs);
    }

    if (name === "note") {
      // Only a note of the measure itself; an unknown element may hold a look-alike.
      if (depth !== CONTENT_DEPTH || !this.part?.measure) return;
      if (++this.noteCount > this.limits.maxNotes) throw fail.tooManyNotes(this.limits.maxNotes);
      this.note = newDraft();
      return;
    }
    if (name === "fermata") {
      if (this.note && parent === "notations") this.note.marks.fermata = true;
      else this.directions.open(this.part, name, attrs, parent);
      return;
    }
    switch (STEP.get(name)) {
      case Step.Note:
        if (this.note) openInNote(this.note, name, attrs, parent);
        return;
      case Step.Attributes:
        this.attributes.open(name, attrs);
        return;
      case Step.Directions:
        this.directions.open(this.part, name, attrs, parent);
        return;
      case Step.Header:
        this.header.open(name, attrs, depth);
        return;
      case Step.Move:
        this.moveDuration = null;
        return;
    }
  }

  close(name: string, text: string, depth: number, parent: string): void {
    const { tokens, sites } = this;
    if (sites && depth > 3) {
      if (name === "other-notation" && this.note) sites.carrier(text);
      const own = sites.close(depth, tokens.position);
      if (own && this.dropOwn && this.part && this.sliceStart >= 0) {
        // Splice the element out of the normalized text: keep what came before, resume after it.
        this.part.out.push(tokens.source.slice(this.sliceStart, own[0]));
        this.sliceStart = own[1];
      }
    }
    if (depth === 2) {
      // A child of the root closes: a header element, a partwise part, or a timewise measure.
      if (this.layout === "partwise" && name === "part") this.part = null;
      else if (this.layout !== "timewise" || name !== "measure") this.head.push(tokens.source.slice(this.sliceStart, tokens.position));
      return;
    }
    const p = this.part;
    if (depth === 3 && p) {
      if (this.layout === "partwise") {
        if (name === "measure") endMeasure(p);
        p.out.push(tokens.source.slice(this.sliceStart, tokens.position), "\n");
      } else if (name === "part") {
        const end = tokens.tagStart();
        if (this.sliceStart >= 0) p.out.push(tokens.source.slice(this.sliceStart, end));
        p.out.push("</measure>\n");
        endMeasure(p);
        this.part = null;
      }
      return;
    }

    if (name === "note") {
      if (depth !== CONTENT_DEPTH) return;
      if (this.note && p?.measure) {
        const n = this.note;
        const closeAt = sites ? tokens.tagStart() : 0;
        const out = finishNote(p, p.measure, n);
        if (out) p.notes.push(out);
        sites?.noteClose(closeAt, n.chord, n.grace, n.staff, n.voice, out, out ? null : p.ties.lastContinued);
      }
      this.note = null;
      return;
    }
    if (name === "duration") {
      // A part repeats a handful of durations: each text is parsed once, its fraction shared.
      let d = this.durations.get(text);
      if (d === undefined) {
        d = parseDecimal(text);
        if (this.durations.size < 256) this.durations.set(text, d);
      }
      if (!d || d.num < 0) throw fail.duration(p?.measure?.number ?? "?", text.trim());
      if (parent === "note" && this.note) this.note.duration = d;
      else if (parent === "backup" || parent === "forward") this.moveDuration = d;
      return;
    }
    if (name === "other-dynamics") {
      if (parent === "dynamics") {
        if (this.note) this.note.marks.dynamics = text.trim();
        else this.directions.setDynamics(text.trim());
      }
      return;
    }
    switch (STEP.get(name)) {
      case Step.Note:
        if (this.note) closeInNote(this.note, name, text, parent);
        return;
      case Step.Attributes:
        this.attributes.close(p, name, text, parent);
        return;
      case Step.Directions:
        this.directions.close(p, name, text, parent);
        return;
      case Step.Header:
        this.header.close(name, text, parent);
        return;
      case Step.Move:
        if (p?.measure && this.moveDuration && depth === CONTENT_DEPTH) p.clock.move(this.moveDuration, name === "backup");
        return;
    }
    if (parent === "dynamics") {
      if (this.note) this.note.marks.dynamics = name;
      else this.directions.setDynamics(name);
    }
  }
}

export function readMusicXmlText(source: string, limits: ReadLimits, options: ReadOptions = {}): ReadResult {
  checkLooksLikeXml(source);
  checkProlog(source);
  const tokens = new Tokens(source, limits.maxDepth);
  const sites = options.sites ? new SiteCollector(options.sites) : null;
  const reader = new ScoreReader(tokens, limits, sites, !!options.dropOwn);
  tokens.run(reader);

  const states = orderParts(reader.parts, reader.header.partListOrder);
  if (states.length === 0) throw fail.noParts();
  return {
    score: buildModels(states, reader.header, reader.directions.tempoEvents, reader.remarks),
    partwiseXml: partwiseText(reader.rootAttrs, reader.head, states),
    ...(sites ? { sites: sites.result() } : {}),
  };
}
