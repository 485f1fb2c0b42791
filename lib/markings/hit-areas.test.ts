import { describe, expect, it } from "vitest";
import { hitSpans, TOUCH_TARGET_PX, type HitInput } from "./hit-areas";

const note = (key: string, centre: number, row = 0, minWidth = 24): HitInput => ({ key, centre, row, minWidth });

describe("note hit spans", () => {
  it("gives a lone note the full 44 px centred on it (WCAG 2.2 SC 2.5.5: 44 by 44 CSS px)", () => {
    expect(TOUCH_TARGET_PX).toBe(44);
    expect(hitSpans([note("a", 100)]).get("a")).toEqual({ left: 78, width: 44 });
  });

  it("keeps 44 px when the neighbours are 44 px or more away, without overlapping them", () => {
    const spans = hitSpans([note("a", 100), note("b", 144), note("c", 250)]);
    expect(spans.get("a")).toEqual({ left: 78, width: 44 });
    expect(spans.get("b")).toEqual({ left: 122, width: 44 });
    expect(spans.get("a")!.left + spans.get("a")!.width).toBeLessThanOrEqual(spans.get("b")!.left);
  });

  it("splits the space half-way between notes closer than 44 px, so the spans tile the line", () => {
    const spans = hitSpans([note("a", 100), note("b", 130), note("c", 160)]);
    expect(spans.get("b")).toEqual({ left: 115, width: 30 });
    expect(spans.get("a")).toEqual({ left: 78, width: 37 });
    expect(spans.get("a")!.left + spans.get("a")!.width).toBe(spans.get("b")!.left);
  });

  it("never goes below the minimum width, even when notes crowd", () => {
    const spans = hitSpans([note("a", 100), note("b", 110), note("c", 120)]);
    // a has room on its left: from 22 px before it to half-way to b.
    expect(spans.get("a")).toEqual({ left: 78, width: 27 });
    expect(spans.get("b")).toEqual({ left: 98, width: 24 });
  });

  it("treats notes at one x (a chord, two voices) as one column, and each system apart", () => {
    const spans = hitSpans([note("low", 100), note("high", 100.4), note("next", 130), note("other-row", 115, 1)]);
    for (const head of ["low", "high"]) {
      const span = spans.get(head)!;
      expect(span.left + span.width).toBeCloseTo(115.2, 0);
      expect(span.width).toBeGreaterThan(36);
    }
    expect(spans.get("other-row")).toEqual({ left: 93, width: 44 });
  });
});
