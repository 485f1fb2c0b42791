import { describe, expect, it } from "vitest";
import { arcLift, tensionArcPieces, type ArcRow } from "./tension-arc";

// Two systems of a page 700 px wide whose staves run from x = 20 to x = 690.
const rows: ArcRow[] = [
  { left: 20, right: 690, y: 40 },
  { left: 20, right: 690, y: 160 },
  { left: 20, right: 690, y: 280 },
];

/** The points a quadratic path passes through, sampled. */
function sample(path: string): { x: number; y: number }[] {
  const m = /^M([\d.-]+),([\d.-]+)Q([\d.-]+),([\d.-]+) ([\d.-]+),([\d.-]+)$/.exec(path);
  if (!m) throw new Error(`not a quadratic: ${path}`);
  const [x0, y0, cx, cy, x1, y1] = m.slice(1).map(Number);
  return Array.from({ length: 21 }, (_, i) => {
    const t = i / 20;
    const u = 1 - t;
    return { x: u * u * x0 + 2 * u * t * cx + t * t * x1, y: u * u * y0 + 2 * u * t * cy + t * t * y1 };
  });
}

describe("tension arc across a line break", () => {
  it("draws one arc bowing above both notes on one system", () => {
    const pieces = tensionArcPieces({ x: 100, y: 40, row: 0 }, { x: 180, y: 40, row: 0 }, rows);
    expect(pieces.map((p) => p.kind)).toEqual(["whole"]);
    const pts = sample(pieces[0].path);
    expect(pts[0]).toEqual({ x: 100, y: 40 });
    expect(pts[20]).toEqual({ x: 180, y: 40 });
    expect(Math.min(...pts.map((p) => p.y))).toBeLessThan(40);
  });

  it("cuts it in two at the break: leaving to the right margin, arriving from the left margin (as a slur is cut, common practice)", () => {
    const pieces = tensionArcPieces({ x: 640, y: 40, row: 0 }, { x: 70, y: 160, row: 1 }, rows);
    expect(pieces.map((p) => [p.kind, p.row])).toEqual([["leaving", 0], ["arriving", 1]]);
    const [leaving, arriving] = pieces.map((p) => sample(p.path));
    // Leaves the tension tone and rises toward the right margin, ending just inside it.
    expect(leaving[0]).toEqual({ x: 640, y: 40 });
    expect(leaving[20].x).toBeGreaterThan(685);
    expect(leaving[20].x).toBeLessThanOrEqual(690);
    expect(leaving[20].y).toBeLessThan(40);
    // Comes in from the left margin, high, and lands on the resolution.
    expect(arriving[0].x).toBeGreaterThanOrEqual(20);
    expect(arriving[0].x).toBeLessThan(25);
    expect(arriving[0].y).toBeLessThan(160);
    expect(arriving[20]).toEqual({ x: 70, y: 160 });
  });

  it("keeps every piece inside its own system, horizontally and in height", () => {
    const pieces = tensionArcPieces({ x: 600, y: 40, row: 0 }, { x: 90, y: 160, row: 1 }, rows, 0.8);
    for (const p of pieces) {
      const pts = sample(p.path);
      for (const pt of pts) {
        expect(pt.x).toBeGreaterThanOrEqual(rows[p.row].left);
        expect(pt.x).toBeLessThanOrEqual(rows[p.row].right);
        // No higher than the lift above its own system's arc line: nothing reaches the system above.
        expect(pt.y).toBeGreaterThanOrEqual(rows[p.row].y - arcLift(700, 0.8) - 0.1);
        expect(pt.y).toBeLessThanOrEqual(rows[p.row].y + 0.1);
      }
      expect(p.top).toBeCloseTo(Math.min(...pts.map((q) => q.y)), 0);
    }
  });

  it("carries a flat piece over a system crossed whole", () => {
    const pieces = tensionArcPieces({ x: 650, y: 40, row: 0 }, { x: 60, y: 280, row: 2 }, rows);
    expect(pieces.map((p) => [p.kind, p.row])).toEqual([["leaving", 0], ["crossing", 1], ["arriving", 2]]);
    const crossing = pieces[1];
    expect(crossing.x1).toBeGreaterThanOrEqual(20);
    expect(crossing.x2).toBeLessThanOrEqual(690);
    expect(crossing.x2 - crossing.x1).toBeGreaterThan(660);
  });

  it("still leaves and arrives when the notes sit right at the margins", () => {
    const pieces = tensionArcPieces({ x: 688, y: 40, row: 0 }, { x: 22, y: 160, row: 1 }, rows);
    expect(pieces).toHaveLength(2);
    for (const p of pieces) expect(p.x2 - p.x1).toBeGreaterThanOrEqual(5.9);
  });

  it("falls back to short stubs when the margins are not known", () => {
    const pieces = tensionArcPieces({ x: 500, y: 30, row: 1 }, { x: 20, y: 130, row: 2 });
    expect(pieces.map((p) => p.kind)).toEqual(["leaving", "arriving"]);
    expect(pieces[0].x1).toBe(500);
    expect(pieces[0].x2).toBe(528);
    expect(pieces[1].x2).toBe(20);
  });
});
