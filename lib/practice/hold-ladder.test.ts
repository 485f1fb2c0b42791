import { describe, expect, it } from "vitest";
import { beatsOfDuration, holdLadder, MIN_REST_SECONDS } from "./hold-ladder";

describe("hold ladder", () => {
  it("goes from eight beats down to a quarter note's one beat, with rests between", () => {
    const ladder = holdLadder({ writtenBeats: 1, bpm: 60, speedHz: 6 });
    expect(ladder.map((s) => s.beats)).toEqual([8, 6, 4, 3, 2, 1.5, 1]);
    // At ♩ = 60 a beat lasts one second (seconds = beats × 60 / bpm).
    expect(ladder.map((s) => s.seconds)).toEqual([8, 6, 4, 3, 2, 1.5, 1]);
    expect(ladder[0].pulses).toBe(48);
    expect(ladder.at(-1)!.restSeconds).toBe(0);
    for (const s of ladder.slice(0, -1)) expect(s.restSeconds).toBeGreaterThanOrEqual(MIN_REST_SECONDS);
  });

  it("ends exactly on the note's written length, even when it is not a ladder length", () => {
    const ladder = holdLadder({ writtenBeats: 2.5, bpm: 90 });
    expect(ladder.at(-1)!.beats).toBe(2.5);
    expect(ladder.at(-1)!.seconds).toBeCloseTo((2.5 * 60) / 90, 9);
    // No hold is barely longer than the written one: 3 beats is within 20 % of 2.5 and left out.
    expect(ladder.map((s) => s.beats)).toEqual([8, 6, 4, 2.5]);
    for (let i = 1; i < ladder.length; i++) expect(ladder[i].seconds).toBeLessThan(ladder[i - 1].seconds);
  });

  it("leaves out holds longer than twelve seconds at a slow tempo", () => {
    const ladder = holdLadder({ writtenBeats: 1, bpm: 40 });
    expect(Math.max(...ladder.map((s) => s.seconds))).toBeLessThanOrEqual(12);
    expect(ladder[0].beats).toBe(8);
    expect(holdLadder({ writtenBeats: 1, bpm: 30 })[0].beats).toBe(6);
  });

  it("is a single hold for a note already longer than the longest hold", () => {
    const ladder = holdLadder({ writtenBeats: 12, bpm: 100 });
    expect(ladder).toEqual([{ beats: 12, seconds: 7.2, pulses: 0, restSeconds: 0 }]);
  });

  it("refuses a note without length and a tempo of zero", () => {
    expect(() => holdLadder({ writtenBeats: 0, bpm: 60 })).toThrow(RangeError);
    expect(() => holdLadder({ writtenBeats: 1, bpm: 0 })).toThrow(RangeError);
  });

  it("reads written durations in whole notes as beats", () => {
    expect(beatsOfDuration("1/4")).toBe(1);
    expect(beatsOfDuration("3/8")).toBe(1.5);
    expect(beatsOfDuration("1")).toBe(4);
    expect(beatsOfDuration("3/8", 1.5)).toBe(1);
    expect(beatsOfDuration("x")).toBeNaN();
  });
});
