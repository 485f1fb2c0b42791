import { describe, expect, it } from "vitest";
import { barStyle, DirectionsReader, metronomeTempo } from "./directions";
import { newPartState, startMeasure } from "./measures";

describe("directions and barlines", () => {
  it("converts a metronome mark to quarters per minute: dotted quarter = 60 is 90 (common practice)", () => {
    expect(metronomeTempo({ num: 1, den: 4 }, 1, 60)).toBe(90);
    expect(metronomeTempo({ num: 1, den: 8 }, 0, 138)).toBe(69);
    expect(metronomeTempo(null, 0, 60)).toBeNull();
  });

  it("maps bar styles (MusicXML 4.0, bar-style): light-heavy ends a piece, light-light is a double bar", () => {
    expect([barStyle("light-heavy"), barStyle("light-light"), barStyle(""), barStyle("dashed")]).toEqual(["final", "double", "regular", "other"]);
  });

  it("a sound tempo wins over the metronome in the same direction, and dynamics wait for their note", () => {
    const remarks = new Set<string>();
    const d = new DirectionsReader(remarks);
    const p = newPartState("P1");
    startMeasure(p, { number: "1" });
    d.open(p, "direction", {}, "measure");
    d.open(p, "metronome", {}, "direction-type");
    d.close(p, "beat-unit", "quarter", "metronome");
    d.close(p, "per-minute", "100", "metronome");
    d.close(p, "metronome", "", "direction-type");
    d.open(p, "sound", { tempo: "72" }, "direction");
    d.setDynamics("pp");
    d.close(p, "direction", "", "measure");
    expect(d.tempoEvents.map((e) => e.tempo)).toEqual([72]);
    expect(p.pendingDynamics).toBe("pp");
  });

  it("a repeat barline sets the style and adds the repeats remark", () => {
    const remarks = new Set<string>();
    const d = new DirectionsReader(remarks);
    const p = newPartState("P1");
    startMeasure(p, { number: "1" });
    d.open(p, "barline", { location: "left" }, "measure");
    d.open(p, "repeat", { direction: "forward" }, "barline");
    d.close(p, "barline", "", "measure");
    expect(p.measure!.barlineLeft).toBe("repeat-start");
    expect([...remarks]).toEqual(["Repeats are kept in written order; they are not unfolded."]);
  });
});
