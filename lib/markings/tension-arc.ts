/**
 * The arc from a tension tone to its resolution, cut at line breaks the way an engraver cuts a
 * slur (common practice): on the tension tone's system the arc leaves the note and runs out to the
 * system's right margin, on the resolution's system it comes in from the left margin and lands on
 * the note, and a system wholly crossed in between carries a flat piece margin to margin. Each
 * piece lies inside its own system, so cutting the score into systems (and systems onto pages)
 * never drops part of an arc.
 */

/** One end of the arc: where the role shape's top is, and on which system (0-based, top to bottom). */
export interface ArcEnd {
  x: number;
  y: number;
  row: number;
}

/** A system's margins (the ends of its staff lines) and the height an arc passing over it keeps. */
export interface ArcRow {
  left: number;
  right: number;
  /** The arc's baseline on this system (the top of the role shapes there). */
  y: number;
}

export type ArcPieceKind = "whole" | "leaving" | "crossing" | "arriving";

export interface ArcPiece {
  kind: ArcPieceKind;
  /** The system the piece is drawn on. */
  row: number;
  path: string;
  /** Horizontal extent and highest point, for tests and for keeping the piece inside its system. */
  x1: number;
  x2: number;
  top: number;
}

const f = (n: number) => (Math.round(n * 10) / 10).toString();

/** How far an arc over a horizontal distance rises above its ends. */
export function arcLift(dx: number, scale = 1): number {
  return Math.min(14 * scale, Math.max(5 * scale, Math.abs(dx) * 0.2));
}

function curve(kind: ArcPieceKind, row: number, x1: number, y1: number, x2: number, y2: number, cx: number, cy: number): ArcPiece {
  // A quadratic's highest point is no higher than its control point, and no lower than its ends.
  const top = Math.min(y1, y2, (y1 + y2) / 4 + cy / 2);
  return { kind, row, path: `M${f(x1)},${f(y1)}Q${f(cx)},${f(cy)} ${f(x2)},${f(y2)}`, x1: Math.min(x1, x2), x2: Math.max(x1, x2), top };
}

/**
 * The pieces of one arc. `rows` describes every system by index; without a row for a system the
 * arc is drawn as the short stubs it had before margins were known.
 */
export function tensionArcPieces(from: ArcEnd, to: ArcEnd, rows: readonly (ArcRow | undefined)[] = [], scale = 1): ArcPiece[] {
  if (from.row === to.row) {
    const lift = arcLift(to.x - from.x, scale);
    return [curve("whole", from.row, from.x, from.y, to.x, to.y, (from.x + to.x) / 2, Math.min(from.y, to.y) - lift)];
  }
  // An arc only runs forward in the score; a resolution on an earlier system is drawn like the
  // later one (the caller's data is odd, but nothing is dropped).
  const [a, b] = from.row < to.row ? [from, to] : [to, from];
  const stub = 28 * scale;
  const pieces: ArcPiece[] = [];

  const first = rows[a.row];
  // The open end stays a little inside the margin so no stroke is cut at the system's edge.
  const inset = 1 * scale;
  const right = first ? Math.max(first.right - inset, a.x + 6 * scale) : a.x + stub;
  const liftA = arcLift(right - a.x, scale);
  pieces.push(curve("leaving", a.row, a.x, a.y, right, a.y - liftA, a.x + (right - a.x) * 0.5, a.y - liftA));

  for (let r = a.row + 1; r < b.row; r++) {
    const row = rows[r];
    if (!row) continue;
    const y = row.y - arcLift(row.right - row.left, scale);
    pieces.push({ kind: "crossing", row: r, path: `M${f(row.left + inset)},${f(y)}L${f(row.right - inset)},${f(y)}`, x1: row.left + inset, x2: row.right - inset, top: y });
  }

  const last = rows[b.row];
  const left = last ? Math.min(last.left + inset, b.x - 6 * scale) : b.x - stub;
  const liftB = arcLift(b.x - left, scale);
  pieces.push(curve("arriving", b.row, left, b.y - liftB, b.x, b.y, left + (b.x - left) * 0.5, b.y - liftB));
  return pieces;
}
