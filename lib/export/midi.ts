import { Midi } from "@tonejs/midi";
import type { MarkingValues } from "@/lib/markings/schema";
import type { Measure, Note, PartModel } from "@/lib/musicxml/model";
import { lineOf, otherLineOnly, twoPlayersOf, type Line } from "@/lib/musicxml/lines";
import { centsToSignedBend } from "./pitch-bend";
import { centsAt, EXPRESSION_STEADY, expressionAt, oscillates, vibratoStartSeconds, type NoteSpan } from "./vibrato-curve";

/**
 * A part as a Standard MIDI File: its notes at the written tempi, each marked note's vibrato as
 * pitch bend (range set by RPN 0 and stated in a text event) and its shape as expression (CC 11).
 */

export interface MidiOptions {
  /** Pitch-bend sensitivity, semitones (GM default 2, check values §7.1). */
  bendRangeSemitones?: number;
  /** General MIDI program, 0-based (73 = Flute). */
  program?: number;
  /**
   * The part's working tempo (♩ per minute): the part plays at it, every written tempo change
   * scaled by the same factor. Without it, the written tempos (120 where the part has none).
   */
  workingTempo?: number | null;
  /**
   * For a staff carrying two players: the player's line plays on the first track with its
   * vibrato; the other player's own notes (not the shared ones) play on a second track, quieter
   * and plain, so the line is heard against its partner and can be muted. Without it, or on a
   * staff with one player, every note plays on one track.
   */
  line?: Line;
}

/**
 * The part as played at the working tempo: every tempo × factor, so every time in seconds ÷ factor
 * (the model's times are at the written tempi).
 */
function atWorkingTempo(part: PartModel, workingTempo: number | null | undefined): PartModel {
  if (!workingTempo || !(workingTempo > 0)) return part;
  const first = part.measures.find((m) => m.tempo > 0)?.tempo ?? DEFAULT_TEMPO;
  const factor = workingTempo / first;
  if (factor === 1) return part;
  return {
    ...part,
    // A measure without a tempo of its own goes on at the one before (the first at `first`).
    measures: part.measures.map((m, i) => ({ ...m, startSeconds: m.startSeconds / factor, tempo: m.tempo > 0 ? m.tempo * factor : i === 0 ? first * factor : m.tempo })),
    notes: part.notes.map((n) => ({ ...n, onsetSeconds: n.onsetSeconds / factor, durationSeconds: n.durationSeconds / factor })),
  };
}

const PPQ = 480; // @tonejs/midi's fixed header resolution
/** Bend samples per vibrato cycle; a multiple of 4 so every peak and trough is sampled exactly. */
export const BEND_POINTS_PER_CYCLE = 32;
const CC_EXPRESSION = 11;
/** The RPN sequence takes ticks 0–2; bends come after it. */
const FIRST_BEND_TICK = 3;
const EXPRESSION_POINTS = 16;
const VELOCITY = 0.7;
/** The other line's level: half the player's line, audible without covering it. */
export const OTHER_LINE_VELOCITY = 0.35;
const DEFAULT_TEMPO = 120;

/** Controller value for @tonejs/midi, which writes floor(value · 127): aim at the middle of the step. */
function cc(value: number): number {
  return (value + 0.5) / 127;
}

/** Seconds → ticks through the part's tempo map (one tempo per measure, as the model gives it). */
function tempoMap(measures: Measure[]) {
  const segments: Array<{ seconds: number; ticks: number; bpm: number }> = [];
  for (const m of measures) {
    const prev = segments[segments.length - 1];
    const bpm = m.tempo > 0 ? m.tempo : (prev?.bpm ?? DEFAULT_TEMPO);
    if (!prev) {
      segments.push({ seconds: m.startSeconds, ticks: 0, bpm });
      continue;
    }
    if (bpm === prev.bpm) continue;
    const ticks = prev.ticks + ((m.startSeconds - prev.seconds) * prev.bpm * PPQ) / 60;
    segments.push({ seconds: m.startSeconds, ticks, bpm });
  }
  if (segments.length === 0) segments.push({ seconds: 0, ticks: 0, bpm: DEFAULT_TEMPO });
  const origin = segments[0].seconds;
  return {
    segments: segments.map((s) => ({ ...s, ticks: Math.round(s.ticks) })),
    toTicks(seconds: number): number {
      let seg = segments[0];
      for (const s of segments) if (s.seconds <= seconds) seg = s;
      const fromOrigin = seg === segments[0] ? seconds - origin : seconds - seg.seconds;
      return Math.max(0, Math.round(seg.ticks + (fromOrigin * seg.bpm * PPQ) / 60));
    },
  };
}

interface Sounding extends NoteSpan {
  note: Note;
  marking?: MarkingValues;
}

/** Grace notes sound just before their principal note, a thirty-second note each. */
function soundingNotes(part: PartModel, markings: Map<string, MarkingValues>): Sounding[] {
  const graceCount = new Map<string, number>();
  const slot = (n: Note) => `${n.measureIndex}|${n.staff}|${n.voice}|${n.onset.num}/${n.onset.den}`;
  for (const n of part.notes) if (n.isGrace) graceCount.set(slot(n), Math.max(graceCount.get(slot(n)) ?? 0, n.graceIndex));
  const tempoAt = (n: Note) => part.measures[n.measureIndex]?.tempo || DEFAULT_TEMPO;

  const out: Sounding[] = [];
  for (const note of part.notes) {
    if (note.isRest || !note.pitch) continue;
    let span: NoteSpan = { startSeconds: note.onsetSeconds, durationSeconds: note.durationSeconds };
    if (note.isGrace) {
      const graceSeconds = 60 / tempoAt(note) / 8;
      const before = (graceCount.get(slot(note)) ?? note.graceIndex) - note.graceIndex + 1;
      span = { startSeconds: Math.max(0, note.onsetSeconds - before * graceSeconds), durationSeconds: graceSeconds };
    }
    if (span.durationSeconds <= 0) continue;
    out.push({ ...span, note, marking: note.key ? markings.get(note.key) : undefined });
  }
  return out.sort((a, b) => a.startSeconds - b.startSeconds);
}

/** Renders one part as a Standard MIDI File (format 1: a tempo track and the part's track). */
export function renderMidi(
  part: PartModel,
  markings: Map<string, MarkingValues>,
  options: MidiOptions = {},
): Uint8Array {
  part = atWorkingTempo(part, options.workingTempo);
  const players = options.line ? twoPlayersOf(part) : null;
  const mine = players ? lineOf(part, options.line!, players) : part;
  const other = players ? otherLineOnly(part, options.line!, players) : [];
  const semitones = options.bendRangeSemitones ?? 2;
  const program = options.program ?? 73;
  if (!Number.isInteger(semitones) || semitones < 1 || semitones > 24) {
    throw new RangeError("The pitch-bend range must be a whole number of semitones from 1 to 24.");
  }

  const midi = new Midi();
  midi.header.name = part.name;
  const map = tempoMap(part.measures);
  for (const s of map.segments) midi.header.tempos.push({ ticks: s.ticks, bpm: s.bpm });
  midi.header.meta.push({
    type: "text",
    ticks: 0,
    text: `Pitch-bend range ±${semitones} semitones (RPN 0). Vibrato as pitch bend, shape as expression (CC 11).`,
  });
  midi.header.update();

  const track = midi.addTrack();
  track.name = part.name;
  track.channel = 0;
  track.instrument.number = program;

  // RPN 0 (pitch-bend sensitivity), then RPN null. @tonejs/midi orders controllers of one tick by
  // controller number, so each step of the sequence gets its own tick.
  track.addCC({ number: 101, value: cc(0), ticks: 0 });
  track.addCC({ number: 100, value: cc(0), ticks: 0 });
  track.addCC({ number: 6, value: cc(semitones), ticks: 1 });
  track.addCC({ number: 38, value: cc(0), ticks: 1 });
  track.addCC({ number: 101, value: cc(127), ticks: 2 });
  track.addCC({ number: 100, value: cc(127), ticks: 2 });
  track.addCC({ number: CC_EXPRESSION, value: cc(EXPRESSION_STEADY), ticks: 2 });

  let bentUntil = -Infinity;
  let expression = EXPRESSION_STEADY;
  for (const s of soundingNotes(mine, markings)) {
    const startTicks = map.toTicks(s.startSeconds);
    const endSeconds = s.startSeconds + s.durationSeconds;
    const endTicks = Math.max(startTicks + 1, map.toTicks(endSeconds));
    track.addNote({
      midi: s.note.pitch!.midi,
      ticks: startTicks,
      durationTicks: endTicks - startTicks,
      velocity: VELOCITY,
    });
    const m = s.marking;
    // One channel carries one bend: a marked note overlapping an earlier one (a chord) stays plain.
    const bends = m !== undefined && s.startSeconds >= bentUntil;
    if (bends) bentUntil = endSeconds;

    // Expression is written only at note starts and inside shaped notes, so no two values of it
    // share a tick (@tonejs/midi would order them arbitrarily).
    if (bends && m.shape !== "steady") {
      const vibStart = vibratoStartSeconds(m, s);
      for (let i = 0; i < EXPRESSION_POINTS; i++) {
        const u = i / EXPRESSION_POINTS;
        const ticks = i === 0 ? startTicks : map.toTicks(vibStart + u * (endSeconds - vibStart));
        if (ticks >= endTicks) break;
        expression = expressionAt(m.shape, u);
        track.addCC({ number: CC_EXPRESSION, value: cc(expression), ticks });
      }
    } else if (expression !== EXPRESSION_STEADY && !s.note.isChord) {
      expression = EXPRESSION_STEADY;
      track.addCC({ number: CC_EXPRESSION, value: cc(expression), ticks: startTicks });
    }

    if (bends && oscillates(m)) {
      // Sample in phase, not in time, so peaks land on samples whatever the speed.
      const vibStart = vibratoStartSeconds(m, s);
      const step = 1 / (m.speedHz * BEND_POINTS_PER_CYCLE);
      for (let t = vibStart; t < endSeconds; t += step) {
        const ticks = Math.max(FIRST_BEND_TICK, map.toTicks(t));
        if (ticks >= endTicks) break;
        track.addPitchBend({ ticks, value: centsToSignedBend(centsAt(m, s, t), semitones) });
      }
      track.addPitchBend({ ticks: Math.max(FIRST_BEND_TICK, endTicks), value: 0 });
    }
  }

  if (other.length > 0) {
    const partner = midi.addTrack();
    partner.name = `${part.name} (other line)`;
    partner.channel = 1;
    partner.instrument.number = program;
    for (const s of soundingNotes({ ...part, notes: other }, new Map())) {
      const startTicks = map.toTicks(s.startSeconds);
      const endTicks = Math.max(startTicks + 1, map.toTicks(s.startSeconds + s.durationSeconds));
      partner.addNote({ midi: s.note.pitch!.midi, ticks: startTicks, durationTicks: endTicks - startTicks, velocity: OTHER_LINE_VELOCITY });
    }
  }
  return midi.toArray();
}
