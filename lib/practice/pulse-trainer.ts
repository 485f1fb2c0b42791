import { pulsesPerBeat, speedHz } from "@/lib/analysis/vibrato";

/**
 * The pulse trainer's ladder: metronome steps (beats per minute × pulses per beat) that climb
 * from a comfortable speed to the marked vibrato speed. The player first feels the pulses as an
 * easy subdivision of a steady beat, then regroups the same speed into the target subdivision,
 * then moves the metronome up a notch at a time until the pulses reach the marked speed.
 * Pure arithmetic: pulses per beat = speed (Hz) × 60 / tempo (see lib/analysis/vibrato).
 */

export type PulseStepKind = "settle" | "regroup" | "climb" | "target";

export interface PulseStep {
  kind: PulseStepKind;
  /** Metronome beats per minute (the beat of the part's tempo marking). */
  bpm: number;
  /** Clicks per beat: a whole number, so the metronome can sound them. */
  pulses: number;
  /** The resulting vibrato speed: pulses × bpm / 60. */
  hz: number;
}

export interface PulseLadderOptions {
  /** The marked speed to reach (Hz). */
  targetHz: number;
  /** The working tempo: the part's tempo or one the player chose (beats per minute). */
  bpm: number;
  /** Pulses per beat of the first, comfortable step (default 3). */
  startPulses?: number;
  /** The first step is at most this share of the target speed (default 0.8). */
  startShare?: number;
  /** Largest speed increase from one climbing step to the next, as a ratio (default 1.07). */
  maxStepRatio?: number;
}

/** The range of a mechanical metronome (common practice: 40–208 beats per minute). */
export const MIN_BPM = 40;
export const MAX_BPM = 208;
export const MIN_TARGET_HZ = 1;
export const MAX_TARGET_HZ = 12;
const MAX_PULSES = 8;
/**
 * Subdivisions a player feels evenly without counting: twos, threes and their doubles
 * (common practice: quintuplets and septuplets are hard to keep even). Others are used only when
 * none of these reaches the speed within the metronome's range.
 */
export const EASY_PULSES = [2, 3, 4, 6, 8];

/**
 * The final step: the easy subdivision whose tempo (within the metronome's range) lies closest
 * to the working tempo, at the tempo that gives exactly the target speed
 * (6 Hz near ♩ = 90 → 4 pulses at 90; 6 Hz near ♩ = 120 → 3 pulses at 120).
 */
export function targetStep(targetHz: number, bpm: number): PulseStep {
  const all = Array.from({ length: MAX_PULSES }, (_, i) => i + 1);
  return closest(targetHz, bpm, EASY_PULSES) ?? closest(targetHz, bpm, all) ?? fail();
}

function fail(): never {
  throw new RangeError("no metronome setting reaches that speed");
}

function closest(targetHz: number, bpm: number, choices: number[]): PulseStep | null {
  let best: PulseStep | null = null;
  for (const pulses of choices) {
    const tempo = (targetHz * 60) / pulses;
    if (tempo < MIN_BPM || tempo > MAX_BPM) continue;
    const step = { kind: "target" as const, bpm: tempo, pulses, hz: targetHz };
    if (!best || Math.abs(Math.log(tempo / bpm)) < Math.abs(Math.log(best.bpm / bpm))) best = step;
  }
  return best;
}

/** Rounds a tempo to one decimal, as a metronome shows it. */
const roundBpm = (bpm: number) => Math.round(bpm * 10) / 10;

function step(kind: PulseStepKind, bpm: number, pulses: number): PulseStep {
  const b = roundBpm(bpm);
  return { kind, bpm: b, pulses, hz: speedHz(pulses, b) };
}

/**
 * The ladder from a comfortable start to the target speed. An empty ladder means there is no
 * vibrato to train (a target of 0 Hz, "deliberately none"); a target outside 1–12 Hz or a tempo
 * outside the metronome's range is refused.
 */
export function pulseLadder(options: PulseLadderOptions): PulseStep[] {
  const { targetHz } = options;
  if (targetHz === 0) return [];
  if (!(targetHz >= MIN_TARGET_HZ && targetHz <= MAX_TARGET_HZ)) throw new RangeError(`target speed must be ${MIN_TARGET_HZ}–${MAX_TARGET_HZ} Hz`);
  const bpm = Math.min(MAX_BPM, Math.max(MIN_BPM, options.bpm));
  if (!Number.isFinite(bpm)) throw new RangeError("tempo must be a number");
  const share = options.startShare ?? 0.8;
  const maxRatio = options.maxStepRatio ?? 1.07;
  const final = targetStep(targetHz, bpm);
  const ceiling = share * targetHz;

  const steps: PulseStep[] = [];
  // Settle: the most pulses (up to the chosen start) at the working tempo that stay comfortably slow.
  let startPulses = Math.min(options.startPulses ?? 3, Math.floor(pulsesPerBeat(ceiling, bpm)));
  let startHz: number;
  if (startPulses >= 1) {
    steps.push(step("settle", bpm, startPulses));
    startHz = steps[0].hz;
  } else {
    startPulses = final.pulses;
    startHz = ceiling;
  }
  // Regroup the same speed into the target subdivision, unless it already is.
  let climbFrom = (startHz * 60) / final.pulses;
  if (climbFrom < MIN_BPM) climbFrom = MIN_BPM;
  const regroup = steps.length === 0 || startPulses !== final.pulses;
  if (regroup && climbFrom < final.bpm - 0.05) steps.push(step(steps.length ? "regroup" : "settle", climbFrom, final.pulses));

  // Climb in equal ratios, each no larger than maxRatio.
  const ratio = Math.max(1, final.bpm / climbFrom);
  const count = Math.max(1, Math.ceil(Math.log(ratio) / Math.log(maxRatio)));
  for (let i = 1; i < count; i++) steps.push(step("climb", climbFrom * Math.pow(ratio, i / count), final.pulses));
  steps.push({ ...final, bpm: roundBpm(final.bpm), hz: speedHz(final.pulses, roundBpm(final.bpm)) });
  return steps;
}
