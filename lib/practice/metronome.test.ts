import { describe, expect, it } from "vitest";
import { clicksBetween } from "./metronome";

describe("metronome clicks", () => {
  it("clicks four pulses per beat at ♩ = 90, six per second, the beat accented", () => {
    // 4 pulses at ♩ = 90 = 6 Hz (Garrison 2012): one click every 1/6 s.
    const clicks = clicksBetween({ bpm: 90, pulses: 4, origin: 10, from: 10, to: 11 });
    expect(clicks).toHaveLength(6);
    clicks.forEach((c, i) => expect(c.time).toBeCloseTo(10 + i / 6, 9));
    expect(clicks.map((c) => c.accent)).toEqual([true, false, false, false, true, false]);
  });

  it("continues the count across scheduling windows without doubling or skipping a click", () => {
    const windows = [0, 0.13, 0.29, 0.5, 0.77, 1.0].slice(0, -1).map((from, i, all) => [from, all[i + 1] ?? 1.0] as const);
    const joined = windows.flatMap(([from, to]) => clicksBetween({ bpm: 120, pulses: 3, origin: 0, from, to }));
    const whole = clicksBetween({ bpm: 120, pulses: 3, origin: 0, from: 0, to: 1 });
    expect(joined.map((c) => c.index)).toEqual(whole.map((c) => c.index));
    expect(whole).toHaveLength(6);
    expect(whole.filter((c) => c.accent).map((c) => c.index)).toEqual([0, 3]);
  });

  it("refuses a tempo of zero", () => {
    expect(() => clicksBetween({ bpm: 0, pulses: 3, origin: 0, from: 0, to: 1 })).toThrow(RangeError);
  });
});
