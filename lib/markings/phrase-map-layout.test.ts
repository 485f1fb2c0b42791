import { describe, expect, it } from "vitest";
import { keyLabel, keyName, layoutDots, layoutPhrases, localKeySpans, PHRASE_MIN_PX, xOf } from "./phrase-map-layout";

describe("phrase map layout", () => {
  it("gives each wide phrase its own span and peak", () => {
    // 101 notes on 1000 px: 10 px a note. Phrases of 20 notes are 200 px wide.
    const items = layoutPhrases([{ start: 0, peak: 10, end: 20 }, { start: 21, peak: 22, end: 40 }], 101, 1000);
    expect(items).toEqual([
      { kind: "phrase", index: 0, left: 0, width: 200, peak: 100 },
      // A peak 10 px after the start would sit on the start glyph: it is left out.
      { kind: "phrase", index: 1, left: 210, width: 190, peak: null },
    ]);
  });

  it("gathers phrases too narrow for their glyphs, so nothing overlaps at 1,000 bars", () => {
    // About 1,000 bars of four notes, a phrase every 4 bars, on a 1,000 px strip.
    const count = 4000;
    const phrases = Array.from({ length: 250 }, (_, i) => ({ start: i * 16, peak: i * 16 + 8, end: i * 16 + 15 }));
    const items = layoutPhrases(phrases, count, 1000);
    expect(items.length).toBeLessThan(40);
    // Every phrase is in exactly one item, in order.
    const covered = items.flatMap((it) => (it.kind === "group" ? Array.from({ length: it.last - it.first + 1 }, (_, k) => it.first + k) : [it.index]));
    expect(covered).toEqual(phrases.map((_, i) => i));
    // Items do not overlap and each group is wide enough to click.
    for (let i = 1; i < items.length; i++) expect(items[i].left).toBeGreaterThanOrEqual(items[i - 1].left + items[i - 1].width - 0.01);
    for (const it of items.slice(0, -1)) expect(it.width).toBeGreaterThanOrEqual(PHRASE_MIN_PX - 4);
    // Zoomed 16×, the same part has room for every phrase on its own.
    expect(layoutPhrases(phrases, count, 16000).every((it) => it.kind === "phrase")).toBe(true);
  });

  it("merges marked notes closer than a dot", () => {
    expect(layoutDots([0, 1, 50, 99], 100, 99)).toEqual([
      { x: 0, first: 0, count: 2 },
      { x: 50, first: 50, count: 1 },
      { x: 99, first: 99, count: 1 },
    ]);
    expect(xOf(5, 1, 100)).toBe(0);
  });

  it("places local keys from their bar numbers and names them", () => {
    const measures = ["1", "1", "2", "3", "3", "4"];
    expect(localKeySpans([{ tonic: "D", mode: "major" as const, fromMeasure: "2", toMeasure: "3" }, { tonic: "E", mode: "minor" as const, fromMeasure: "9", toMeasure: "9" }], measures)).toEqual([
      { tonic: "D", mode: "major", fromMeasure: "2", toMeasure: "3", from: 2, to: 4 },
    ]);
    // Spelling as written on a key signature (common practice).
    expect(keyName("F#", "minor")).toBe("F♯ minor");
    expect(keyName("Bb", "major")).toBe("B♭ major");
  });

  it("writes a key's full name where it fits, the short chord-symbol form where only that fits, else nothing", () => {
    expect(keyLabel("E", "minor", 120)).toBe("E minor");
    // "Em" for E minor, "B♭" for B flat major: chord-symbol shorthand (common practice).
    expect(keyLabel("E", "minor", 50)).toBe("Em");
    expect(keyLabel("Bb", "major", 40)).toBe("B♭");
    expect(keyLabel("F#", "minor", 12)).toBe("");
    // A wider box never gets a shorter name.
    const lengths = [10, 30, 60, 90, 120].map((w) => keyLabel("C#", "minor", w).length);
    expect([...lengths].sort((a, b) => a - b)).toEqual(lengths);
  });
});
