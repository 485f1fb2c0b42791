import { describe, expect, it } from "vitest";
import { paginate } from "./paginate";

describe("paginate", () => {
  it("moves a block that does not fit to the next page instead of splitting it", () => {
    const placed = paginate([{ height: 40 }, { height: 40, gapBefore: 5 }, { height: 40, gapBefore: 5 }], 100);
    expect(placed).toEqual([
      { page: 0, y: 0, scale: 1 },
      { page: 0, y: 45, scale: 1 },
      { page: 1, y: 0, scale: 1 },
    ]);
  });

  it("never lets a block cross the page's bottom", () => {
    const heights = [12, 37, 8, 55, 21, 30, 49, 3, 60, 18];
    const placed = paginate(heights.map((height) => ({ height, gapBefore: 4 })), 80);
    placed.forEach((p, i) => expect(p.y + heights[i] * p.scale).toBeLessThanOrEqual(80));
    // Pages only go forward.
    for (let i = 1; i < placed.length; i++) expect(placed[i].page).toBeGreaterThanOrEqual(placed[i - 1].page);
  });

  it("scales a block taller than a page onto a page of its own", () => {
    const placed = paginate([{ height: 10 }, { height: 250, gapBefore: 5 }], 100);
    expect(placed[1]).toEqual({ page: 1, y: 0, scale: 0.4 });
  });

  it("honours a forced break, but not on an empty page", () => {
    expect(paginate([{ height: 10, breakBefore: true }, { height: 10, breakBefore: true }], 100).map((p) => p.page)).toEqual([0, 1]);
  });
});
