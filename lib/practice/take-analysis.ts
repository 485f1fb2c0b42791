import { PitchDetector } from "pitchy";
import { frequencyToCents, midiToHz } from "@/lib/analysis/vibrato";

/**
 * Take analysis: what a recorded take of one note measures. A McLeod pitch track (pitchy) →
 * the cents contour around the note's mean → speed from the contour's period (hysteresis zero
 * crossings of the detrended contour), depth as half its peak-to-peak extent (the median over
 * cycles, so one wobble does not decide it), and the fraction of frames that carried a tone.
 * Flute vibrato is mostly a swell of loudness with a small pitch movement, so the loudness
 * contour (frame level in dB) is measured the same way. Pure: samples in, numbers out.
 */

export interface TakeAnalysisOptions {
  /** Pitch window in samples; ≤ 1024 so the window does not smooth the extent away. */
  window?: number;
  /** Frame step in samples. */
  hop?: number;
  /** A frame is voiced when McLeod's clarity reaches this (0–1). */
  clarity?: number;
  /** Frames quieter than this RMS (full scale 1) are silence. */
  minRms?: number;
  /** Longest stretch of audio analysed, in seconds. */
  maxSeconds?: number;
}

export interface Oscillation {
  /** Pulses per second, or null when fewer than two whole cycles were found. */
  speedHz: number | null;
  /** Half the peak-to-peak extent: the median over cycles, or over the whole contour without cycles. */
  depth: number;
  /** Whole cycles between the first and last upward crossing. */
  cycles: number;
}

export interface ContourPoint {
  /** Seconds from the start of the take. */
  t: number;
  /** Cents around the note's mean pitch. */
  cents: number;
}

export type TakeStatus = "measured" | "no-tone";

export interface TakeAnalysis {
  status: TakeStatus;
  /** One plain sentence about the result. */
  message: string;
  /** Voiced frames / all frames of the take. */
  voicedFraction: number;
  /** Seconds of the steady tone that was measured. */
  toneSeconds: number;
  meanHz: number | null;
  /** Mean pitch against the note's equal-tempered pitch (A4 = 440 Hz), in cents. */
  offsetCents: number | null;
  speedHz: number | null;
  depthCents: number | null;
  cycles: number;
  /** Loudness pulsation: speed and half peak-to-peak in dB. */
  loudnessSpeedHz: number | null;
  loudnessDepthDb: number | null;
  /** The measured tone's pitch contour (for the plot). */
  contour: ContourPoint[];
}

export const DEFAULTS = { window: 1024, hop: 128, clarity: 0.9, minRms: 0.003, maxSeconds: 60 } as const;
/** The lowest tone counted (below the alto flute's C3, 131 Hz) and the highest (piccolo C8 ≈ 4186 Hz). */
const MIN_HZ = 100;
const MAX_HZ = 4500;
/** Gaps up to this many frames inside a tone are bridged (a flicker of the tracker, not a breath). */
const MAX_GAP_FRAMES = 3;
/** A frame further than this from the tone's median is an octave slip or a neighbour note. */
const OUTLIER_CENTS = 250;
/** The shortest tone measured: about two cycles of slow (5 Hz) vibrato plus margins. */
export const MIN_TONE_SECONDS = 0.4;

interface Frame {
  t: number;
  hz: number | null;
  rms: number;
}

function trackPitch(samples: Float32Array, sampleRate: number, o: Required<TakeAnalysisOptions>): Frame[] {
  const detector = PitchDetector.forFloat32Array(o.window);
  const frames: Frame[] = [];
  const end = Math.min(samples.length, Math.round(o.maxSeconds * sampleRate));
  for (let start = 0; start + o.window <= end; start += o.hop) {
    const frame = samples.subarray(start, start + o.window);
    let sum = 0;
    for (let i = 0; i < frame.length; i++) sum += frame[i] * frame[i];
    const rms = Math.sqrt(sum / frame.length);
    let hz: number | null = null;
    if (rms >= o.minRms) {
      const [pitch, clarity] = detector.findPitch(frame, sampleRate);
      if (clarity >= o.clarity && pitch >= MIN_HZ && pitch <= MAX_HZ) hz = pitch;
    }
    frames.push({ t: (start + o.window / 2) / sampleRate, hz, rms });
  }
  return frames;
}

/** The longest run of voiced frames, bridging short gaps. Returns [first, last] indices. */
function longestTone(frames: Frame[]): [number, number] | null {
  let best: [number, number] | null = null;
  let runStart = -1;
  let lastVoiced = -1;
  const close = () => {
    if (runStart >= 0 && (!best || lastVoiced - runStart > best[1] - best[0])) best = [runStart, lastVoiced];
  };
  frames.forEach((f, i) => {
    if (f.hz === null) return;
    if (runStart < 0 || i - lastVoiced - 1 > MAX_GAP_FRAMES) {
      close();
      runStart = i;
    }
    lastVoiced = i;
  });
  close();
  return best;
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

function quantile(sorted: number[], q: number): number {
  const pos = (sorted.length - 1) * q;
  const lo = Math.floor(pos);
  const hi = Math.ceil(pos);
  return sorted[lo] + (sorted[hi] - sorted[lo]) * (pos - lo);
}

/** Fills nulls by linear interpolation between their neighbours (ends take the nearest value). */
function bridge(values: (number | null)[]): number[] {
  const out = new Array<number>(values.length);
  let prev = -1;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (v === null) continue;
    for (let j = prev + 1; j < i; j++) out[j] = prev < 0 ? v : values[prev]! + ((v - values[prev]!) * (j - prev)) / (i - prev);
    out[i] = v;
    prev = i;
  }
  for (let j = prev + 1; j < values.length; j++) out[j] = prev < 0 ? 0 : values[prev]!;
  return out;
}

/** Removes the least-squares line, so a slow drift is not read as vibrato. */
export function detrend(times: number[], values: number[]): number[] {
  const n = values.length;
  if (n < 2) return values.slice();
  const mt = times.reduce((a, b) => a + b, 0) / n;
  const mv = values.reduce((a, b) => a + b, 0) / n;
  let num = 0;
  let den = 0;
  for (let i = 0; i < n; i++) {
    num += (times[i] - mt) * (values[i] - mv);
    den += (times[i] - mt) ** 2;
  }
  const slope = den > 0 ? num / den : 0;
  return values.map((v, i) => v - mv - slope * (times[i] - mt));
}

/**
 * Centred mean over exactly `width` frames (a real number) of the contour joined by straight
 * lines: over one whole period it cancels the pulse and keeps any drift. Returns null where the
 * window does not fit inside the contour.
 */
export function periodMean(values: number[], width: number): (number | null)[] {
  const n = values.length;
  // cum[k]: the integral (trapezoids, one frame = 1) from frame 0 to frame k.
  const cum = new Array<number>(n).fill(0);
  for (let k = 1; k < n; k++) cum[k] = cum[k - 1] + (values[k - 1] + values[k]) / 2;
  const integral = (u: number) => {
    const k = Math.min(n - 2, Math.floor(u));
    const f = u - k;
    return cum[k] + f * values[k] + (f * f * (values[k + 1] - values[k])) / 2;
  };
  const half = width / 2;
  return values.map((_, i) => (i - half < 0 || i + half > n - 1 ? null : (integral(i + half) - integral(i - half)) / width));
}

interface Crossings {
  /** Upward zero crossings (time, and the first frame after it). */
  up: { t: number; i: number }[];
}

/**
 * Upward crossings with hysteresis: the contour must dip below −h and rise above +h between
 * two crossings, so tracker jitter on a plain tone makes no cycles.
 */
function upwardCrossings(times: number[], x: number[], h: number): Crossings {
  const up: Crossings["up"] = [];
  let low = false;
  let candidate: { t: number; i: number } | null = null;
  for (let i = 1; i < x.length; i++) {
    if (x[i - 1] < 0 && x[i] >= 0) {
      const frac = -x[i - 1] / (x[i] - x[i - 1]);
      candidate = { t: times[i - 1] + frac * (times[i] - times[i - 1]), i };
    }
    if (x[i] < -h) low = true;
    else if (low && x[i] > h && candidate) {
      up.push(candidate);
      low = false;
      candidate = null;
    }
  }
  return { up };
}

function cycleResult(times: number[], x: number[], h: number): Oscillation & { halfExtents: number[] } {
  const { up } = upwardCrossings(times, x, h);
  const cycles = Math.max(0, up.length - 1);
  const halfExtents: number[] = [];
  for (let k = 0; k < cycles; k++) {
    let lo = Infinity;
    let hi = -Infinity;
    for (let i = up[k].i; i < up[k + 1].i; i++) {
      lo = Math.min(lo, x[i]);
      hi = Math.max(hi, x[i]);
    }
    halfExtents.push((hi - lo) / 2);
  }
  const speedHz = cycles >= 2 ? cycles / (up[cycles].t - up[0].t) : null;
  return { speedHz, depth: cycles >= 2 ? median(halfExtents) : 0, cycles, halfExtents };
}

/**
 * Speed and depth of a pulsating contour (frames evenly spaced in time). A first pass on the
 * contour without its straight-line trend finds the period; the second measures the contour
 * minus its mean over one period, which removes any slow drift (a note sagging or rising)
 * without biasing where the zero crossings fall.
 */
export function measureOscillation(times: number[], values: number[], minHysteresis: number): Oscillation {
  const x = detrend(times, values);
  if (x.length < 4) return { speedHz: null, depth: 0, cycles: 0 };
  const sorted = [...x].sort((a, b) => a - b);
  const h = Math.max(minHysteresis, 0.3 * ((quantile(sorted, 0.9) - quantile(sorted, 0.1)) / 2));
  const first = cycleResult(times, x, h);
  if (first.speedHz === null) {
    return { speedHz: null, depth: (quantile(sorted, 0.95) - quantile(sorted, 0.05)) / 2, cycles: first.cycles };
  }
  const step = (times.at(-1)! - times[0]) / (times.length - 1);
  const means = periodMean(values, 1 / first.speedHz / step);
  const inner = means.flatMap((m, i) => (m === null ? [] : [{ t: times[i], v: values[i] - m }]));
  const second = cycleResult(inner.map((p) => p.t), inner.map((p) => p.v), h);
  const best = second.speedHz !== null ? second : first;
  return { speedHz: best.speedHz, depth: best.depth, cycles: best.cycles };
}

const NO_TONE = "No steady tone was found. Play the note for a few seconds, close enough to the microphone.";

/**
 * Measures a take of one note.
 * @param samples mono PCM, full scale ±1
 * @param sampleRate samples per second
 * @param expectedMidi the note's written pitch (MIDI number, A4 = 69)
 */
export function analyseTake(samples: Float32Array, sampleRate: number, expectedMidi: number, options: TakeAnalysisOptions = {}): TakeAnalysis {
  const o = { ...DEFAULTS, ...options };
  if (o.window > 1024) throw new RangeError("a pitch window over 1024 samples smooths the vibrato's extent");
  if (!(sampleRate > 0)) throw new RangeError("sample rate must be positive");
  const frames = trackPitch(samples, sampleRate, o);
  const voiced = frames.filter((f) => f.hz !== null).length;
  const voicedFraction = frames.length ? voiced / frames.length : 0;
  const empty: TakeAnalysis = {
    status: "no-tone", message: NO_TONE, voicedFraction, toneSeconds: 0, meanHz: null, offsetCents: null, speedHz: null,
    depthCents: null, cycles: 0, loudnessSpeedHz: null, loudnessDepthDb: null, contour: [],
  };
  const run = longestTone(frames);
  if (!run) return empty;
  const tone = frames.slice(run[0], run[1] + 1);
  const toneSeconds = tone.at(-1)!.t - tone[0].t;
  if (toneSeconds < MIN_TONE_SECONDS) return { ...empty, toneSeconds };

  // Cents against the tone's median first, to drop octave slips; then around the tone's mean.
  const ref = median(tone.filter((f) => f.hz !== null).map((f) => f.hz!));
  const raw = bridge(tone.map((f) => (f.hz !== null && Math.abs(frequencyToCents(ref, f.hz)) <= OUTLIER_CENTS ? frequencyToCents(ref, f.hz) : null)));
  const meanCents = raw.reduce((a, b) => a + b, 0) / raw.length;
  const meanHz = ref * Math.pow(2, meanCents / 1200);
  const cents = raw.map((c) => c - meanCents);
  const times = tone.map((f) => f.t);

  const pitch = measureOscillation(times, cents, 2);
  const levels = tone.map((f) => 20 * Math.log10(Math.max(f.rms, 1e-9)));
  const loudness = measureOscillation(times, levels, 0.5);

  const offsetCents = frequencyToCents(midiToHz(expectedMidi), meanHz);
  return {
    status: "measured",
    message: pitch.speedHz === null ? "A steady tone without a regular pitch pulse." : `A pitch pulse of ${pitch.speedHz.toFixed(1)} Hz.`,
    voicedFraction,
    toneSeconds,
    meanHz,
    offsetCents,
    speedHz: pitch.speedHz,
    depthCents: pitch.depth,
    cycles: pitch.cycles,
    loudnessSpeedHz: loudness.speedHz,
    loudnessDepthDb: loudness.speedHz === null ? null : loudness.depth,
    contour: times.map((t, i) => ({ t, cents: cents[i] })),
  };
}
