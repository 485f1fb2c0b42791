import { describe, expect, it } from "vitest";
import {
  GLYPH, GLYPH_BAND_HEIGHT, commentMarker, glyphBandHeight, glyphSlots, roleShapePath, tensionArc, vibratoWave, waveCrests, waveHeight, waveWidth,
  type NoteBox, type WaveInput,
} from "./glyph-geometry";
import { ROLE_INFO, ROLE_ORDER } from "./roles";

const base: WaveInput = {
  x: 100, width: 60, hairline: 50, depthCents: 40, speedHz: 5, placement: "centered", onset: "immediate", shape: "steady",
};

/** Every y of the polyline, to measure what was drawn. */
function points(path: string): { x: number; y: number }[] {
  return [...path.matchAll(/[ML](-?[\d.]+),(-?[\d.]+)/g)].map((m) => ({ x: Number(m[1]), y: Number(m[2]) }));
}
const ys = (path: string) => points(path).map((p) => p.y);

describe("vibrato wave", () => {
  it("grows taller with depth", () => {
    const heights = [5, 20, 50, 100].map((d) => waveHeight(d));
    for (let i = 1; i < heights.length; i++) expect(heights[i]).toBeGreaterThan(heights[i - 1]);
    expect(waveHeight(100)).toBe(GLYPH.waveMaxHeight);
    const drawn = (d: number) => {
      const y = ys(vibratoWave({ ...base, depthCents: d }).path);
      return Math.max(...y) - Math.min(...y);
    };
    expect(drawn(80)).toBeGreaterThan(drawn(20));
  });

  it("draws a flat line with end caps for depth 0 (deliberately none)", () => {
    const wave = vibratoWave({ ...base, depthCents: 0 });
    expect(wave.kind).toBe("none");
    expect(wave.crests).toBe(0);
    // Only the caps leave the hairline: the long stroke is at y = 50.
    const pts = points(wave.path);
    expect(pts.filter((p) => p.y === 50).map((p) => p.x)).toEqual(expect.arrayContaining([100, 160]));
    expect(vibratoWave({ ...base, speedHz: 0 }).kind).toBe("none");
  });

  it("draws as many crests as pulses over the note's duration", () => {
    // 6 Hz over 0.5 s = 3 pulses (arithmetic): three tops above the hairline.
    const wave = vibratoWave({ ...base, speedHz: 6, durationSeconds: 0.5 });
    expect(wave.crests).toBeCloseTo(3, 10);
    const pts = points(wave.path);
    let tops = 0;
    for (let i = 1; i < pts.length - 1; i++) if (pts[i].y < pts[i - 1].y && pts[i].y <= pts[i + 1].y && pts[i].y < 50 - 1) tops++;
    expect(tops).toBe(3);
  });

  it("packs crests denser for a faster speed over the same note", () => {
    const slow = vibratoWave({ ...base, speedHz: 4, durationSeconds: 1 });
    const fast = vibratoWave({ ...base, speedHz: 8, durationSeconds: 1 });
    expect(fast.crests).toBeGreaterThan(slow.crests);
  });

  it("caps crests so each stays at least a few pixels wide", () => {
    expect(waveCrests(12, 30, 4)).toBe(Math.floor(30 / GLYPH.minCrestWidth));
    expect(waveCrests(3, 60, 0.1)).toBe(1);
  });

  it("centres the wave on the hairline or hangs it below with its tops on it", () => {
    const centred = vibratoWave({ ...base, placement: "centered" });
    const cy = ys(centred.path);
    expect(Math.min(...cy)).toBeLessThan(50);
    expect(Math.max(...cy)).toBeGreaterThan(50);
    const hanging = vibratoWave({ ...base, placement: "top-on-pitch" });
    const hy = ys(hanging.path);
    expect(Math.min(...hy)).toBeGreaterThanOrEqual(50);
    expect(Math.max(...hy)).toBeGreaterThan(50 + hanging.height * 0.9);
  });

  it("starts late for a delayed onset, flat until then", () => {
    const wave = vibratoWave({ ...base, onset: "delayed" });
    expect(wave.startX).toBeCloseTo(100 + 60 * GLYPH.delayedShare, 5);
    const before = points(wave.path).filter((p) => p.x < wave.startX);
    expect(before.every((p) => p.y === 50)).toBe(true);
  });

  it("swells for growing and narrows for fading", () => {
    const spread = (path: string, from: number, to: number) => {
      const sel = points(path).filter((p) => p.x >= from && p.x <= to).map((p) => p.y);
      return Math.max(...sel) - Math.min(...sel);
    };
    const growing = vibratoWave({ ...base, shape: "growing", speedHz: 8, durationSeconds: 1 }).path;
    const fading = vibratoWave({ ...base, shape: "fading", speedHz: 8, durationSeconds: 1 }).path;
    expect(spread(growing, 140, 160)).toBeGreaterThan(spread(growing, 100, 120) * 2);
    expect(spread(fading, 100, 120)).toBeGreaterThan(spread(fading, 140, 160) * 2);
  });

  it("scales with the zoom", () => {
    expect(waveHeight(50, 2)).toBeCloseTo(waveHeight(50) * 2, 10);
  });
});

describe("glyph slots", () => {
  it("stacks wave, role and comment upward above the staff", () => {
    const s = glyphSlots({ y: 80, staffTop: 70 });
    expect(s.labelY).toBeLessThan(70);
    expect(s.centredHairline).toBeLessThan(s.labelY);
    expect(s.hangingHairline).toBeLessThan(s.centredHairline);
    expect(s.roleY).toBeLessThan(s.hangingHairline);
    expect(s.commentY).toBeLessThan(s.roleY);
  });

  it("rises above a note written above the staff", () => {
    expect(glyphSlots({ y: 40, staffTop: 70 }).labelY).toBeLessThan(40);
  });
});

describe("role shapes", () => {
  it("gives each role its own silhouette inside the square", () => {
    const paths = ROLE_ORDER.map((r) => roleShapePath(r, 50, 50, 10));
    expect(new Set(paths).size).toBe(4);
    for (const role of ROLE_ORDER.filter((r) => r !== "resolution")) {
      for (const p of points(roleShapePath(role, 50, 50, 10))) {
        expect(Math.abs(p.x - 50)).toBeLessThanOrEqual(5);
        expect(Math.abs(p.y - 50)).toBeLessThanOrEqual(5);
      }
    }
    // Vertex counts differ (flag 5, triangle 3, diamond 4, disc drawn with arcs).
    expect(points(roleShapePath("phrase-start", 0, 0)).length).toBe(5);
    expect(points(roleShapePath("peak", 0, 0)).length).toBe(3);
    expect(points(roleShapePath("tension", 0, 0)).length).toBe(4);
    expect(roleShapePath("resolution", 0, 0)).toContain("A");
  });

  it("uses Okabe–Ito colours, one per role", () => {
    // Okabe & Ito, Color Universal Design (2008): the eight-colour palette.
    const okabeIto = ["#E69F00", "#56B4E9", "#009E73", "#F0E442", "#0072B2", "#D55E00", "#CC79A7", "#000000"];
    const colours = ROLE_ORDER.map((r) => ROLE_INFO[r].color);
    expect(new Set(colours).size).toBe(4);
    for (const c of colours) expect(okabeIto).toContain(c);
  });
});

describe("arcs, comments and widths", () => {
  it("bows one arc above both shapes on one system", () => {
    const [arc, ...rest] = tensionArc({ x: 10, y: 30, row: 1 }, { x: 90, y: 30, row: 1 });
    expect(rest).toEqual([]);
    const control = points(arc.replace("Q", "L").replace(" ", "L"))[1];
    expect(control.y).toBeLessThan(30);
  });

  it("splits the arc in two across a system break", () => {
    const arcs = tensionArc({ x: 500, y: 30, row: 1 }, { x: 20, y: 130, row: 2 });
    expect(arcs).toHaveLength(2);
    expect(arcs[0].startsWith("M500,30")).toBe(true);
    expect(arcs[1].endsWith("20,130")).toBe(true);
  });

  it("widens the comment marker for a two-digit count", () => {
    expect(commentMarker(0, 0, 12).width).toBeGreaterThan(commentMarker(0, 0, 3).width);
  });

  it("lets the wave run to the next note on the same system, but not across a break", () => {
    const box = (x: number, staffTop: number): NoteBox => ({ key: String(x), x, y: 0, width: 8, height: 10, staffTop, measureIndex: 0 });
    expect(waveWidth(box(0, 0), box(40, 0))).toBe(37);
    expect(waveWidth(box(0, 0), box(40, 100))).toBe(16);
    expect(waveWidth(box(0, 0), box(400, 0))).toBe(90);
  });
});

describe("glyph text on paper", () => {
  it("makes room between wave and staff for numbers of the size asked, and a tab tall enough for its count", () => {
    const screen = glyphSlots({ y: 100, staffTop: 100 }, 0.8);
    const paper = glyphSlots({ y: 100, staffTop: 100 }, 0.8, undefined, 10);
    // The wave's lowest point (centred hairline + half the tallest wave) stays above the digits' top (0.72 em over the baseline).
    const waveBottom = paper.centredHairline + (GLYPH.waveMaxHeight * 0.8) / 2;
    expect(waveBottom).toBeLessThan(paper.labelY - 0.72 * 10);
    expect(paper.roleY).toBeLessThan(screen.roleY);
    const tab = commentMarker(0, 0, 3, 0.8, 10);
    expect(tab.height).toBeGreaterThan(10);
    // Digits of 0.72 em centred in the tab: their top below the tab's top, baseline above its bottom.
    expect(tab.textY - 0.72 * 10).toBeGreaterThan(0);
    expect(tab.textY).toBeLessThan(tab.height);
    expect(glyphBandHeight(0.8, 10)).toBeGreaterThan(glyphBandHeight(0.8));
    expect(glyphBandHeight(1)).toBe(GLYPH_BAND_HEIGHT);
  });
});
