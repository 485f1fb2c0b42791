import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { readScoreFile } from "@/lib/musicxml";
import { barName, barNameOfNoteKey, barSpanName, writtenBars, writtenBarsFromText } from "@/lib/musicxml/bar-names";
import { musicFiles, REAL_DIR } from "../helpers/real-corpus";

const read = (file: string) => {
  const { score, partwiseXml } = readScoreFile(new Uint8Array(fs.readFileSync(file)), path.basename(file), { maxFileBytes: 50_000_000, maxUncompressedBytes: 200_000_000, maxNotes: 2_000_000 });
  return { score, partwiseXml };
};
const real = (file: string) => path.join(REAL_DIR, file);
const SAMPLES = path.resolve(import.meta.dirname, "../../samples");

describe("bars named as the part writes them", () => {
  it("names a pickup written number=\"0\" implicit=\"yes\" the pickup, and the next bar bar 1 (a real file: Haydn op. 1 no. 1, music21 corpus)", () => {
    const { score } = read(real("music21/haydn/opus1no1/movement1.mxl"));
    const bars = writtenBars(score.parts[0].measures);
    // The encoding writes <measure implicit="yes" number="0"> then <measure number="1">.
    expect(bars[0]).toEqual({ number: "0", implicit: true });
    expect(barName(bars, 0)).toBe("the pickup");
    expect(barName(bars, 0, "heading")).toBe("Pickup");
    expect(barName(bars, 1)).toBe("bar 1");
    expect(barName(bars, 12, "heading")).toBe("Bar 12");
    const firstKey = score.parts[0].notes.find((n) => !n.isRest)!.key;
    expect(barNameOfNoteKey(bars, firstKey)).toBe("the pickup");
  });

  it("names our sample's pickup the same way (samples/harbour-song.musicxml)", () => {
    const { score, partwiseXml } = read(path.join(SAMPLES, "harbour-song.musicxml"));
    const part = score.parts[0];
    const bars = writtenBarsFromText(partwiseXml, part.id);
    expect(barName(bars, 0)).toBe("the pickup");
    const inBar1 = part.notes.find((n) => !n.isRest && n.measureIndex === 1)!;
    expect(barNameOfNoteKey(bars, inBar1.key)).toBe("bar 1");
    expect(barSpanName(bars, 0, 2)).toBe("the pickup to bar 2");
    expect(barSpanName(bars, 1, 3)).toBe("bars 1–3");
  });

  it("names an unnumbered bar split off by a repeat (number=\"X1\") after the bar it follows (Aloha ʻOe, music21 corpus)", () => {
    const { score } = read(real("music21/liliuokalani/aloha_oe.mxl"));
    const bars = writtenBars(score.parts[0].measures);
    const x1 = bars.findIndex((b) => b.number === "X1");
    expect(x1).toBeGreaterThan(0);
    expect(bars[x1 - 1].number).toBe("4");
    expect(barName(bars, x1)).toBe("the bar after bar 4");
    expect(barName(bars, x1, "heading")).toBe("After bar 4");
    // The bar after it is printed "5": numbering skips the unnumbered bar.
    expect(barName(bars, x1 + 1)).toBe("bar 5");
  });

  it("keeps numbers with letters and numbers that skip as written", () => {
    const bars = [{ number: "11" }, { number: "12" }, { number: "12a" }, { number: "13" }, { number: "20" }];
    expect(barName(bars, 2)).toBe("bar 12a");
    expect(barName(bars, 4)).toBe("bar 20");
    expect(barSpanName(bars, 3, 4)).toBe("bars 13–20");
    // A bar split by a repeat and written with the same number again is that bar, as printed.
    expect(barName([{ number: "7" }, { number: "7", implicit: true }], 1)).toBe("bar 7");
    // A number="0" that is printed (not implicit) is bar 0, as written.
    expect(barName([{ number: "0" }, { number: "1" }], 0)).toBe("bar 0");
  });

  it("counts from 1 only for a bar the list does not know", () => {
    expect(barName([], 4)).toBe("bar 5");
  });

  it("reads the same bars from the stored text as from the reader's model, for every part of every real file", () => {
    let parts = 0;
    let pickups = 0;
    for (const file of musicFiles(REAL_DIR)) {
      const { score, partwiseXml } = read(file);
      for (const part of score.parts) {
        expect(writtenBarsFromText(partwiseXml, part.id), `${path.relative(REAL_DIR, file)} ${part.id}`).toEqual(writtenBars(part.measures));
        parts++;
        if (part.measures[0]?.implicit) pickups++;
      }
    }
    expect(parts).toBeGreaterThan(100);
    expect(pickups).toBeGreaterThan(10);
  }, 120_000);
});
