import { describe, expect, it } from "vitest";
import type { Note } from "../model";
import { attrString, compareNotes, escAttr, orderParts } from "./assemble";
import { newPartState, startMeasure } from "./measures";

const note = (over: Partial<Note>): Note =>
  ({ measureIndex: 0, onset: { num: 0, den: 1 }, staff: 1, voice: "1", isGrace: false, graceIndex: 0, pitch: null, ...over }) as Note;

describe("the model", () => {
  it("orders notes by measure, onset, staff, voice, grace notes first, then pitch", () => {
    const main = note({ pitch: { midi: 72 } as Note["pitch"] });
    const grace2 = note({ isGrace: true, graceIndex: 2, pitch: { midi: 74 } as Note["pitch"] });
    const grace1 = note({ isGrace: true, graceIndex: 1, pitch: { midi: 76 } as Note["pitch"] });
    const voice10 = note({ voice: "10" });
    const voice2 = note({ voice: "2" });
    expect([voice10, main, voice2, grace2, grace1].sort(compareNotes)).toEqual([grace1, grace2, main, voice2, voice10]);
  });

  it("keeps parts in part-list order, then parts the list forgot; parts without measures are left out", () => {
    const parts = new Map(["P3", "P1", "P2"].map((id) => [id, newPartState(id)]));
    for (const id of ["P3", "P1"]) startMeasure(parts.get(id)!, {});
    expect(orderParts(parts, ["P1", "P2"]).map((p) => p.id)).toEqual(["P1", "P3"]);
  });

  it("escapes attribute values for the normalized text", () => {
    expect(escAttr('a "b" & <c>\n')).toBe("a &quot;b&quot; &amp; &lt;c&gt;&#10;");
    expect(attrString({ number: "1", width: "200" })).toBe(' number="1" width="200"');
  });
});
