import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { readScoreFile, selectPartsXml } from "@/lib/musicxml";
import { DEFAULT_LIMITS } from "@/lib/musicxml/errors";
import { keepMusicXml } from "@/lib/musicxml/keep-musicxml";
import { firstMeasures, measureCount } from "@/lib/engraving/repair";
import { firstTextOf, OPENING_BARS, TWO_STEP_BARS } from "@/lib/engraving/opening";
import { generatePartXml } from "@/scripts/bench/generate-part";
import { musicFiles, REAL_DIR } from "../helpers/real-corpus";
import { SAMPLES_DIR } from "../helpers/parts";

// Every part of every file of the real corpus (tests/fixtures/real, sources in its SOURCES.md)
// and of samples/, stored as an upload stores it: the workspace page's first text (cut, then the
// part kept) is exactly what the score view would cut from the part's whole text, which is what
// it engraved before the page carried only the opening.
const files = [...musicFiles(REAL_DIR), ...musicFiles(SAMPLES_DIR)];
const limits = { ...DEFAULT_LIMITS, maxNotes: 1_000_000 };

function expectSameFirstText(stored: string, partId: string, label: string) {
  const whole = selectPartsXml(stored, [partId]);
  const first = firstTextOf(stored, (xml) => selectPartsXml(xml, [partId]));
  if (measureCount(whole) > TWO_STEP_BARS) {
    expect({ label, whole: first.whole, opening: first.opening }).toEqual({ label, whole: null, opening: firstMeasures(whole, OPENING_BARS) });
    return "long";
  }
  expect({ label, whole: first.whole, opening: first.opening }).toEqual({ label, whole, opening: null });
  return "short";
}

describe("the workspace page's first text", () => {
  it("is the opening of a long part and the whole of a short one, on every part of the real corpus and the samples", () => {
    const count = { long: 0, short: 0 };
    for (const file of files) {
      const { score, partwiseXml } = readScoreFile(new Uint8Array(fs.readFileSync(file)), path.basename(file), limits);
      const stored = keepMusicXml(partwiseXml).xml;
      for (const part of score.parts) count[expectSameFirstText(stored, part.id, `${path.basename(file)} ${part.id}`)]++;
    }
    console.log(`[opening] ${files.length} files: ${count.long} long parts sent as their opening, ${count.short} sent whole`);
    // The corpus holds both kinds, so both branches are checked.
    expect(count.long).toBeGreaterThan(10);
    expect(count.short).toBeGreaterThan(10);
  }, 300_000);

  it("cuts the benchmark's 1,000-bar part to its opening bars", () => {
    const { partwiseXml, score } = readScoreFile(new TextEncoder().encode(generatePartXml({ measures: 1000, seed: 1000 })), "bench.musicxml", limits);
    expect(expectSameFirstText(keepMusicXml(partwiseXml).xml, score.parts[0].id, "bench")).toBe("long");
    const { opening } = firstTextOf(keepMusicXml(partwiseXml).xml, (xml) => selectPartsXml(xml, [score.parts[0].id]));
    expect(measureCount(opening!)).toBe(OPENING_BARS);
  });

  it("sends a part of exactly 48 bars whole and one of 49 as its opening", () => {
    for (const [bars, kind] of [[48, "short"], [49, "long"]] as const) {
      const { partwiseXml, score } = readScoreFile(new TextEncoder().encode(generatePartXml({ measures: bars, seed: bars })), "bench.musicxml", limits);
      expect(expectSameFirstText(keepMusicXml(partwiseXml).xml, score.parts[0].id, `${bars} bars`)).toBe(kind);
    }
  });
});
