import { describe, expect, it } from "vitest";
import { MAX_BPM, MIN_BPM, pulseLadder, targetStep } from "./pulse-trainer";

describe("pulse trainer: the target step", () => {
  it("reaches 6 Hz as four pulses at ♩ = 90 and three at ♩ = 120", () => {
    // Garrison (2012), "Visualizing Vibrato": 6 Hz = triplets at ♩=120, sixteenths at ♩=90.
    expect(targetStep(6, 90)).toMatchObject({ pulses: 4, bpm: 90, hz: 6 });
    expect(targetStep(6, 120)).toMatchObject({ pulses: 3, bpm: 120, hz: 6 });
  });

  it("reaches 5 Hz as triplets at ♩ = 100 and 7 Hz as sixteenths at ♩ = 105", () => {
    // Garrison (2012): 5 Hz → triplets ♩=100 / 16ths ♩=75; 7 Hz → 140 / 105.
    expect(targetStep(5, 100)).toMatchObject({ pulses: 3, bpm: 100 });
    expect(targetStep(5, 75)).toMatchObject({ pulses: 4, bpm: 75 });
    expect(targetStep(7, 105)).toMatchObject({ pulses: 4, bpm: 105 });
  });

  it("puts a flute teacher's practice norm, four pulses at 92–96, at 6.13–6.40 Hz", () => {
    // A published flute practice guide (johnwion.com/vibrato.html): four pulses at 92–96.
    expect(targetStep(6.4, 96)).toMatchObject({ pulses: 4, bpm: 96 });
    expect(pulseLadder({ targetHz: 6.4, bpm: 96 }).at(-1)!.hz).toBeCloseTo(6.4, 6);
    expect(targetStep((4 * 92) / 60, 92).bpm).toBeCloseTo(92, 6);
  });

  it("chooses the easy subdivision whose tempo lies nearest the working tempo", () => {
    // 6 Hz near ♩ = 76: four pulses at 90, not five at 72 (quintuplets are hard to keep even; common practice).
    expect(targetStep(6, 76)).toMatchObject({ pulses: 4, bpm: 90 });
    // 5.5 Hz near ♩ = 72: four at 82.5 (10.5 away) beats three at 110 (38 away).
    expect(targetStep(5.5, 72)).toMatchObject({ pulses: 4, bpm: 82.5 });
    // 1.2 Hz is reached only by a single pulse per beat at ♩ = 72.
    expect(targetStep(1.2, 60)).toMatchObject({ pulses: 1, bpm: 72 });
  });
});

describe("pulse trainer: the ladder", () => {
  const cases = [
    { targetHz: 6, bpm: 90 },
    { targetHz: 6, bpm: 120 },
    { targetHz: 5.5, bpm: 72 },
    { targetHz: 7.5, bpm: 60 },
    { targetHz: 5, bpm: 160 },
    { targetHz: 3, bpm: 200 },
    { targetHz: 8, bpm: 44 },
  ];

  for (const c of cases) {
    it(`climbs gradually to ${c.targetHz} Hz from ♩ = ${c.bpm}`, () => {
      const ladder = pulseLadder(c);
      expect(ladder.length).toBeGreaterThanOrEqual(2);
      expect(ladder.at(-1)!.kind).toBe("target");
      expect(ladder.at(-1)!.hz).toBeCloseTo(c.targetHz, 1);
      for (const s of ladder) {
        expect(Number.isInteger(s.pulses) && s.pulses >= 1).toBe(true);
        expect(s.bpm).toBeGreaterThanOrEqual(MIN_BPM);
        expect(s.bpm).toBeLessThanOrEqual(MAX_BPM);
        // Pulses per beat = Hz × 60 / bpm (shared check values §5, Garrison 2012).
        expect(s.hz).toBeCloseTo((s.pulses * s.bpm) / 60, 9);
      }
      // The first step is comfortably slower than the target; no step jumps by more than 7 %.
      expect(ladder[0].hz).toBeLessThanOrEqual(0.8 * c.targetHz + 1e-9);
      for (let i = 1; i < ladder.length; i++) {
        expect(ladder[i].hz).toBeGreaterThanOrEqual(ladder[i - 1].hz - 0.02);
        if (ladder[i].kind !== "regroup") expect(ladder[i].hz / ladder[i - 1].hz).toBeLessThanOrEqual(1.07 + 0.002);
      }
    });
  }

  it("starts with three pulses at the part's tempo and regroups them into the target subdivision", () => {
    const ladder = pulseLadder({ targetHz: 6, bpm: 90 });
    expect(ladder[0]).toEqual({ kind: "settle", bpm: 90, pulses: 3, hz: 4.5 });
    expect(ladder[1]).toMatchObject({ kind: "regroup", bpm: 67.5, pulses: 4, hz: 4.5 });
    expect(ladder.slice(2).every((s) => s.pulses === 4)).toBe(true);
    expect(ladder.at(-1)).toEqual({ kind: "target", bpm: 90, pulses: 4, hz: 6 });
  });

  it("starts from a chosen tempo instead of the part's", () => {
    expect(pulseLadder({ targetHz: 6, bpm: 60 })[0]).toMatchObject({ bpm: 60, pulses: 3, hz: 3 });
  });

  it("has nothing to train for deliberately no vibrato, and refuses impossible speeds", () => {
    expect(pulseLadder({ targetHz: 0, bpm: 90 })).toEqual([]);
    expect(() => pulseLadder({ targetHz: 40, bpm: 90 })).toThrow(RangeError);
    expect(() => pulseLadder({ targetHz: Number.NaN, bpm: 90 })).toThrow(RangeError);
  });
});
