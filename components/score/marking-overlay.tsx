"use client";

import { VALUE_WORDS, onsetAndShape } from "@/lib/markings/labels";
import type { MarkingValues } from "@/lib/markings/schema";
import { memo, useLayoutEffect, useMemo } from "react";
import type { Role } from "@/lib/analysis/types";
import type { MarkingState } from "@/lib/markings/changes";
import {
  GLYPH, commentMarker, glyphSlots, glyphText, roleShapePath, suggestionDash, vibratoWave, waveWidth,
  type NoteBox,
} from "@/lib/markings/glyph-geometry";
import { hitSpans, TOUCH_TARGET_PX } from "@/lib/markings/hit-areas";
import { fitLabels } from "@/lib/markings/glyph-labels";
import { tensionArcPieces, type ArcRow } from "@/lib/markings/tension-arc";
import { ROLE_INFO } from "@/lib/markings/roles";
import type { Selection } from "@/lib/markings/selection";
import { formatNumber } from "@/lib/markings/pulses";

export interface PendingSuggestion {
  noteKey: string;
  role: Role;
  confidence: number;
  resolvesTo: string | null;
}

export interface MarkingOverlayProps {
  boxes: NoteBox[];
  width: number;
  height: number;
  scale: number;
  markings: MarkingState;
  suggestions?: PendingSuggestion[];
  /** A tension tone's resolution, from the analysis (drawn as an arc when both are on the score). */
  resolutions?: Readonly<Record<string, string>>;
  /** Each note's sounding duration in seconds at the part's tempo. */
  durations?: Readonly<Record<string, number>>;
  commentCounts?: Readonly<Record<string, number>>;
  /**
   * The systems, top to bottom, with their margins: an arc crossing a line break is cut at them.
   * Without them, notes are grouped into systems by their staff and arcs end in short stubs.
   */
  systems?: readonly OverlaySystem[];
  /**
   * Paper mode: glyph text at least this many px (the stand copy asks for 7 pt), and the numbers
   * under the waves kept apart from each other instead of fitted to their waves.
   */
  minTextPx?: number;
  selection: Selection;
  onNoteClick?: (key: string, mode: "only" | "toggle" | "extend") => void;
}

const INK = "#1B1A17";
const GRAPHITE = "#4A4740";
const PAPER = "#FBF8F1";

export interface OverlaySystem {
  staffTop: number;
  left: number;
  right: number;
  /**
   * What the engraving draws above this system's staff (slurs, words, tempo, numbers), as boxes:
   * the glyphs of a note rise above whatever lies under them.
   */
  sky?: readonly { left: number; right: number; top: number }[];
}

interface Placed {
  box: NoteBox;
  next: NoteBox | undefined;
  rowTop: number;
  row: number;
}

interface Rows {
  placed: Map<string, Placed>;
  /** Each system's highest note top (its staff top when it has no note), by row. */
  tops: number[];
}

/**
 * Groups notes by system (same staff top) and finds each system's highest point: its notes, and
 * the engraving's sky over the notes that carry glyphs (`glyphed`).
 */
function place(boxes: NoteBox[], systems: readonly OverlaySystem[] | undefined, glyphed: ReadonlySet<string>, scale: number): Rows {
  const rows: { staffTop: number; top: number }[] = (systems ?? []).map((s) => ({ staffTop: s.staffTop, top: s.staffTop }));
  const rowOf = (b: NoteBox) => {
    let i = rows.findIndex((r) => Math.abs(r.staffTop - b.staffTop) <= 1);
    if (i < 0) i = rows.push({ staffTop: b.staffTop, top: b.staffTop }) - 1;
    rows[i].top = Math.min(rows[i].top, b.y);
    return i;
  };
  const rowIndex = boxes.map(rowOf);
  boxes.forEach((box, i) => {
    const sky = systems?.[rowIndex[i]]?.sky;
    if (!sky || !glyphed.has(box.key)) return;
    // The glyph stack's reach: the wave (up to the next note) and the numbers under it.
    const left = box.x - 4 * scale;
    const right = box.x + waveWidth(box, boxes[i + 1], scale) + 4 * scale;
    for (const b of sky) if (b.right > left && b.left < right) rows[rowIndex[i]].top = Math.min(rows[rowIndex[i]].top, b.top);
  });
  const placed = new Map<string, Placed>();
  boxes.forEach((box, i) => {
    placed.set(box.key, { box, next: boxes[i + 1], rowTop: rows[rowIndex[i]].top, row: rowIndex[i] });
  });
  return { placed, tops: rows.map((r) => r.top) };
}

/** Our SVG layers over the engraving: marking glyphs, suggestion outlines and hit areas; the selection above them. */
export function MarkingOverlay(props: MarkingOverlayProps) {
  const glyphed = useMemo(
    () => new Set([...Object.keys(props.markings), ...(props.suggestions ?? []).map((s) => s.noteKey), ...Object.keys(props.commentCounts ?? {})]),
    [props.markings, props.suggestions, props.commentCounts],
  );
  const { placed, tops } = useMemo(() => place(props.boxes, props.systems, glyphed, props.scale), [props.boxes, props.systems, glyphed, props.scale]);
  const size = { width: props.width, height: props.height, viewBox: `0 0 ${props.width} ${props.height}` };
  return (
    <>
      <svg className="pointer-events-none absolute left-0 top-0 select-none" {...size} data-testid="marking-overlay" aria-hidden="true">
        <GlyphLayer
          placed={placed}
          scale={props.scale}
          markings={props.markings}
          suggestions={props.suggestions}
          resolutions={props.resolutions}
          durations={props.durations}
          commentCounts={props.commentCounts}
          focus={props.selection.focus}
          systems={props.systems}
          tops={tops}
          width={props.width}
          minTextPx={props.minTextPx}
        />
        <CommentMarkerLayer placed={placed} scale={props.scale} markings={props.markings} commentCounts={props.commentCounts} minTextPx={props.minTextPx} />
        <HitLayer placed={placed} scale={props.scale} onNoteClick={props.onNoteClick} />
      </svg>
      {/* The selection in an SVG and a compositor layer of its own: selecting a note repaints
          this small drawing, not the whole score with its glyphs (measured: most of a click's
          cost on a long, marked part was painting). */}
      {props.selection.keys.length > 0 ? (
        <svg className="pointer-events-none absolute left-0 top-0 select-none [will-change:transform]" {...size} data-layer="selection-svg" aria-hidden="true">
          <SelectionLayer placed={placed} selection={props.selection} scale={props.scale} />
        </svg>
      ) : null}
    </>
  );
}

/** Comment markers on notes that carry no marking (marked notes draw theirs with their glyphs). */
const CommentMarkerLayer = memo(function CommentMarkerLayer({
  placed, scale, markings, commentCounts, minTextPx,
}: { placed: Map<string, Placed>; scale: number; markings: MarkingState; commentCounts?: Readonly<Record<string, number>>; minTextPx?: number }) {
  if (!commentCounts) return null;
  const size = GLYPH.roleSize * scale;
  const text = glyphText(scale, minTextPx);
  return (
    <g data-layer="comments">
      {Object.entries(commentCounts).map(([key, count]) => {
        const p = placed.get(key);
        if (!p || markings[key] || count <= 0) return null;
        const slots = glyphSlots(p.box, scale, p.rowTop, minTextPx);
        const marker = commentMarker(p.box.x + p.box.width / 2 + size * 0.7, slots.commentY, count, scale, text.count);
        return (
          <g key={key} data-glyph="comment" data-note-key={key} data-count={count} data-system={p.row}>
            <path d={marker.path} fill={PAPER} stroke={INK} strokeWidth={0.9} strokeLinejoin="round" />
            <text x={marker.textX} y={marker.textY} fontSize={text.count} textAnchor="middle" fill={INK} data-glyph-text="count">
              {count}
            </text>
          </g>
        );
      })}
    </g>
  );
});

/**
 * Notes in one column of a system (a chord, two voices at one x, or nearly: the engraver shifts a
 * voice's head by a hair) have targets that overlap and reach down to their own heads: drawn in
 * time order, the last would cover the others and take every tap. The taller targets go first and
 * the shorter over them, so a tap on a head, or just above it, reaches that note. A column is a run
 * of notes in one row whose heads' centres lie within a head's width of the run's first. Everything
 * else keeps its order (time order).
 */
function stackTargets<T extends { row: number; box: { x: number; width: number }; top: number; bottom: number }>(targets: T[]): T[] {
  const centre = (t: T) => t.box.x + t.box.width / 2;
  const byPlace = [...targets].sort((a, b) => a.row - b.row || centre(a) - centre(b));
  // Layer 0: a note alone in its column, or its column's tallest target; then one layer per
  // step shorter.
  const layer = new Map<T, number>();
  for (let i = 0; i < byPlace.length; ) {
    const first = byPlace[i];
    let j = i + 1;
    while (j < byPlace.length && byPlace[j].row === first.row && centre(byPlace[j]) - centre(first) <= first.box.width) j++;
    if (j - i > 1) byPlace.slice(i, j).sort((a, b) => b.bottom - b.top - (a.bottom - a.top)).forEach((t, n) => layer.set(t, n));
    i = j;
  }
  if (layer.size === 0) return targets;
  return targets.map((t, i) => ({ t, i, l: layer.get(t) ?? 0 })).sort((a, b) => a.l - b.l || a.i - b.i).map((x) => x.t);
}

const HitLayer = memo(function HitLayer({
  placed, scale, onNoteClick,
}: { placed: Map<string, Placed>; scale: number; onNoteClick?: MarkingOverlayProps["onNoteClick"] }) {
  useLayoutEffect(() => {
    if (placed.size > 0) performance.mark("ondula:notes-selectable");
  }, [placed]);
  // Touch targets up to 44 px wide without taking a neighbour's taps (lib/markings/hit-areas.ts).
  const spans = useMemo(
    () =>
      hitSpans(
        [...placed.values()].map(({ box, row }) => ({ key: box.key, centre: box.x + box.width / 2, row, minWidth: Math.max(box.width + 8 * scale, 24) })),
      ),
    [placed, scale],
  );
  const targets = useMemo(
    () =>
      stackTargets(
        [...placed.values()].map(({ box, row, rowTop }) => {
          const slots = glyphSlots(box, scale, rowTop);
          // From the glyphs above down to the note, and never less than a fingertip tall.
          const top = slots.commentY;
          return { box, row, span: spans.get(box.key)!, top, bottom: Math.max(box.y + box.height + 4 * scale, top + TOUCH_TARGET_PX) };
        }),
      ),
    [placed, scale, spans],
  );
  return (
    <g data-layer="hits">
      {targets.map(({ box, span, top, bottom }) => {
        return (
          <rect
            key={box.key}
            data-note-key={box.key}
            // Where in its target the note's own centre lies (0–1): a target reaching further
            // towards a distant neighbour than a near one is not centred on its note.
            data-centre-at={((box.x + box.width / 2 - span.left) / span.width).toFixed(4)}
            x={span.left}
            y={top}
            width={span.width}
            height={bottom - top}
            fill="transparent"
            className="pointer-events-auto cursor-pointer"
            // A click, not a pointer-down: on a tablet a drag that starts on a note scrolls.
            onClick={(e) => onNoteClick?.(box.key, e.shiftKey ? "extend" : e.ctrlKey || e.metaKey ? "toggle" : "only")}
          />
        );
      })}
    </g>
  );
});

const SelectionLayer = memo(function SelectionLayer({ placed, selection, scale }: { placed: Map<string, Placed>; selection: Selection; scale: number }) {
  const pad = 3 * scale;
  return (
    <g data-layer="selection">
      {selection.keys.map((key) => {
        const p = placed.get(key);
        if (!p) return null;
        const { box } = p;
        const isFocus = key === selection.focus;
        const x = box.x - pad;
        const y = box.y - pad;
        const w = box.width + pad * 2;
        const h = box.height + pad * 2;
        const under = box.y + box.height + pad + 3 * scale;
        const cx = box.x + box.width / 2;
        return (
          <g key={key} data-selected={key} data-focus={isFocus ? "true" : undefined}>
            <rect x={x} y={y} width={w} height={h} rx={3 * scale} fill="#0072B2" fillOpacity={0.1} />
            {isFocus ? (
              <>
                {/* The focus is a thick outline plus a caret under the note, not a colour alone. */}
                <rect x={x} y={y} width={w} height={h} rx={3 * scale} fill="none" stroke={INK} strokeWidth={2.5} />
                <path
                  d={`M${cx},${under}l${5 * scale},${7 * scale}h${-10 * scale}z`}
                  fill={INK}
                  data-caret="true"
                />
              </>
            ) : (
              <line x1={x} x2={x + w} y1={under} y2={under} stroke={INK} strokeWidth={2} strokeLinecap="round" />
            )}
          </g>
        );
      })}
    </g>
  );
});

const GlyphLayer = memo(function GlyphLayer({
  placed, scale, markings, suggestions, resolutions, durations, commentCounts, focus, systems, tops, width: stageWidth, minTextPx,
}: {
  placed: Map<string, Placed>;
  scale: number;
  markings: MarkingState;
  suggestions?: PendingSuggestion[];
  resolutions?: Readonly<Record<string, string>>;
  durations?: Readonly<Record<string, number>>;
  commentCounts?: Readonly<Record<string, number>>;
  focus: string | null;
  systems?: readonly OverlaySystem[];
  tops: number[];
  width: number;
  minTextPx?: number;
}) {
  const size = GLYPH.roleSize * scale;
  const text = glyphText(scale, minTextPx);
  // Independent of the focus: a click on a note does not redraw the arcs.
  const arcs = useMemo(
    () => tensionArcs({ placed, markings, resolutions, suggestions, systems, tops, scale, minTextPx }),
    [placed, markings, resolutions, suggestions, systems, tops, scale, minTextPx],
  );

  // On paper the numbers stay large, so they are kept apart rather than fitted to their waves.
  const paperLabels = minTextPx
    ? fitLabels(
        Object.values(markings).flatMap((m) => {
          const p = placed.get(m.noteKey);
          return p ? [{ key: m.noteKey, row: p.row, x: p.box.x, text: labelOf(m) }] : [];
        }),
        text.label,
        text.label / 2,
        stageWidth,
      )
    : null;

  return (
    <g data-layer="glyphs">
      {/* Each piece of an arc is drawn on its own, tagged with its system, so the stand copy can
          cut the score into systems without splitting a piece. */}
      {arcs.flatMap((arc) =>
        arc.pieces.map((piece, i) => (
          <path
            key={`arc:${arc.key}:${i}`}
            d={piece.path}
            fill="none"
            stroke={GRAPHITE}
            strokeWidth={1}
            strokeDasharray={arc.dashed ? suggestionDash(scale) : undefined}
            data-glyph="arc"
            data-note-key={arc.key}
            data-piece={piece.kind}
            data-system={piece.row}
          />
        )),
      )}
      {Object.values(markings).map((marking) => {
        const p = placed.get(marking.noteKey);
        if (!p) return null;
        return (
          <MarkingGlyph
            key={marking.noteKey}
            marking={marking}
            placed={p}
            scale={scale}
            minTextPx={minTextPx}
            durationSeconds={durations?.[marking.noteKey]}
            comments={commentCounts?.[marking.noteKey] ?? (marking.comment.trim() ? 1 : 0)}
            focused={marking.noteKey === focus}
            paperLabel={paperLabels ? paperLabels.has(marking.noteKey) : null}
          />
        );
      })}
      {(suggestions ?? []).map((s) => {
        const anchor = roleAnchorOf(placed, s.noteKey, scale, minTextPx);
        if (!anchor) return null;
        // When the note already carries another role, the suggestion stands beside it.
        const offset = markings[s.noteKey]?.role ? size + 3 * scale : 0;
        return (
          <path
            key={`s:${s.noteKey}:${s.role}`}
            d={roleShapePath(s.role, anchor.x + offset, anchor.y, size)}
            fill={PAPER}
            fillOpacity={0.9}
            stroke={INK}
            strokeWidth={1}
            strokeDasharray={suggestionDash(scale)}
            data-glyph="suggestion"
            data-role={s.role}
            data-note-key={s.noteKey}
            data-confidence={s.confidence >= 0.5 ? "suggested" : "possible"}
            data-system={anchor.row}
          />
        );
      })}
    </g>
  );
});

/**
 * One marked note's glyphs. Memoized: selecting a note changes only the glyphs of the notes that
 * gain or lose the focus, and a long part may carry hundreds of marked notes.
 */
const MarkingGlyph = memo(function MarkingGlyph({
  marking, placed: p, scale, minTextPx, durationSeconds, comments, focused, paperLabel,
}: {
  marking: MarkingState[string];
  placed: Placed;
  scale: number;
  minTextPx?: number;
  durationSeconds: number | undefined;
  comments: number;
  focused: boolean;
  /** On paper, whether the numbers found room (null on screen, where they fit their wave). */
  paperLabel: boolean | null;
}) {
  const size = GLYPH.roleSize * scale;
  const text = glyphText(scale, minTextPx);
  const { box, next, rowTop } = p;
  const slots = glyphSlots(box, scale, rowTop, minTextPx);
  const width = waveWidth(box, next, scale);
  const hairlineY = marking.placement === "top-on-pitch" ? slots.hangingHairline : slots.centredHairline;
  const wave = vibratoWave({
    x: box.x,
    width,
    hairline: hairlineY,
    depthCents: marking.depthCents,
    speedHz: marking.speedHz,
    placement: marking.placement,
    onset: marking.onset,
    shape: marking.shape,
    durationSeconds,
    scale,
  });
  const label = labelOf(marking);
  const labelFits = paperLabel ?? (width >= label.length * 4.2 * scale || focused);
  const cx = box.x + box.width / 2;
  // A tension tone's arc leaves to the right, so its comment tab stands on the left.
  const tabWidth = commentMarker(0, 0, comments, scale, text.count).width;
  const tabX = marking.role === "tension" ? cx - size * 0.7 - tabWidth : cx + size * 0.7;
  const marker = comments > 0 ? commentMarker(tabX, slots.commentY, comments, scale, text.count) : null;
  return (
    <g data-marking={marking.noteKey} data-system={p.row}>
      <title>{describe(marking)}</title>
      <g data-glyph="wave" data-note-key={marking.noteKey} data-kind={wave.kind} data-crests={formatNumber(wave.crests, 2)}>
        {wave.kind === "wave" ? (
          <line x1={wave.hairline.x1} x2={wave.hairline.x2} y1={wave.hairline.y} y2={wave.hairline.y} stroke={GRAPHITE} strokeWidth={0.5} strokeOpacity={0.7} />
        ) : null}
        <path d={wave.path} fill="none" stroke={INK} strokeWidth={wave.kind === "wave" ? 1.3 : 1.6} strokeLinejoin="round" strokeLinecap="round" />
      </g>
      {labelFits ? (
        <text x={box.x} y={slots.labelY} fontSize={text.label} fill={GRAPHITE} data-glyph="numbers" data-glyph-text="numbers" data-note-key={marking.noteKey}>
          {label}
        </text>
      ) : null}
      {marking.role ? (
        <path
          d={roleShapePath(marking.role, cx, slots.roleY, size)}
          fill={ROLE_INFO[marking.role].color}
          stroke={INK}
          strokeWidth={0.9}
          strokeLinejoin="round"
          data-glyph="role"
          data-role={marking.role}
          data-note-key={marking.noteKey}
        />
      ) : null}
      {marker ? (
        <g data-glyph="comment" data-note-key={marking.noteKey} data-count={comments}>
          <path d={marker.path} fill={PAPER} stroke={INK} strokeWidth={0.9} strokeLinejoin="round" />
          <text x={marker.textX} y={marker.textY} fontSize={text.count} textAnchor="middle" fill={INK} data-glyph-text="count">
            {comments}
          </text>
        </g>
      ) : null}
    </g>
  );
});

/** Where a note's role shape sits (its centre), or null when the note is not on the score. */
function roleAnchorOf(placed: Map<string, Placed>, key: string, scale: number, minTextPx?: number) {
  const p = placed.get(key);
  if (!p) return null;
  const slots = glyphSlots(p.box, scale, p.rowTop, minTextPx);
  return { x: p.box.x + p.box.width / 2, y: slots.roleY, row: p.row };
}

/** The arcs from tension tones to their resolutions: marked ones solid, suggested ones dashed. */
function tensionArcs({ placed, markings, resolutions, suggestions, systems, tops, scale, minTextPx }: {
  placed: Map<string, Placed>;
  markings: MarkingState;
  resolutions?: Readonly<Record<string, string>>;
  suggestions?: PendingSuggestion[];
  systems?: readonly OverlaySystem[];
  tops: number[];
  scale: number;
  minTextPx?: number;
}): { key: string; pieces: ReturnType<typeof tensionArcPieces>; dashed: boolean }[] {
  const size = GLYPH.roleSize * scale;
  // Each system's margins and the height an arc keeps over it (the top of its role shapes).
  const arcRows: (ArcRow | undefined)[] = (systems ?? []).map((s, row) => ({
    left: s.left,
    right: s.right,
    y: glyphSlots({ y: tops[row] ?? s.staffTop, staffTop: s.staffTop }, scale, tops[row], minTextPx).roleY - size / 2,
  }));
  const arcs: { key: string; pieces: ReturnType<typeof tensionArcPieces>; dashed: boolean }[] = [];
  const addArc = (key: string, fromKey: string, toKey: string | undefined, dashed: boolean) => {
    const from = roleAnchorOf(placed, fromKey, scale, minTextPx);
    const to = toKey ? roleAnchorOf(placed, toKey, scale, minTextPx) : null;
    if (!from || !to) return;
    arcs.push({ key, dashed, pieces: tensionArcPieces({ ...from, y: from.y - size / 2 }, { ...to, y: to.y - size / 2 }, arcRows, scale) });
  };
  for (const marking of Object.values(markings)) {
    if (marking.role !== "tension") continue;
    addArc(marking.noteKey, marking.noteKey, resolutions?.[marking.noteKey] ?? nextResolution(placed, markings, marking.noteKey), false);
  }
  for (const s of suggestions ?? []) {
    if (s.role !== "tension" || !s.resolvesTo || markings[s.noteKey]?.role === "tension") continue;
    addArc(`s:${s.noteKey}`, s.noteKey, s.resolvesTo, true);
  }
  return arcs;
}

/** The numbers under a wave: depth in cents, then speed in Hz; "none" under a flat line. */
function labelOf(m: { depthCents: number; speedHz: number }): string {
  return m.depthCents === 0 || m.speedHz === 0 ? "none" : `${formatNumber(m.depthCents, 0)}¢ ${formatNumber(m.speedHz, 1)}`;
}

/** Without an analysis answer: the next note marked as a resolution within a few notes. */
function nextResolution(placed: Map<string, Placed>, markings: MarkingState, from: string): string | undefined {
  const keys = [...placed.keys()];
  const i = keys.indexOf(from);
  if (i < 0) return undefined;
  return keys.slice(i + 1, i + 9).find((k) => markings[k]?.role === "resolution");
}

function describe(m: Pick<MarkingValues, "depthCents" | "speedHz" | "placement" | "onset" | "shape" | "role" | "comment">): string {
  const vib = m.depthCents === 0 || m.speedHz === 0 ? "no vibrato (deliberate)" : `vibrato ${formatNumber(m.depthCents, 1)}¢ at ${formatNumber(m.speedHz, 2)} Hz, ${VALUE_WORDS.placement[m.placement].toLowerCase()}, ${onsetAndShape(m).toLowerCase()}`;
  const role = m.role ? `; ${ROLE_INFO[m.role].label.toLowerCase()}` : "";
  const comment = m.comment.trim() ? `; “${m.comment.trim()}”` : "";
  return `${vib}${role}${comment}`;
}
