import { describe, expect, it } from "vitest";
import type { Fraction, Measure } from "../model";
import { barLengthNotices, describeNotices } from "./bar-lengths";

function bar(number: string, beats: number, beatType: number, more: Partial<Measure> = {}): Measure {
  return { number, time: { beats, beatType }, length: { num: beats, den: beatType }, barlineLeft: "regular", barlineRight: "regular", ...more } as Measure;
}
const f = (num: number, den: number): Fraction => ({ num, den });

describe("bar lengths", () => {
  it("names a bar longer than its time signature with its written number, in beats of the signature", () => {
    const measures = [bar("1", 4, 4), bar("7", 4, 4), bar("8", 6, 8)];
    const notices = barLengthNotices([{ measures, reached: [f(1, 1), f(5, 2), f(7, 8)], implicit: new Set() }]);
    expect(notices.map((n) => n.message)).toEqual(["bar 7 lasts 10 beats in 4/4 — read as written", "bar 8 lasts 7 beats in 6/8 — read as written"]);
  });

  it("leaves out a pickup, the bar that completes it, empty bars, implicit bars and bars split by a repeat", () => {
    const measures = [bar("0", 3, 4), bar("1", 3, 4), bar("2", 3, 4, { barlineRight: "repeat-end" }), bar("3", 3, 4), bar("4", 3, 4), bar("5", 3, 4)];
    const reached = [f(1, 4), f(0, 1), f(1, 2), f(1, 2), f(3, 4), f(1, 2)];
    expect(barLengthNotices([{ measures, reached, implicit: new Set([3]) }])).toEqual([]);
    expect(barLengthNotices([{ measures, reached, implicit: new Set() }]).map((n) => n.message)).toEqual(["bar 3 lasts 2 beats in 3/4 — read as written"]);
  });

  it("takes the longest part of a bar, as the timeline does", () => {
    const measures = [bar("1", 2, 4), bar("2", 2, 4)];
    const notices = barLengthNotices([
      { measures, reached: [f(1, 2), f(1, 4)], implicit: new Set() },
      { measures, reached: [f(1, 2), f(1, 2)], implicit: new Set() },
    ]);
    expect(notices).toEqual([]);
  });

  it("sums many notices up in one sentence, naming the first five", () => {
    const many = Array.from({ length: 7 }, (_, i) => `bar ${i + 1} lasts 5 beats in 4/4 — read as written`);
    expect(describeNotices(many)).toBe(
      "Bar 1 lasts 5 beats in 4/4 — read as written; bar 2 lasts 5 beats in 4/4 — read as written; bar 3 lasts 5 beats in 4/4 — read as written; bar 4 lasts 5 beats in 4/4 — read as written; bar 5 lasts 5 beats in 4/4 — read as written; and 2 more bars read as written.",
    );
    expect(describeNotices([])).toBeNull();
  });
});
