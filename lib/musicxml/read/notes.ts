import { add, ZERO } from "../fraction";
import type { Fraction, Measure, Note, PhraseMarks } from "../model";
import { noteKey } from "../note-key";
import { isStep, makePitch } from "../pitch";
import type { VoiceClock } from "./voices";

/**
 * Step 4 of the reader: notes and ties. Collects one `<note>` element's content, then turns it
 * into a model note at the onset the voice clock gives: pitch, key, grace position, phrase
 * marks, and tie chains merged into their first note (a chain is one sounding note).
 */

export interface NoteDraft {
  grace: boolean;
  chord: boolean;
  cue: boolean;
  rest: boolean;
  unpitched: boolean;
  step: string;
  alter: number;
  octave: number | null;
  duration: Fraction | null;
  /** "" until a `<voice>` is read (see finishNote). */
  voice: string;
  staff: number;
  tieStart: boolean;
  tieStop: boolean;
  marks: PhraseMarks;
}

export function newMarks(): PhraseMarks {
  return { fermata: false, breathMark: false, caesura: false, slurStarts: [], slurStops: [], dynamics: null };
}

export function newDraft(): NoteDraft {
  return {
    grace: false,
    chord: false,
    cue: false,
    rest: false,
    unpitched: false,
    step: "",
    alter: 0,
    octave: null,
    duration: null,
    voice: "",
    staff: 1,
    tieStart: false,
    tieStop: false,
    marks: newMarks(),
  };
}

/** Reads the children of a `<note>` into its draft as they open (flags, ties, notations). */
export function openInNote(n: NoteDraft, name: string, attrs: Record<string, string>, parent: string): void {
  switch (name) {
    case "grace":
    case "chord":
    case "cue":
    case "rest":
    case "unpitched":
      if (parent === "note") n[name] = true;
      return;
    case "tie":
    case "tied":
      // Sound (`tie`) and notation (`tied`) both bind a chain.
      if (parent === "note" || parent === "notations") {
        const t = attrs.type;
        if (t === "start" || t === "continue") n.tieStart = true;
        if (t === "stop" || t === "continue") n.tieStop = true;
      }
      return;
    case "slur":
      if (parent === "notations") {
        const num = Number(attrs.number ?? "1") || 1;
        if (attrs.type === "start") n.marks.slurStarts.push(num);
        else if (attrs.type === "stop") n.marks.slurStops.push(num);
      }
      return;
    case "fermata":
      if (parent === "notations") n.marks.fermata = true;
      return;
    case "breath-mark":
      if (parent === "articulations") n.marks.breathMark = true;
      return;
    case "caesura":
      if (parent === "articulations") n.marks.caesura = true;
      return;
  }
}

/** Reads the text of a `<note>`'s pitch, voice and staff children as they close. */
export function closeInNote(n: NoteDraft, name: string, text: string, parent: string): void {
  switch (name) {
    case "step":
    case "display-step":
      // An unpitched note is keyed by its display position.
      n.step = text.trim();
      return;
    case "alter":
      if (parent === "pitch") n.alter = Number(text) || 0;
      return;
    case "octave":
    case "display-octave":
      if (parent === "pitch" || parent === "unpitched") {
        const o = parseInt(text, 10);
        n.octave = Number.isFinite(o) ? o : null;
      }
      return;
    case "voice":
      if (parent === "note") n.voice = text.trim() || "1";
      return;
    case "staff":
      if (parent === "note") n.staff = parseInt(text, 10) || 1;
      return;
  }
}

function mergeMarks(into: PhraseMarks, from: PhraseMarks) {
  into.fermata ||= from.fermata;
  into.breathMark ||= from.breathMark;
  into.caesura ||= from.caesura;
  into.slurStarts.push(...from.slurStarts);
  into.slurStops.push(...from.slurStops);
  into.dynamics ??= from.dynamics;
}

/** Tie chains still open in a part, and the last sounding note (a barline fermata lands on it). */
export class TieChains {
  private open: Note[] = [];
  lastSounding: Note | null = null;
  /** The chain the last tie continuation joined. */
  lastContinued: Note | null = null;

  /** The open chain this continuation belongs to: same pitch, voice and staff, else same pitch. */
  find(midi: number, voice: string, staff: number): number {
    const i = this.open.findIndex((t) => t.pitch!.midi === midi && t.voice === voice && t.staff === staff);
    return i >= 0 ? i : this.open.findIndex((t) => t.pitch!.midi === midi);
  }

  head(i: number): Note {
    return this.open[i];
  }

  close(i: number): void {
    this.open.splice(i, 1);
  }

  start(note: Note): void {
    // A new chain on this pitch replaces a stale one that never found its stop.
    const stale = this.open.findIndex((t) => t.pitch!.midi === note.pitch!.midi && t.voice === note.voice);
    if (stale >= 0) this.open.splice(stale, 1);
    this.open.push(note);
  }
}

/** What a note needs of its part (a part's state is one). */
export interface NotePart {
  id: string;
  clock: VoiceClock;
  ties: TieChains;
  /** Dynamics written before this note and not yet given to one. */
  pendingDynamics: string | null;
  /** Voice of the part's last note, which a chord tone that names none joins. */
  lastVoice: string;
}

/**
 * Places a finished note: returns the new model note, or null when it continued a tie chain
 * (its length and marks then went to the chain's first note).
 */
export function finishNote(ctx: NotePart, m: Measure, n: NoteDraft): Note | null {
  const { clock, ties } = ctx;
  // No `<voice>`: voice 1, except a chord tone, which sounds with the note it joins and so is of
  // its voice (the engraver reads it the same way).
  if (!n.voice) n.voice = n.chord ? ctx.lastVoice : "1";
  ctx.lastVoice = n.voice;
  const dur = n.grace || !n.duration ? ZERO : clock.toWholes(n.duration);
  const onset = clock.place(n.chord, n.grace, dur);
  const pitch = !n.rest && isStep(n.step) && n.octave !== null ? makePitch(n.step, n.unpitched ? 0 : n.alter, n.octave) : null;

  if (pitch && n.tieStop && !n.grace) {
    clock.mainNote(n.staff, n.voice, onset);
    // A tie continuation: the chain is one sounding note, keyed by its first note.
    const i = ties.find(pitch.midi, n.voice, n.staff);
    if (i >= 0) {
      const head = ties.head(i);
      head.duration = add(head.duration, dur);
      mergeMarks(head.marks, n.marks);
      head.tied = true;
      ties.lastContinued = head;
      if (!n.tieStart) ties.close(i);
      if (!n.chord) ties.lastSounding = head;
      return null;
    }
  }

  if (!n.grace) clock.mainNote(n.staff, n.voice, onset);
  const graceIndex = n.grace ? clock.graceIndex(n.staff, n.voice, onset, n.chord) : 0;
  if (pitch && !n.chord && ctx.pendingDynamics) {
    n.marks.dynamics ??= ctx.pendingDynamics;
    ctx.pendingDynamics = null;
  }
  const out: Note = {
    key: pitch ? noteKey({ partId: ctx.id, measureIndex: m.index, staff: n.staff, voice: n.voice, onset, midi: pitch.midi, graceIndex }) : "",
    partId: ctx.id,
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
  if (n.grace && pitch) clock.graceNote(out);
  if (pitch) {
    if (n.tieStart && !n.grace) ties.start(out);
    if (!n.chord && !n.grace) ties.lastSounding = out;
  }
  return out;
}

/**
 * Keys the measure's trailing grace notes (see VoiceClock.trailingGraces) at the note they
 * follow. Their onset stays where they are written: time order and seconds are unchanged.
 */
export function keyTrailingGraces(partId: string, m: Measure, clock: VoiceClock): void {
  for (const { note, after } of clock.trailingGraces()) {
    note.graceIndex = clock.graceIndex(note.staff, note.voice, after, note.isChord);
    note.key = noteKey({ partId, measureIndex: m.index, staff: note.staff, voice: note.voice, onset: after, midi: note.pitch!.midi, graceIndex: note.graceIndex });
  }
}
