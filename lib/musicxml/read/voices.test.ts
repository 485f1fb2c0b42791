import { describe, expect, it } from "vitest";
import { VoiceClock } from "./voices";

const q = (n: number) => ({ num: n, den: 1 });

describe("voices and time", () => {
  it("converts durations with divisions per quarter: 3 at divisions 6 is an eighth (MusicXML 4.0, divisions)", () => {
    const clock = new VoiceClock();
    clock.divisions = q(6);
    expect(clock.toWholes(q(3))).toEqual({ num: 1, den: 8 });
  });

  it("places notes one after another, chord tones with the note before, grace notes without time", () => {
    const clock = new VoiceClock();
    const quarter = { num: 1, den: 4 };
    expect(clock.place(false, false, quarter)).toEqual({ num: 0, den: 1 });
    expect(clock.place(true, false, quarter)).toEqual({ num: 0, den: 1 });
    expect(clock.place(false, true, quarter)).toEqual(quarter);
    expect(clock.place(false, false, quarter)).toEqual(quarter);
    expect(clock.pos).toEqual({ num: 1, den: 2 });
  });

  it("backup never crosses the barline; forward and the longest voice set the content length", () => {
    const clock = new VoiceClock();
    clock.move(q(3), false);
    clock.move(q(10), true);
    expect(clock.pos).toEqual({ num: 0, den: 1 });
    expect(clock.maxPos).toEqual({ num: 3, den: 4 });
    clock.startMeasure();
    expect([clock.pos, clock.maxPos]).toEqual([
      { num: 0, den: 1 },
      { num: 0, den: 1 },
    ]);
  });

  it("numbers grace notes per staff, voice and onset; a grace chord shares its number", () => {
    const clock = new VoiceClock();
    const at = { num: 1, den: 4 };
    expect(clock.graceIndex(1, "1", at, false)).toBe(1);
    expect(clock.graceIndex(1, "1", at, true)).toBe(1);
    expect(clock.graceIndex(1, "1", at, false)).toBe(2);
    expect(clock.graceIndex(1, "2", at, false)).toBe(1);
    clock.startMeasure();
    expect(clock.graceIndex(1, "1", at, false)).toBe(1);
  });
});
