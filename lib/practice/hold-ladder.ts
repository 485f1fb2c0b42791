/**
 * The hold ladder for one marked note: hold it long, then shorter and shorter until it fits its
 * written length, with a rest to breathe between holds. Each hold carries the number of vibrato
 * pulses it takes at the marked speed, so the player can count them.
 */

export interface HoldStep {
  /** Length of the hold in beats of the tempo. */
  beats: number;
  seconds: number;
  /** Vibrato pulses in the hold at the marked speed (0 when none is marked). */
  pulses: number;
  /** Rest after the hold, to breathe normally (0 after the last). */
  restSeconds: number;
}

export interface HoldLadderOptions {
  /** The note's written length in beats (tied notes included). */
  writtenBeats: number;
  /** Beats per minute. */
  bpm: number;
  /** The marked speed (Hz), for the pulse count; 0 for none. */
  speedHz?: number;
  /** The longest hold in beats (default 8). */
  longestBeats?: number;
  /** Holds longer than this are left out, unless it is the note's own length (default 12 s). */
  maxHoldSeconds?: number;
}

/** Hold lengths in beats, long to short; the ladder keeps those longer than the written note. */
export const HOLD_BEATS = [16, 12, 8, 6, 4, 3, 2, 1.5, 1, 0.75, 0.5];
/**
 * Rest between holds: as long as the hold just played, at least 4 s and at most 10 s
 * (common practice: breathe freely between long tones rather than chaining them).
 */
export const MIN_REST_SECONDS = 4;
export const MAX_REST_SECONDS = 10;

export function holdSeconds(beats: number, bpm: number): number {
  if (!(bpm > 0)) throw new RangeError("tempo must be positive");
  return (beats * 60) / bpm;
}

export function holdLadder(options: HoldLadderOptions): HoldStep[] {
  const { writtenBeats, bpm } = options;
  if (!(writtenBeats > 0)) throw new RangeError("the written length must be positive");
  if (!(bpm > 0)) throw new RangeError("tempo must be positive");
  const longest = options.longestBeats ?? 8;
  const maxHold = options.maxHoldSeconds ?? 12;
  const speed = options.speedHz ?? 0;
  const lengths = HOLD_BEATS.filter((b) => b <= longest && b > writtenBeats * 1.2 && holdSeconds(b, bpm) <= maxHold);
  lengths.push(writtenBeats);
  return lengths.map((beats, i) => {
    const seconds = holdSeconds(beats, bpm);
    const last = i === lengths.length - 1;
    return {
      beats,
      seconds,
      pulses: Math.round(speed * seconds * 10) / 10,
      restSeconds: last ? 0 : Math.min(MAX_REST_SECONDS, Math.max(MIN_REST_SECONDS, seconds)),
    };
  });
}

/** A written duration as a fraction of a whole note ("3/8") in beats of a quarter-note tempo. */
export function beatsOfDuration(duration: string, quartersPerBeat = 1): number {
  const m = /^(\d+)(?:\/(\d+))?$/.exec(duration.trim());
  if (!m) return Number.NaN;
  const whole = Number(m[1]) / Number(m[2] ?? 1);
  return (whole * 4) / quartersPerBeat;
}
