import { masterLevel, RAMP_IN_SECONDS, STOP_FADE_SECONDS } from "@/lib/export/audition";

/**
 * The pulse trainer's metronome: clicks at every pulse, the beat's click higher and louder.
 * Scheduling is pure (click times); the Web Audio part schedules a little ahead on a timer, so
 * clicks stay on time even when the page is busy. Audio ramps in from silence and stays quiet
 * (the product's caution), using the audition's volume limits.
 */

export interface Click {
  /** Seconds on the audio clock. */
  time: number;
  /** The first pulse of a beat. */
  accent: boolean;
  /** Pulse number from the start (0-based). */
  index: number;
}

/** The clicks whose time falls in [from, to), for pulses spaced 60 / (bpm × pulses) s from `origin`. */
export function clicksBetween(o: { bpm: number; pulses: number; origin: number; from: number; to: number }): Click[] {
  if (!(o.bpm > 0) || !(o.pulses >= 1)) throw new RangeError("tempo and pulses must be positive");
  const spacing = 60 / (o.bpm * o.pulses);
  const first = Math.max(0, Math.ceil((o.from - o.origin) / spacing - 1e-9));
  const out: Click[] = [];
  for (let k = first; o.origin + k * spacing < o.to - 1e-9; k++) {
    out.push({ time: o.origin + k * spacing, accent: k % o.pulses === 0, index: k });
  }
  return out;
}

export interface MetronomeHandle {
  stop(): void;
  setVolume(volume: number): void;
}

const LOOKAHEAD_SECONDS = 0.15;
const TIMER_MS = 30;
const CLICK_SECONDS = 0.03;

/** Starts clicking on `ctx`; `onPulse` is told each pulse index as it is scheduled. */
export function startMetronome(ctx: AudioContext, o: { bpm: number; pulses: number; volume?: number }): MetronomeHandle {
  const master = ctx.createGain();
  const origin = ctx.currentTime + 0.1;
  master.gain.setValueAtTime(0, ctx.currentTime);
  master.gain.linearRampToValueAtTime(masterLevel(o.volume), origin + RAMP_IN_SECONDS);
  master.connect(ctx.destination);

  let scheduledUntil = origin;
  const schedule = () => {
    const to = ctx.currentTime + LOOKAHEAD_SECONDS;
    for (const c of clicksBetween({ bpm: o.bpm, pulses: o.pulses, origin, from: scheduledUntil, to })) {
      const osc = ctx.createOscillator();
      osc.frequency.value = c.accent ? 1568 : 1046.5;
      const env = ctx.createGain();
      const peak = c.accent ? 1 : 0.45;
      env.gain.setValueAtTime(0, c.time);
      env.gain.linearRampToValueAtTime(peak, c.time + 0.002);
      env.gain.exponentialRampToValueAtTime(0.001, c.time + CLICK_SECONDS);
      osc.connect(env).connect(master);
      osc.start(c.time);
      osc.stop(c.time + CLICK_SECONDS + 0.01);
      osc.onended = () => env.disconnect();
    }
    scheduledUntil = Math.max(scheduledUntil, to);
  };
  schedule();
  const timer = setInterval(schedule, TIMER_MS);
  let stopped = false;
  return {
    setVolume(volume) {
      if (stopped) return;
      master.gain.cancelScheduledValues(ctx.currentTime);
      master.gain.setTargetAtTime(masterLevel(volume), ctx.currentTime, 0.05);
    },
    stop() {
      if (stopped) return;
      stopped = true;
      clearInterval(timer);
      const now = ctx.currentTime;
      master.gain.cancelScheduledValues(now);
      master.gain.setValueAtTime(master.gain.value, now);
      master.gain.linearRampToValueAtTime(0, now + STOP_FADE_SECONDS);
      setTimeout(() => master.disconnect(), (STOP_FADE_SECONDS + LOOKAHEAD_SECONDS + 0.05) * 1000);
    },
  };
}
