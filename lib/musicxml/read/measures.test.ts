import { describe, expect, it } from "vitest";
import { AttributesReader, endMeasure, newPartState, startMeasure } from "./measures";

function withAttributes(children: Array<[string, string, string]>, opens: Array<[string, Record<string, string>]> = []) {
  const remarks = new Set<string>();
  const reader = new AttributesReader(remarks);
  const p = newPartState("P1");
  startMeasure(p, { number: "7" });
  for (const [name, attrs] of opens) reader.open(name, attrs);
  for (const [name, text, parent] of children) reader.close(p, name, text, parent);
  return { p, remarks };
}

describe("measures and attributes", () => {
  it("starts measures in written order with their written number", () => {
    const p = newPartState("P1");
    startMeasure(p, { number: "12a" });
    endMeasure(p);
    startMeasure(p, {});
    expect(p.measures.map((m) => [m.index, m.number])).toEqual([
      [0, "12a"],
      [1, "2"],
    ]);
  });

  it("reads an additive time signature 2/4 + 3/8 as 7/8 long (MusicXML 4.0, time)", () => {
    const { p } = withAttributes(
      [
        ["beats", "2", "time"],
        ["beat-type", "4", "time"],
        ["beats", "3", "time"],
        ["beat-type", "8", "time"],
        ["time", "", "attributes"],
      ],
      [["time", {}]],
    );
    expect(p.timeLength).toEqual({ num: 7, den: 8 });
    expect(p.measure!.timeChanged).toBe(true);
  });

  it("reads a key change and refuses impossible divisions", () => {
    const { p } = withAttributes(
      [
        ["fifths", "-3", "key"],
        ["mode", "minor", "key"],
        ["key", "", "attributes"],
      ],
      [["key", {}]],
    );
    expect(p.measure!.key).toEqual({ fifths: -3, mode: "minor" });
    expect(() => withAttributes([["divisions", "0", "attributes"]])).toThrow(expect.objectContaining({ code: "bad_request:divisions" }));
  });

  it("says how a transposing part sounds: chromatic plus twelve per octave change", () => {
    const { remarks } = withAttributes(
      [
        ["chromatic", "0", "transpose"],
        ["octave-change", "1", "transpose"],
        ["transpose", "", "attributes"],
      ],
      [["transpose", {}]],
    );
    expect([...remarks][0]).toContain("sounds an octave higher than written");
  });

  it("records how far the measure's content reached when it closes, long or short", () => {
    const p = newPartState("P1");
    startMeasure(p, { number: "1" });
    p.clock.move({ num: 40, den: 1 }, false);
    endMeasure(p);
    expect(p.reached[0]).toEqual({ num: 10, den: 1 });
  });
});
