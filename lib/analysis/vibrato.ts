/**
 * Vibrato arithmetic shared by the workspace, the exports and the practice tools.
 * Equal temperament with A4 = 440 Hz (ISO 16:1975); MIDI pitch bend is 14-bit, centre 8192
 * (MIDI 1.0), with a bend range that defaults to ±2 semitones (General MIDI) and must be stated
 * in any file written with it.
 */

export const A4_HZ = 440;
export const A4_MIDI = 69;
export const BEND_CENTRE = 8192;
export const BEND_MAX = 16383;
export const DEFAULT_BEND_RANGE_SEMITONES = 2;

/** Quarter notes per beat for a metronome beat unit (dotted units included). */
export type BeatUnit = "whole" | "half" | "quarter" | "eighth" | "16th" | "dotted-half" | "dotted-quarter" | "dotted-eighth";

const QUARTERS_PER_BEAT: Record<BeatUnit, number> = {
  whole: 4,
  half: 2,
  quarter: 1,
  eighth: 0.5,
  "16th": 0.25,
  "dotted-half": 3,
  "dotted-quarter": 1.5,
  "dotted-eighth": 0.75,
};

export function quartersPerBeat(unit: BeatUnit): number {
  return QUARTERS_PER_BEAT[unit];
}

/**
 * Pulses per beat = speed (Hz) × 60 / tempo, the tempo counted in the metronome's own beat unit
 * (6 Hz at ♩ = 90 → 4 pulses per quarter). The beat unit is recorded so that callers holding
 * a tempo in quarter notes can convert it: beats per minute = quarters per minute / quarters per beat.
 */
export function pulsesPerBeat(speedHz: number, beatsPerMinute: number): number {
  // A missing or broken tempo is refused, never turned into Infinity or NaN: callers without a
  // tempo (a part with no metronome marking) show no pulse count at all.
  if (!(beatsPerMinute > 0) || !Number.isFinite(beatsPerMinute)) throw new RangeError("tempo must be a positive number");
  return (speedHz * 60) / beatsPerMinute;
}

/** Speed in Hz of a number of pulses per beat at a tempo in that beat unit (4 at ♩ = 96 → 6.4 Hz). */
export function speedHz(pulses: number, beatsPerMinute: number): number {
  if (!(beatsPerMinute > 0) || !Number.isFinite(beatsPerMinute)) throw new RangeError("tempo must be a positive number");
  return (pulses * beatsPerMinute) / 60;
}

/** Beats per minute in a beat unit, from a tempo in quarter notes per minute (MusicXML `sound tempo`). */
export function beatsPerMinute(quartersPerMinute: number, unit: BeatUnit = "quarter"): number {
  return quartersPerMinute / QUARTERS_PER_BEAT[unit];
}

/** f = f0 · 2^(cents / 1200). */
export function centsToFrequency(f0: number, cents: number): number {
  return f0 * Math.pow(2, cents / 1200);
}

/** Cents from f1 to f2: 1200 · log2(f2 / f1). */
export function frequencyToCents(f1: number, f2: number): number {
  return 1200 * Math.log2(f2 / f1);
}

/** Equal temperament, A4 = 440 Hz: f = 440 · 2^((m − 69) / 12). */
export function midiToHz(midi: number, a4 = A4_HZ): number {
  return a4 * Math.pow(2, (midi - A4_MIDI) / 12);
}

/** Fractional MIDI number of a frequency: m = 69 + 12 · log2(f / 440). */
export function hzToMidi(hz: number, a4 = A4_HZ): number {
  return A4_MIDI + 12 * Math.log2(hz / a4);
}

/**
 * Cents → 14-bit pitch-bend value at a bend range of ±`rangeSemitones`:
 * clamp(8192 + round(cents / (100 · range) · 8192), 0, 16383). At ±2 semitones one cent is
 * 40.96 units; +200 c would be 16384 and is clamped to 16383.
 */
export function centsToBend(cents: number, rangeSemitones = DEFAULT_BEND_RANGE_SEMITONES): number {
  if (!(rangeSemitones > 0)) throw new RangeError("bend range must be positive");
  const v = BEND_CENTRE + Math.round((cents / (100 * rangeSemitones)) * BEND_CENTRE);
  return Math.max(0, Math.min(BEND_MAX, v));
}

/** 14-bit pitch-bend value → cents at a bend range: (v − 8192) / 8192 · 100 · range. */
export function bendToCents(value: number, rangeSemitones = DEFAULT_BEND_RANGE_SEMITONES): number {
  return ((value - BEND_CENTRE) / BEND_CENTRE) * 100 * rangeSemitones;
}

/** The two 7-bit data bytes of a pitch-bend message, least significant first. */
export function bendBytes(value: number): { lsb: number; msb: number } {
  return { lsb: value & 0x7f, msb: (value >> 7) & 0x7f };
}
