import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { readScoreFile } from "@/lib/musicxml";
import { analyzePart, analyzeScore } from "./index";

// Our two-flute samples (tests/fixtures/real/ours): flute 1 starts on F♯5, flute 2 a third below
// on D5; in bar 2 flute 2 alone falls G5 → F♯5. Degrees in D major: common practice.
const OURS = path.resolve(import.meta.dirname, "../../tests/fixtures/real/ours");
const score = (name: string) => readScoreFile(new Uint8Array(fs.readFileSync(path.join(OURS, name))), name).score;

describe("the analysis follows the chosen line of a staff with two players", () => {
  for (const name of ["two-flutes-chords.musicxml", "two-flutes-voices.musicxml"]) {
    it(`${name}: the upper line by default, the lower on request`, () => {
      const s = score(name);
      const upper = analyzePart(s, s.parts[0]);
      const lower = analyzePart(s, s.parts[0], { line: "lower" });
      expect(upper.lines?.line).toBe("upper");
      expect(lower.lines?.line).toBe("lower");
      expect(analyzeScore(s, name).parts[0]).toEqual(upper);

      expect(upper.notes.slice(0, 3).map((n) => n.pitch)).toEqual(["F#5", "G5", "A5"]);
      expect(lower.notes.slice(0, 3).map((n) => n.pitch)).toEqual(["D5", "E5", "F#5"]);
      const start = (a: typeof upper) => a.suggestions.find((x) => x.role === "phrase-start")!;
      expect(start(upper).pitch).toBe("F#5");
      expect(start(lower).pitch).toBe("D5");
      // Flute 2's G → F♯ in bar 2 (4̂ → 3̂): a tension tone of the lower line only.
      const fourth = (a: typeof upper) => a.suggestions.filter((x) => x.role === "tension" && x.measure === "2").map((x) => x.pitch);
      expect(fourth(lower)).toEqual(["G5"]);
      expect(fourth(upper)).toEqual([]);
      // The a2 bar is both lines': C♯6 → D6 is the leading tone in each.
      for (const a of [upper, lower]) expect(a.suggestions.some((x) => x.role === "tension" && x.measure === "3" && x.pitch === "C#6")).toBe(true);
    });
  }

  it("a part with one player carries no line and ignores the option", () => {
    const s = readScoreFile(new Uint8Array(fs.readFileSync(path.join(OURS, "piccolo.musicxml"))), "piccolo.musicxml").score;
    const a = analyzePart(s, s.parts[0], { line: "lower" });
    expect(a.lines).toBeUndefined();
    expect(a).toEqual(analyzePart(s, s.parts[0]));
  });
});
