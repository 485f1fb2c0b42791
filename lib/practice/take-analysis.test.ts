import { describe, expect, it } from "vitest";
import { hzToMidi, midiToHz } from "@/lib/analysis/vibrato";
import { analyseTake, detrend, measureOscillation, periodMean } from "./take-analysis";

const SR = 44_100;

/** f(t) = f0 · 2^((E/1200) · sin(2πRt)), integrated in phase; optional loudness swell in dB. */
function tone(o: { f0: number; seconds: number; rateHz?: number; extentCents?: number; amDb?: number; amplitude?: number; sr?: number }): Float32Array {
  const sr = o.sr ?? SR;
  const out = new Float32Array(Math.round(o.seconds * sr));
  let phase = 0;
  for (let i = 0; i < out.length; i++) {
    const t = i / sr;
    const lfo = Math.sin(2 * Math.PI * (o.rateHz ?? 0) * t);
    const f = o.f0 * Math.pow(2, ((o.extentCents ?? 0) / 1200) * lfo);
    const gain = Math.pow(10, ((o.amDb ?? 0) * lfo) / 20);
    out[i] = (o.amplitude ?? 0.5) * gain * Math.sin(phase);
    phase += (2 * Math.PI * f) / sr;
  }
  return out;
}

/** A seeded generator, so the noise test is the same on every run. */
function noise(seconds: number, seed = 7): Float32Array {
  let s = seed;
  const out = new Float32Array(Math.round(seconds * SR));
  for (let i = 0; i < out.length; i++) {
    s = (s * 1664525 + 1013904223) >>> 0;
    out[i] = (s / 2 ** 32 - 0.5) * 0.6;
  }
  return out;
}

describe("take analysis: vibrato", () => {
  it("measures 6 Hz and about 29 cents on a 440 Hz tone with 6 Hz, ±30 cent vibrato", () => {
    const result = analyseTake(tone({ f0: 440, seconds: 2, rateHz: 6, extentCents: 30 }), SR, 69);
    expect(result.status).toBe("measured");
    // Shared check values §6 (pitchy, window 1024, hop 128): rate 6.000 Hz, extent 29.2 c.
    expect(result.speedHz!).toBeCloseTo(6, 2);
    // The 1024-sample window smooths the extent by sinc(π·R·N/sr) ≈ 0.968 (check values §6): 29.0 c.
    const smoothed = 30 * (Math.sin((Math.PI * 6 * 1024) / SR) / ((Math.PI * 6 * 1024) / SR));
    expect(result.depthCents!).toBeGreaterThan(smoothed - 0.5);
    expect(result.depthCents!).toBeLessThan(30);
    // The same check values measured 29.2 c as half the track's peak-to-peak.
    expect(Math.abs(result.depthCents! - 29.2)).toBeLessThan(0.3);
    expect(Math.abs(result.offsetCents!)).toBeLessThan(1);
    expect(result.voicedFraction).toBe(1);
    expect(result.cycles).toBeGreaterThanOrEqual(10);
    expect(result.contour.length).toBeGreaterThan(500);
  });

  it("is not thrown by a note that sags 20 cents over the take", () => {
    const samples = new Float32Array(SR * 2);
    let phase = 0;
    for (let i = 0; i < samples.length; i++) {
      const t = i / SR;
      samples[i] = 0.5 * Math.sin(phase);
      phase += (2 * Math.PI * 440 * Math.pow(2, (30 * Math.sin(2 * Math.PI * 6 * t) - 20 * t) / 1200)) / SR;
    }
    const r = analyseTake(samples, SR, 69);
    expect(r.speedHz!).toBeCloseTo(6, 2);
    expect(Math.abs(r.depthCents! - 29.2)).toBeLessThan(0.3);
    // The mean sits half-way down the sag.
    expect(r.offsetCents!).toBeCloseTo(-20, 0);
  });

  it("measures other speeds and depths across the flute's vibrato range", () => {
    // Flute vibrato mostly 5–8 Hz (Garrison 2012); depths within a half step (flute practice guide).
    for (const [rate, extent, f0] of [[5, 20, 523.25], [7.5, 40, 880], [5.5, 10, 329.63]]) {
      const r = analyseTake(tone({ f0, seconds: 2.5, rateHz: rate, extentCents: extent, sr: 48_000 }), 48_000, Math.round(hzToMidi(f0)));
      expect(r.speedHz!).toBeCloseTo(rate, 1);
      const smoothing = Math.sin((Math.PI * rate * 1024) / 48_000) / ((Math.PI * rate * 1024) / 48_000);
      expect(r.depthCents!).toBeGreaterThan(extent * smoothing - 0.7);
      expect(r.depthCents!).toBeLessThan(extent + 0.3);
    }
  });

  it("reads a loudness-only pulse as loudness, with no pitch vibrato", () => {
    // Flute vibrato is mostly amplitude (Fletcher 1975, from memory; check values §5).
    const r = analyseTake(tone({ f0: 587.33, seconds: 2, rateHz: 5.5, amDb: 3 }), SR, 74);
    expect(r.speedHz).toBeNull();
    expect(r.depthCents!).toBeLessThan(1);
    expect(r.loudnessSpeedHz!).toBeCloseTo(5.5, 1);
    expect(r.loudnessDepthDb!).toBeGreaterThan(2.5);
    expect(r.loudnessDepthDb!).toBeLessThan(3.2);
  });
});

describe("take analysis: plain tones across the flute's range", () => {
  // B3 to C7: the flute's range with the B foot (common practice); pitchy ≤ 1 cent on sines (check values §6).
  for (const midi of [59, 60, 69, 76, 84, 93, 96]) {
    it(`finds MIDI ${midi} within a cent and no vibrato`, () => {
      const r = analyseTake(tone({ f0: midiToHz(midi), seconds: 1.5 }), SR, midi);
      expect(r.status).toBe("measured");
      expect(Math.abs(r.offsetCents!)).toBeLessThan(1);
      expect(r.depthCents!).toBeLessThan(0.5);
      expect(r.speedHz).toBeNull();
      expect(r.voicedFraction).toBeGreaterThan(0.95);
    });
  }

  it("reports how far a flat note sits below its written pitch", () => {
    const r = analyseTake(tone({ f0: midiToHz(69) * Math.pow(2, -15 / 1200), seconds: 1.5 }), SR, 69);
    expect(r.offsetCents!).toBeCloseTo(-15, 0);
  });
});

describe("take analysis: no tone", () => {
  it("finds no tone in silence", () => {
    const r = analyseTake(new Float32Array(SR * 2), SR, 69);
    expect(r).toMatchObject({ status: "no-tone", voicedFraction: 0, speedHz: null, depthCents: null, offsetCents: null });
    expect(r.message).toMatch(/No steady tone/);
  });

  it("finds no tone in noise", () => {
    const r = analyseTake(noise(2), SR, 69);
    expect(r.status).toBe("no-tone");
    expect(r.voicedFraction).toBeLessThan(0.1);
  });

  it("finds no tone in a blip shorter than two vibrato cycles", () => {
    const samples = new Float32Array(SR * 2);
    samples.set(tone({ f0: 440, seconds: 0.2 }), SR / 2);
    const r = analyseTake(samples, SR, 69);
    expect(r.status).toBe("no-tone");
    expect(r.voicedFraction).toBeGreaterThan(0);
  });

  it("measures the tone between silences and reports the voiced share", () => {
    const samples = new Float32Array(SR * 3);
    samples.set(tone({ f0: 440, seconds: 1.5, rateHz: 6, extentCents: 30 }), SR);
    const r = analyseTake(samples, SR, 69);
    expect(r.speedHz!).toBeCloseTo(6, 1);
    expect(r.voicedFraction).toBeGreaterThan(0.4);
    expect(r.voicedFraction).toBeLessThan(0.55);
  });

  it("refuses a window that would smooth the extent away", () => {
    expect(() => analyseTake(new Float32Array(4096), SR, 69, { window: 2048 })).toThrow(RangeError);
  });
});

describe("oscillation helpers", () => {
  it("averages a contour over one period to its drift", () => {
    const v = Array.from({ length: 200 }, (_, i) => 7 * Math.sin((2 * Math.PI * i) / 23.5) + 0.1 * i);
    const m = periodMean(v, 23.5);
    expect(m[0]).toBeNull();
    expect(m[100]!).toBeCloseTo(10, 1);
    expect(m.at(-1)).toBeNull();
  });

  it("removes a straight drift", () => {
    const t = [0, 1, 2, 3, 4];
    expect(detrend(t, t.map((x) => 3 + 2 * x)).every((v) => Math.abs(v) < 1e-12)).toBe(true);
  });

  it("counts sine cycles on a sampled contour with drift", () => {
    const t = Array.from({ length: 400 }, (_, i) => i / 200);
    const v = t.map((x) => 10 * Math.sin(2 * Math.PI * 4 * x) + 5 * x);
    const o = measureOscillation(t, v, 1);
    expect(o.speedHz!).toBeCloseTo(4, 2);
    expect(o.depth).toBeCloseTo(10, 0);
  });
});
