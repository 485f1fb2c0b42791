import { afterEach, describe, expect, it, vi } from "vitest";
import { DEFAULT_MARKING, type MarkingValues } from "@/lib/markings/schema";
import {
  auditionNotes,
  DEFAULT_VOLUME,
  frequencyCurve,
  masterLevel,
  MAX_VOLUME,
  planAudition,
  STOP_FADE_SECONDS,
} from "./audition";
import { DELAYED_ONSET_FRACTION, midiToHz } from "./vibrato-curve";

const base: MarkingValues = DEFAULT_MARKING;

const A4 = 440;
const cents = (f: number, f0: number) => 1200 * Math.log2(f / f0);
const max = (a: Float32Array) => a.reduce((m, v) => Math.max(m, v), -Infinity);
const min = (a: Float32Array) => a.reduce((m, v) => Math.min(m, v), Infinity);

describe("audition frequency curve", () => {
  it("puts equal temperament at A4 = 440 Hz", () => {
    // ISO 16 / check values §8: f = 440 · 2^((m − 69)/12); C4 = 261.6256 Hz, B♭4 = 466.1638 Hz.
    expect(midiToHz(69)).toBe(440);
    expect(midiToHz(60)).toBeCloseTo(261.6256, 4);
    expect(midiToHz(70)).toBeCloseTo(466.1638, 4);
  });

  it("swings a centered vibrato between f0·2^(±depth/1200)", () => {
    const curve = frequencyCurve(A4, 2, { ...base, depthCents: 20 });
    // check values §5: ±20 cents at A4 spans 434.946–445.113 Hz.
    expect(max(curve)).toBeCloseTo(445.113, 1);
    expect(min(curve)).toBeCloseTo(434.946, 1);
    expect(cents(max(curve), A4)).toBeCloseTo(20, 1);
    expect(cents(min(curve), A4)).toBeCloseTo(-20, 1);
    const wide = frequencyCurve(A4, 2, { ...base, depthCents: 50 });
    // check values §5: ±50 cents spans 427.474–452.893 Hz.
    expect(max(wide)).toBeCloseTo(452.893, 1);
    expect(min(wide)).toBeCloseTo(427.474, 1);
  });

  it("keeps the top of a top-on-pitch vibrato on f0 and swings the same width below it", () => {
    const curve = frequencyCurve(A4, 2, { ...base, depthCents: 20, placement: "top-on-pitch" });
    expect(max(curve)).toBeCloseTo(A4, 3);
    expect(cents(min(curve), A4)).toBeCloseTo(-40, 1);
  });

  it("oscillates at the marked speed", () => {
    const rate = 1000;
    const curve = frequencyCurve(A4, 3, { ...base, speedHz: 6.5 }, rate);
    const ups: number[] = [];
    for (let i = 1; i < curve.length; i++) {
      if (curve[i - 1] < A4 && curve[i] >= A4) ups.push((i - (curve[i] - A4) / (curve[i] - curve[i - 1])) / rate);
    }
    const speed = (ups.length - 1) / (ups[ups.length - 1] - ups[0]);
    expect(Math.abs(speed - 6.5) / 6.5).toBeLessThan(0.02);
  });

  it("holds the pitch through the first part of a delayed vibrato", () => {
    const rate = 200;
    const curve = frequencyCurve(A4, 2, { ...base, onset: "delayed" }, rate);
    const until = Math.floor(DELAYED_ONSET_FRACTION * 2 * rate);
    expect(curve.slice(0, until).every((f) => f === A4)).toBe(true);
    expect(max(curve.slice(until))).toBeGreaterThan(A4 + 1);
  });

  it("grows and fades the depth", () => {
    const grow = frequencyCurve(A4, 2, { ...base, shape: "growing" });
    const half = Math.floor(grow.length / 4);
    expect(max(grow.slice(0, half)) - A4).toBeLessThan(0.6 * (max(grow.slice(-half)) - A4));
    const fade = frequencyCurve(A4, 2, { ...base, shape: "fading" });
    expect(max(fade.slice(-half)) - A4).toBeLessThan(0.6 * (max(fade.slice(0, half)) - A4));
  });

  it("plans notes from the first one's start, leaving unmarked and zero-depth notes steady", () => {
    const plan = planAudition([
      { midi: 69, startSeconds: 12, durationSeconds: 1, marking: base },
      { midi: 71, startSeconds: 13, durationSeconds: 0.5 },
      { midi: 72, startSeconds: 13.5, durationSeconds: 0.5, marking: { ...base, depthCents: 0 } },
    ]);
    expect(plan.map((p) => p.at)).toEqual([0, 1, 1.5]);
    expect(plan[0].curve).not.toBeNull();
    expect(plan[1].curve).toBeNull();
    expect(plan[2].curve).toBeNull();
    expect(plan[1].f0).toBeCloseTo(493.8833, 3); // B4, check values §8 formula
  });

  it("keeps the level low", () => {
    expect(masterLevel(undefined)).toBe(DEFAULT_VOLUME);
    expect(masterLevel(5)).toBe(MAX_VOLUME);
    expect(masterLevel(-1)).toBe(0);
    expect(masterLevel(Number.NaN)).toBe(DEFAULT_VOLUME);
  });
});

/** Records what the audition asks of Web Audio; only the calls it makes. */
function recordingContext() {
  const log: string[] = [];
  const param = (name: string) => ({
    value: 0,
    setValueAtTime: (v: number, t: number) => log.push(`${name}.set ${v} @${t.toFixed(3)}`),
    linearRampToValueAtTime: (v: number, t: number) => log.push(`${name}.ramp ${v} @${t.toFixed(3)}`),
    setValueCurveAtTime: (c: Float32Array, t: number, d: number) => log.push(`${name}.curve ${c.length} @${t.toFixed(3)} for ${d}`),
    cancelScheduledValues: (t: number) => log.push(`${name}.cancel @${t.toFixed(3)}`),
  });
  let gains = 0;
  let oscs = 0;
  const node = () => ({ connect: (n: unknown) => n, disconnect: () => undefined });
  const ctx = {
    currentTime: 1,
    destination: {},
    createGain: () => ({ ...node(), gain: param(gains++ === 0 ? "master" : `env${gains - 1}`) }),
    createPeriodicWave: () => ({}),
    createOscillator: () => {
      const id = oscs++;
      return {
        ...node(),
        frequency: param(`osc${id}.freq`),
        setPeriodicWave: () => undefined,
        start: (t: number) => log.push(`osc${id}.start @${t.toFixed(3)}`),
        stop: (t: number) => log.push(`osc${id}.stop @${t.toFixed(3)}`),
      };
    },
  };
  return { ctx: ctx as unknown as AudioContext, log, raw: ctx };
}

describe("auditionNotes", () => {
  afterEach(() => vi.useRealTimers());

  it("starts silent, ramps in, modulates marked notes and fades out in 50 ms on stop", async () => {
    vi.useFakeTimers();
    const { ctx, log, raw } = recordingContext();
    const handle = auditionNotes(ctx, [
      { midi: 69, startSeconds: 4, durationSeconds: 1, marking: base },
      { midi: 71, startSeconds: 5, durationSeconds: 1 },
    ]);
    expect(log[0]).toBe("master.set 0 @1.000");
    expect(log[1]).toMatch(/^master\.ramp 0\.15 @/);
    expect(log).toContain("osc0.freq.curve 201 @1.050 for 1");
    expect(log).toContain("osc1.freq.set 493.8833012561241 @2.050");
    raw.currentTime = 1.5;
    handle.stop();
    expect(log).toContain("master.cancel @1.500");
    expect(log).toContain(`master.ramp 0 @${(1.5 + STOP_FADE_SECONDS).toFixed(3)}`);
    vi.advanceTimersByTime(200);
    await expect(handle.finished).resolves.toBeUndefined();
    handle.stop(); // a second stop does nothing
  });
});
