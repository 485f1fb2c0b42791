import path from "node:path";
import { describe, expect, it } from "vitest";
import { loadHarmonyCorpus, splitCorpus } from "./eval-harmony";

describe("the harmony corpus split", () => {
  it("halves the pieces by name order, disjoint, every source in both halves, the same every run", () => {
    const pieces = loadHarmonyCorpus(path.resolve(import.meta.dirname, "../tests/fixtures/harmony"));
    const a = splitCorpus(pieces);
    const b = splitCorpus([...pieces].reverse());
    expect(a.tuning.map((p) => p.name)).toEqual(b.tuning.map((p) => p.name));
    const tuning = new Set(a.tuning.map((p) => p.name));
    expect(a.heldOut.some((p) => tuning.has(p.name))).toBe(false);
    expect(a.tuning.length + a.heldOut.length).toBe(pieces.length);
    expect(Math.abs(a.tuning.length - a.heldOut.length)).toBeLessThanOrEqual(1);
    const source = (name: string) => name.split("-")[0];
    for (const s of new Set(pieces.filter((p) => pieces.filter((q) => source(q.name) === source(p.name)).length > 1).map((p) => source(p.name)))) {
      expect(a.tuning.some((p) => source(p.name) === s)).toBe(true);
      expect(a.heldOut.some((p) => source(p.name) === s)).toBe(true);
    }
  });
});
