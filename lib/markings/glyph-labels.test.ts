import { describe, expect, it } from "vitest";
import { fitLabels, labelWidth } from "./glyph-labels";

describe("labels under the waves on paper", () => {
  it("estimates a label at 0.6 em a digit", () => {
    // "20¢ 5.5": five 0.6 em characters, a space and a point of 0.3 em = 3.6 em.
    expect(labelWidth("20¢ 5.5", 10)).toBeCloseTo(36, 6);
  });

  it("keeps a label that would touch the one before it out, and the next one that fits in", () => {
    const items = [
      { key: "a", row: 0, x: 100, text: "20¢ 5.5" }, // 100 … 136
      { key: "b", row: 0, x: 130, text: "30¢ 6" }, // starts inside a
      { key: "c", row: 0, x: 141, text: "15¢ 5" }, // 5 px after a: kept
      { key: "d", row: 1, x: 100, text: "none" }, // another system
    ];
    expect([...fitLabels(items, 10, 5)].sort()).toEqual(["a", "c", "d"]);
  });

  it("never lets two shown labels overlap, whatever the order given", () => {
    const texts = ["20¢ 5.5", "none", "35¢ 6", "8¢ 4.5", "100¢ 7.25"];
    const items = Array.from({ length: 40 }, (_, i) => ({ key: `k${i}`, row: i % 3, x: (i * 37) % 400, text: texts[i % texts.length] }));
    const shown = fitLabels(items, 10, 4);
    const spans = items.filter((i) => shown.has(i.key)).map((i) => ({ row: i.row, x1: i.x, x2: i.x + labelWidth(i.text, 10) }));
    for (const a of spans) for (const b of spans) if (a !== b && a.row === b.row) expect(a.x2 + 4 <= b.x1 || b.x2 + 4 <= a.x1).toBe(true);
    expect(shown.size).toBeGreaterThan(3);
  });

  it("leaves out a label that would run past the margin", () => {
    expect(fitLabels([{ key: "a", row: 0, x: 690, text: "20¢ 5.5" }], 10, 4, 700).size).toBe(0);
  });
});
