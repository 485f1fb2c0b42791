/**
 * Geometry of the marking glyphs drawn above the staff (pure; px in the overlay's coordinates).
 *
 * From the note upward: the vibrato wave on its hairline, the role shape, the comment marker.
 * Every value a glyph shows is carried by shape, not colour: wave height ↔ depth, crests ↔ speed,
 * hairline position ↔ placement, flat lead-in ↔ delayed onset, envelope ↔ shape, silhouette ↔ role.
 */
import type { MarkingValues } from "./schema";
import type { Role } from "@/lib/analysis/types";
import { tensionArcPieces } from "./tension-arc";

/** A note's box in the overlay, measured from the engraving. */
export interface NoteBox {
  key: string;
  x: number;
  y: number;
  width: number;
  height: number;
  /** y of the top line of the note's staff. */
  staffTop: number;
  measureIndex: number;
}

/** Sizes at zoom 1. */
export const GLYPH = {
  /** Peak-to-peak wave height at 100 cents. */
  waveMaxHeight: 11,
  /** Peak-to-peak wave height at the smallest depth above 0, so a shallow vibrato stays visible. */
  waveMinHeight: 1.6,
  /** The narrowest crest drawn; denser speeds are capped (the numbers stay honest). */
  minCrestWidth: 3,
  /** Crests drawn when the note's duration is unknown: speed × this many seconds. */
  nominalSeconds: 0.5,
  /** Share of the width that stays flat before a delayed onset. */
  delayedShare: 0.35,
  /** Envelope floor of a growing or fading wave. */
  envelopeFloor: 0.15,
  roleSize: 10,
  gap: 4,
  commentSize: 9,
} as const;

export interface WaveInput {
  x: number;
  width: number;
  /** y of the hairline the wave is drawn against. */
  hairline: number;
  depthCents: number;
  speedHz: number;
  placement: MarkingValues["placement"];
  onset: MarkingValues["onset"];
  shape: MarkingValues["shape"];
  /** The note's sounding duration at the part's tempo; crests then equal the real pulse count. */
  durationSeconds?: number;
  scale?: number;
}

export interface WaveGeometry {
  kind: "wave" | "none";
  /** The stroke: a polyline for a wave, the flat line with end caps for "deliberately none". */
  path: string;
  hairline: { x1: number; x2: number; y: number };
  /** Peak-to-peak height at full envelope. */
  height: number;
  /** Crests drawn across the oscillating part. */
  crests: number;
  /** x where the oscillation begins (later than `x` for a delayed onset). */
  startX: number;
  top: number;
  bottom: number;
}

const f = (n: number) => (Math.round(n * 10) / 10).toString();

/** Peak-to-peak wave height for a depth: grows with depth (square-root, so small depths read). */
export function waveHeight(depthCents: number, scale = 1): number {
  if (!(depthCents > 0)) return 0;
  const d = Math.min(depthCents, 100) / 100;
  return (GLYPH.waveMinHeight + (GLYPH.waveMaxHeight - GLYPH.waveMinHeight) * Math.sqrt(d)) * scale;
}

/** Crests across the oscillating width: the pulse count over the note, legibility-capped. */
export function waveCrests(speedHz: number, activeWidth: number, activeSeconds: number, scale = 1): number {
  if (!(speedHz > 0) || activeWidth <= 0) return 0;
  const wanted = speedHz * activeSeconds;
  const most = Math.max(1, Math.floor(activeWidth / (GLYPH.minCrestWidth * scale)));
  return Math.min(Math.max(wanted, 1), most);
}

function envelope(shape: WaveInput["shape"], t: number): number {
  if (shape === "growing") return GLYPH.envelopeFloor + (1 - GLYPH.envelopeFloor) * t;
  if (shape === "fading") return 1 - (1 - GLYPH.envelopeFloor) * t;
  return 1;
}

export function vibratoWave(input: WaveInput): WaveGeometry {
  const scale = input.scale ?? 1;
  const { x, width, hairline: y } = input;
  const x2 = x + width;
  const height = waveHeight(input.depthCents, scale);
  const hairline = { x1: x, x2, y };
  if (height === 0 || !(input.speedHz > 0)) {
    // Deliberately none: a flat line with short end caps, so it differs from "not marked".
    const cap = 2 * scale;
    const path = `M${f(x)},${f(y - cap)}L${f(x)},${f(y + cap)}M${f(x)},${f(y)}L${f(x2)},${f(y)}M${f(x2)},${f(y - cap)}L${f(x2)},${f(y + cap)}`;
    return { kind: "none", path, hairline, height: 0, crests: 0, startX: x, top: y - cap, bottom: y + cap };
  }
  const share = input.onset === "delayed" ? GLYPH.delayedShare : 0;
  const startX = x + width * share;
  const activeWidth = x2 - startX;
  const seconds = (input.durationSeconds ?? GLYPH.nominalSeconds) * (1 - share);
  const crests = waveCrests(input.speedHz, activeWidth, seconds, scale);
  const amp = height / 2;
  const steps = Math.min(400, Math.max(24, Math.ceil(crests * 14)));
  let path = `M${f(x)},${f(y)}`;
  if (startX > x) path += `L${f(startX)},${f(y)}`;
  for (let i = 1; i <= steps; i++) {
    const t = i / steps;
    const phase = 2 * Math.PI * crests * t;
    const e = envelope(input.shape, t);
    // Centred: the pitch is the middle of the oscillation. Top on pitch: the wave hangs from the
    // hairline and only its tops touch it.
    const py = input.placement === "top-on-pitch" ? y + amp * e * (1 - Math.cos(phase)) : y - amp * e * Math.sin(phase);
    path += `L${f(startX + activeWidth * t)},${f(py)}`;
  }
  const top = input.placement === "top-on-pitch" ? y : y - amp;
  const bottom = input.placement === "top-on-pitch" ? y + height : y + amp;
  return { kind: "wave", path, hairline, height, crests, startX, top, bottom };
}

/** Where each glyph of a note sits: one row per kind, stacked upward from above the staff. */
export interface GlyphSlots {
  /** Hairline of a centred wave (the middle of the wave band). */
  centredHairline: number;
  /** Hairline of a hanging wave (the top of the wave band). */
  hangingHairline: number;
  /** Centre of the role shape. */
  roleY: number;
  /** Top of the comment marker. */
  commentY: number;
  /** Baseline of the small numbers under the wave band (they sit between wave and staff). */
  labelY: number;
}

/**
 * Font sizes (px) of the glyphs' text: the numbers under a wave and the count in a comment tab.
 * `minPx` raises both, for paper, where a size is a size in points (see lib/stand-copy/options.ts).
 */
export function glyphText(scale = 1, minPx = 0): { label: number; count: number } {
  return { label: Math.max(8 * scale, minPx), count: Math.max(7 * scale, minPx) };
}

/** Digits of the fonts we use stand about 0.72 em tall; 0.85 em leaves room for "¢". */
const TEXT_HEIGHT_EM = 0.85;

function commentHeight(scale: number, countPx: number): number {
  return Math.max(GLYPH.commentSize * scale, countPx * 1.05);
}

function labelRoom(scale: number, labelPx: number): number {
  return Math.max(9 * scale, labelPx * TEXT_HEIGHT_EM + 2 * scale);
}

export function glyphSlots(box: Pick<NoteBox, "y" | "staffTop">, scale = 1, rowTop?: number, minTextPx = 0): GlyphSlots {
  const text = glyphText(scale, minTextPx);
  // The band starts above whichever is higher: the staff's top line or the note (ledger lines).
  const base = (rowTop ?? Math.min(box.staffTop, box.y)) - GLYPH.gap * scale;
  const labelY = base;
  const waveBottom = base - labelRoom(scale, text.label);
  const waveTop = waveBottom - GLYPH.waveMaxHeight * scale;
  const roleY = waveTop - GLYPH.gap * scale - (GLYPH.roleSize / 2) * scale;
  const commentY = roleY - (GLYPH.roleSize / 2) * scale - GLYPH.gap * scale - commentHeight(scale, text.count);
  return {
    centredHairline: (waveTop + waveBottom) / 2,
    hangingHairline: waveTop,
    roleY,
    commentY,
    labelY,
  };
}

/** Vertical room the glyphs need above the staff, at zoom 1 (used to space the systems). */
export const GLYPH_BAND_HEIGHT = 9 + GLYPH.waveMaxHeight + GLYPH.gap * 3 + GLYPH.roleSize + GLYPH.commentSize + 4;

/** The same room in px at a zoom, with the glyph text at least `minTextPx`. */
export function glyphBandHeight(scale = 1, minTextPx = 0): number {
  const text = glyphText(scale, minTextPx);
  return labelRoom(scale, text.label) + (GLYPH.waveMaxHeight + GLYPH.gap * 3 + GLYPH.roleSize + 4) * scale + commentHeight(scale, text.count);
}

/**
 * The four role shapes, one silhouette each, all inside a square of side `size` centred on
 * (cx, cy): phrase start a flag on its pole, peak a triangle pointing up, tension tone a diamond
 * standing on its point, resolution a disc.
 */
export function roleShapePath(role: Role, cx: number, cy: number, size: number = GLYPH.roleSize): string {
  const r = size / 2;
  switch (role) {
    case "phrase-start": {
      const x0 = cx - r;
      const pole = Math.max(1.5, size * 0.2);
      return `M${f(x0)},${f(cy + r)}L${f(x0)},${f(cy - r)}L${f(cx + r)},${f(cy - r * 0.3)}L${f(x0 + pole)},${f(cy + r * 0.3)}L${f(x0 + pole)},${f(cy + r)}Z`;
    }
    case "peak":
      return `M${f(cx)},${f(cy - r)}L${f(cx + r)},${f(cy + r)}L${f(cx - r)},${f(cy + r)}Z`;
    case "tension":
      return `M${f(cx)},${f(cy - r)}L${f(cx + r * 0.8)},${f(cy)}L${f(cx)},${f(cy + r)}L${f(cx - r * 0.8)},${f(cy)}Z`;
    case "resolution": {
      const rr = r * 0.85;
      return `M${f(cx - rr)},${f(cy)}A${f(rr)},${f(rr)} 0 1 0 ${f(cx + rr)},${f(cy)}A${f(rr)},${f(rr)} 0 1 0 ${f(cx - rr)},${f(cy)}Z`;
    }
  }
}

/** Dash pattern of a suggestion's hollow outline, scaled with the zoom. */
export function suggestionDash(scale = 1): string {
  return `${f(2 * scale)} ${f(1.5 * scale)}`;
}

/**
 * A thin arc from a tension tone's role shape to its resolution's (the paths only; see
 * tension-arc.ts for the pieces across line breaks and their margins).
 */
export function tensionArc(
  from: { x: number; y: number; row: number },
  to: { x: number; y: number; row: number },
  scale = 1,
): string[] {
  return tensionArcPieces(from, to, [], scale).map((p) => p.path);
}

/**
 * The comment marker: a small tab with a notch pointing down to the note, wide enough for a count
 * at `countPx` (default: the screen size at this zoom).
 */
export function commentMarker(x: number, top: number, count: number, scale = 1, countPx = glyphText(scale).count): { path: string; textX: number; textY: number; width: number; height: number } {
  const h = commentHeight(scale, countPx);
  const digits = String(count).length;
  // Digits are about 0.6 em wide in the fonts we use; 1.5 px of tab on each side.
  const w = Math.max((count > 9 ? 13 : 9.5) * scale, digits * 0.6 * countPx + 3 * scale);
  const notch = 2.5 * scale;
  const b = top + h;
  const path = `M${f(x)},${f(top)}L${f(x + w)},${f(top)}L${f(x + w)},${f(b)}L${f(x + notch * 2)},${f(b)}L${f(x)},${f(b + notch)}Z`;
  // The digits' baseline, so that their 0.72 em height sits in the middle of the tab.
  return { path, textX: x + w / 2, textY: top + (h + 0.72 * countPx) / 2, width: w, height: h + notch };
}

/** The wave's width for a note: up to the next note on the same system, within sensible bounds. */
export function waveWidth(box: NoteBox, next: NoteBox | undefined, scale = 1): number {
  const own = Math.max(box.width, 10 * scale);
  if (!next || Math.abs(next.staffTop - box.staffTop) > 1) return Math.max(own, 16 * scale);
  const room = next.x - box.x - 3 * scale;
  return Math.max(own, Math.min(room, 90 * scale));
}
