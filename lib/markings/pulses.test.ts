import { describe, expect, it } from "vitest";
import { pulsesPerBeat, speedHz as speedFromPulsesPerBeat } from "@/lib/analysis/vibrato";
import { formatNumber } from "./pulses";

describe("pulses per beat", () => {
  it("turns 6 Hz at 120 beats per minute into 3 pulses per beat", () => {
    // 120 bpm = 2 beats per second; 6 pulses per second / 2 beats per second = 3 (arithmetic).
    expect(pulsesPerBeat(6, 120)).toBe(3);
  });

  it("turns 5.5 Hz at 66 beats per minute into 5 pulses per beat", () => {
    expect(pulsesPerBeat(5.5, 66)).toBeCloseTo(5, 10);
  });

  it("round-trips speed through pulses per beat", () => {
    for (const bpm of [40, 72, 96, 144]) {
      for (const hz of [0, 4.5, 6, 12]) {
        expect(speedFromPulsesPerBeat(pulsesPerBeat(hz, bpm), bpm)).toBeCloseTo(hz, 10);
      }
    }
  });

  // One rule for bad input, decided once: a missing or broken tempo is refused with a RangeError
  // (never Infinity or NaN passed on); the stand copy and the panel, having no tempo, show "–".
  it("refuses a missing or broken tempo rather than dividing by zero", () => {
    for (const bpm of [0, -60, Number.NaN, Number.POSITIVE_INFINITY]) {
      expect(() => pulsesPerBeat(6, bpm)).toThrow(RangeError);
      expect(() => speedFromPulsesPerBeat(3, bpm)).toThrow(RangeError);
    }
    expect(formatNumber(Number.NaN)).toBe("–");
  });

  it("formats without float noise", () => {
    expect(formatNumber(0.1 + 0.2)).toBe("0.3");
    expect(formatNumber(2.75)).toBe("2.75");
  });
});
