import type { MarkingValues } from "@/lib/markings/schema";

/**
 * The pitch curve of a marked note, shared by the MIDI export and the browser audition so both
 * render one marking the same way. Depth is the peak deviation (half peak-to-peak, check values
 * §5): centered swings ±depth around the pitch; top-on-pitch swings from the pitch down to
 * 2·depth below it, the same width with its top on the written note.
 */

/** A delayed vibrato starts after this share of the note (common practice: a straight attack). */
export const DELAYED_ONSET_FRACTION = 0.3;
/** Growing starts at, and fading ends at, this share of the full depth. */
export const ENVELOPE_FLOOR = 0.25;
/** Growing reaches full depth, and fading starts to fall, this far through the vibrato. */
export const ENVELOPE_RAMP = 0.75;

export type VibratoMarking = Pick<MarkingValues, "depthCents" | "speedHz" | "placement" | "onset" | "shape">;

export interface NoteSpan {
  startSeconds: number;
  durationSeconds: number;
}

/** Time the oscillation starts (seconds), by the marking's onset. */
export function vibratoStartSeconds(m: VibratoMarking, note: NoteSpan): number {
  return note.startSeconds + (m.onset === "delayed" ? DELAYED_ONSET_FRACTION * note.durationSeconds : 0);
}

/** Share of the full depth at progress u (0–1) through the vibrato. */
export function depthEnvelope(shape: VibratoMarking["shape"], u: number): number {
  const x = Math.min(1, Math.max(0, u));
  if (shape === "growing") return x >= ENVELOPE_RAMP ? 1 : ENVELOPE_FLOOR + ((1 - ENVELOPE_FLOOR) * x) / ENVELOPE_RAMP;
  if (shape === "fading") {
    const from = 1 - ENVELOPE_RAMP;
    return x <= from ? 1 : 1 - ((1 - ENVELOPE_FLOOR) * (x - from)) / ENVELOPE_RAMP;
  }
  return 1;
}

/** True when the marking moves the pitch at all. */
export function oscillates(m: VibratoMarking): boolean {
  return m.depthCents > 0 && m.speedHz > 0;
}

/** Deviation from the written pitch in cents at time t (seconds) inside the note. */
export function centsAt(m: VibratoMarking, note: NoteSpan, t: number): number {
  const start = vibratoStartSeconds(m, note);
  const end = note.startSeconds + note.durationSeconds;
  if (!oscillates(m) || t < start || t > end || end <= start) return 0;
  const env = depthEnvelope(m.shape, (t - start) / (end - start));
  const phase = 2 * Math.PI * m.speedHz * (t - start);
  // Both forms start at the written pitch, so the vibrato enters without a jump.
  return m.placement === "top-on-pitch"
    ? -m.depthCents * env * (1 - Math.cos(phase))
    : m.depthCents * env * Math.sin(phase);
}

/** Frequency (Hz) at time t for a note of frequency f0: f = f0 · 2^(cents/1200) (check values §8). */
export function frequencyAt(m: VibratoMarking, note: NoteSpan, f0: number, t: number): number {
  return f0 * 2 ** (centsAt(m, note, t) / 1200);
}

/** Equal temperament, A4 = 440 Hz (ISO 16; check values §8). */
export function midiToHz(midi: number): number {
  return 440 * 2 ** ((midi - 69) / 12);
}

/** Expression (CC 11, 0–127) by shape: a ramp that follows the depth envelope; steady holds. */
export const EXPRESSION_STEADY = 100;
export const EXPRESSION_LOW = 80;
export const EXPRESSION_HIGH = 120;
export function expressionAt(shape: VibratoMarking["shape"], u: number): number {
  if (shape === "steady") return EXPRESSION_STEADY;
  const share = (depthEnvelope(shape, u) - ENVELOPE_FLOOR) / (1 - ENVELOPE_FLOOR);
  return Math.round(EXPRESSION_LOW + (EXPRESSION_HIGH - EXPRESSION_LOW) * share);
}
