import type { MarkingValues } from "@/lib/markings/schema";
import { frequencyAt, midiToHz, oscillates, type VibratoMarking } from "./vibrato-curve";

/**
 * Plays notes in the browser with a soft, flute-like synthesized tone carrying the marked vibrato
 * as frequency modulation. Audio starts quiet and ramps in (the product's caution: audition starts
 * quiet; the UI recommends moderate volume on headphones). Web Audio only, no React.
 */

export interface AuditionNote {
  midi: number;
  startSeconds: number;
  durationSeconds: number;
  marking?: MarkingValues;
}

export interface AuditionOptions {
  /** Master level 0–1; kept low by default. */
  volume?: number;
}

export interface AuditionHandle {
  /** Fades out in about 50 ms and releases every node. Safe to call more than once. */
  stop(): void;
  /** Resolves when the last note has ended or stop() has run. */
  finished: Promise<void>;
}

export const DEFAULT_VOLUME = 0.15;
export const MAX_VOLUME = 0.6;
/** How long the master level takes to reach the chosen volume. */
export const RAMP_IN_SECONDS = 0.3;
export const STOP_FADE_SECONDS = 0.05;
/** Frequency-curve points per second handed to Web Audio (≥ 20 per cycle up to 10 Hz vibrato). */
export const CONTROL_RATE = 200;
const ATTACK_SECONDS = 0.06;
const RELEASE_SECONDS = 0.08;
const LEAD_IN_SECONDS = 0.05;
/** Sine with a little 2nd and 3rd harmonic: a plain, soft, flute-like colour. */
export const HARMONICS = [1, 0.22, 0.08];

/**
 * The note's frequency (Hz) sampled at `rate` points per second from its start to its end, with
 * the marking's vibrato (speed, depth, placement, onset, shape); constant when unmarked.
 */
export function frequencyCurve(
  f0: number,
  durationSeconds: number,
  marking: VibratoMarking | undefined,
  rate = CONTROL_RATE,
): Float32Array {
  const points = Math.max(2, Math.ceil(durationSeconds * rate) + 1);
  const curve = new Float32Array(points);
  const span = { startSeconds: 0, durationSeconds };
  for (let i = 0; i < points; i++) {
    const t = (i / (points - 1)) * durationSeconds;
    curve[i] = marking ? frequencyAt(marking, span, f0, t) : f0;
  }
  return curve;
}

export interface PlannedNote {
  /** Seconds after the first note's start. */
  at: number;
  durationSeconds: number;
  f0: number;
  /** null when the pitch stays put. */
  curve: Float32Array | null;
}

/** Pure schedule of an audition: times relative to the first note, one frequency curve each. */
export function planAudition(notes: AuditionNote[]): PlannedNote[] {
  const playable = notes.filter((n) => n.durationSeconds > 0);
  if (playable.length === 0) return [];
  const origin = Math.min(...playable.map((n) => n.startSeconds));
  return playable.map((n) => {
    const f0 = midiToHz(n.midi);
    const moves = n.marking !== undefined && oscillates(n.marking);
    return {
      at: n.startSeconds - origin,
      durationSeconds: n.durationSeconds,
      f0,
      curve: moves ? frequencyCurve(f0, n.durationSeconds, n.marking) : null,
    };
  });
}

/** The master level for a requested volume: clamped, never loud. */
export function masterLevel(volume: number | undefined): number {
  const v = volume ?? DEFAULT_VOLUME;
  return Number.isFinite(v) ? Math.min(MAX_VOLUME, Math.max(0, v)) : DEFAULT_VOLUME;
}

/** Starts playing `notes` on `ctx` now; see {@link AuditionHandle}. */
export function auditionNotes(ctx: AudioContext, notes: AuditionNote[], options: AuditionOptions = {}): AuditionHandle {
  const plan = planAudition(notes);
  const level = masterLevel(options.volume);
  const t0 = ctx.currentTime + LEAD_IN_SECONDS;

  const master = ctx.createGain();
  master.gain.setValueAtTime(0, ctx.currentTime);
  master.gain.linearRampToValueAtTime(level, t0 + RAMP_IN_SECONDS);
  master.connect(ctx.destination);

  const real = new Float32Array(HARMONICS.length + 1);
  const imag = new Float32Array(HARMONICS.length + 1);
  HARMONICS.forEach((a, i) => (imag[i + 1] = a));
  const wave = ctx.createPeriodicWave(real, imag);

  const oscillators: OscillatorNode[] = [];
  let end = t0;
  for (const n of plan) {
    const start = t0 + n.at;
    const stopAt = start + n.durationSeconds + RELEASE_SECONDS;
    end = Math.max(end, stopAt);
    const osc = ctx.createOscillator();
    osc.setPeriodicWave(wave);
    if (n.curve) osc.frequency.setValueCurveAtTime(n.curve, start, n.durationSeconds);
    else osc.frequency.setValueAtTime(n.f0, start);

    const env = ctx.createGain();
    env.gain.setValueAtTime(0, start);
    env.gain.linearRampToValueAtTime(1, start + Math.min(ATTACK_SECONDS, n.durationSeconds / 2));
    env.gain.setValueAtTime(1, start + n.durationSeconds);
    env.gain.linearRampToValueAtTime(0, stopAt);
    osc.connect(env).connect(master);
    osc.start(start);
    osc.stop(stopAt + 0.01);
    oscillators.push(osc);
  }

  let settle: () => void = () => {};
  const finished = new Promise<void>((resolve) => (settle = resolve));
  let stopped = false;
  const release = () => {
    for (const o of oscillators) o.disconnect();
    master.disconnect();
    settle();
  };
  const timer = setTimeout(() => {
    if (!stopped) {
      stopped = true;
      release();
    }
  }, (end - ctx.currentTime + 0.05) * 1000);

  return {
    finished,
    stop() {
      if (stopped) return;
      stopped = true;
      clearTimeout(timer);
      const now = ctx.currentTime;
      master.gain.cancelScheduledValues(now);
      master.gain.setValueAtTime(master.gain.value, now);
      master.gain.linearRampToValueAtTime(0, now + STOP_FADE_SECONDS);
      for (const o of oscillators) {
        try {
          o.stop(now + STOP_FADE_SECONDS + 0.01);
        } catch {
          // Already stopped on its own schedule.
        }
      }
      setTimeout(release, (STOP_FADE_SECONDS + 0.03) * 1000);
    },
  };
}
