"use client";

import { memo, useMemo } from "react";
import type { Role } from "@/lib/analysis/types";
import type { MarkingState } from "@/lib/markings/changes";
import {
  GLYPH, commentMarker, glyphSlots, roleShapePath, suggestionDash, tensionArc, vibratoWave, waveWidth,
  type NoteBox,
} from "@/lib/markings/glyph-geometry";
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
  selection: Selection;
  onNoteClick?: (key: string, mode: "only" | "toggle" | "extend") => void;
}

const INK = "#1B1A17";
const GRAPHITE = "#4A4740";
const PAPER = "#FBF8F1";

interface Placed {
  box: NoteBox;
  next: NoteBox | undefined;
  rowTop: number;
  row: number;
}

/** Groups notes by system (same staff top) and finds each system's highest point. */
function place(boxes: NoteBox[]): Map<string, Placed> {
  const rows: { staffTop: number; top: number }[] = [];
  const rowOf = (b: NoteBox) => {
    let i = rows.findIndex((r) => Math.abs(r.staffTop - b.staffTop) <= 1);
    if (i < 0) i = rows.push({ staffTop: b.staffTop, top: b.staffTop }) - 1;
    rows[i].top = Math.min(rows[i].top, b.y);
    return i;
  };
  const rowIndex = boxes.map(rowOf);
  const placed = new Map<string, Placed>();
  boxes.forEach((box, i) => {
    placed.set(box.key, { box, next: boxes[i + 1], rowTop: rows[rowIndex[i]].top, row: rowIndex[i] });
  });
  return placed;
}

/** Our SVG layer over the engraving: marking glyphs, suggestion outlines, selection and hit areas. */
export function MarkingOverlay(props: MarkingOverlayProps) {
  const placed = useMemo(() => place(props.boxes), [props.boxes]);
  return (
    <svg
      className="pointer-events-none absolute left-0 top-0 select-none"
      width={props.width}
      height={props.height}
      viewBox={`0 0 ${props.width} ${props.height}`}
      data-testid="marking-overlay"
      aria-hidden="true"
    >
      <SelectionLayer placed={placed} selection={props.selection} scale={props.scale} />
      <GlyphLayer
        placed={placed}
        scale={props.scale}
        markings={props.markings}
        suggestions={props.suggestions}
        resolutions={props.resolutions}
        durations={props.durations}
        commentCounts={props.commentCounts}
        focus={props.selection.focus}
      />
      <CommentMarkerLayer placed={placed} scale={props.scale} markings={props.markings} commentCounts={props.commentCounts} />
      <HitLayer placed={placed} scale={props.scale} onNoteClick={props.onNoteClick} />
    </svg>
  );
}

/** Comment markers on notes that carry no marking (marked notes draw theirs with their glyphs). */
const CommentMarkerLayer = memo(function CommentMarkerLayer({
  placed, scale, markings, commentCounts,
}: { placed: Map<string, Placed>; scale: number; markings: MarkingState; commentCounts?: Readonly<Record<string, number>> }) {
  if (!commentCounts) return null;
  const size = GLYPH.roleSize * scale;
  return (
    <g data-layer="comments">
      {Object.entries(commentCounts).map(([key, count]) => {
        const p = placed.get(key);
        if (!p || markings[key] || count <= 0) return null;
        const slots = glyphSlots(p.box, scale, p.rowTop);
        const marker = commentMarker(p.box.x + p.box.width / 2 + size * 0.7, slots.commentY, count, scale);
        return (
          <g key={key} data-glyph="comment" data-note-key={key} data-count={count}>
            <path d={marker.path} fill={PAPER} stroke={INK} strokeWidth={0.9} strokeLinejoin="round" />
            <text x={marker.textX} y={marker.textY} fontSize={7 * scale} textAnchor="middle" fill={INK}>
              {count}
            </text>
          </g>
        );
      })}
    </g>
  );
});

const HitLayer = memo(function HitLayer({
  placed, scale, onNoteClick,
}: { placed: Map<string, Placed>; scale: number; onNoteClick?: MarkingOverlayProps["onNoteClick"] }) {
  return (
    <g data-layer="hits">
      {[...placed.values()].map(({ box, rowTop }) => {
        const slots = glyphSlots(box, scale, rowTop);
        // Touch-friendly: at least 24 px wide, and from the glyphs above down to the note.
        const w = Math.max(box.width + 8 * scale, 24);
        const top = slots.commentY;
        const bottom = box.y + box.height + 4 * scale;
        return (
          <rect
            key={box.key}
            data-note-key={box.key}
            x={box.x + box.width / 2 - w / 2}
            y={top}
            width={w}
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
  placed, scale, markings, suggestions, resolutions, durations, commentCounts, focus,
}: {
  placed: Map<string, Placed>;
  scale: number;
  markings: MarkingState;
  suggestions?: PendingSuggestion[];
  resolutions?: Readonly<Record<string, string>>;
  durations?: Readonly<Record<string, number>>;
  commentCounts?: Readonly<Record<string, number>>;
  focus: string | null;
}) {
  const size = GLYPH.roleSize * scale;
  const roleAnchor = (key: string, offset = 0) => {
    const p = placed.get(key);
    if (!p) return null;
    const slots = glyphSlots(p.box, scale, p.rowTop);
    return { x: p.box.x + p.box.width / 2 + offset, y: slots.roleY, row: p.row };
  };

  const arcs: { key: string; paths: string[]; dashed: boolean }[] = [];
  for (const marking of Object.values(markings)) {
    if (marking.role !== "tension") continue;
    const target = resolutions?.[marking.noteKey] ?? nextResolution(placed, markings, marking.noteKey);
    const from = roleAnchor(marking.noteKey);
    const to = target ? roleAnchor(target) : null;
    if (from && to) arcs.push({ key: marking.noteKey, paths: tensionArc({ ...from, y: from.y - size / 2 }, { ...to, y: to.y - size / 2 }, scale), dashed: false });
  }
  for (const s of suggestions ?? []) {
    if (s.role !== "tension" || !s.resolvesTo || markings[s.noteKey]?.role === "tension") continue;
    const from = roleAnchor(s.noteKey);
    const to = roleAnchor(s.resolvesTo);
    if (from && to) arcs.push({ key: `s:${s.noteKey}`, paths: tensionArc({ ...from, y: from.y - size / 2 }, { ...to, y: to.y - size / 2 }, scale), dashed: true });
  }

  return (
    <g data-layer="glyphs">
      {arcs.map((arc) => (
        <g key={`arc:${arc.key}`} data-glyph="arc" data-note-key={arc.key}>
          {arc.paths.map((d, i) => (
            <path key={i} d={d} fill="none" stroke={GRAPHITE} strokeWidth={1} strokeDasharray={arc.dashed ? suggestionDash(scale) : undefined} />
          ))}
        </g>
      ))}
      {Object.values(markings).map((marking) => {
        const p = placed.get(marking.noteKey);
        if (!p) return null;
        const { box, next, rowTop } = p;
        const slots = glyphSlots(box, scale, rowTop);
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
          durationSeconds: durations?.[marking.noteKey],
          scale,
        });
        const label = wave.kind === "none" ? "none" : `${formatNumber(marking.depthCents, 0)}¢ ${formatNumber(marking.speedHz, 1)}`;
        const labelFits = width >= label.length * 4.2 * scale || marking.noteKey === focus;
        const cx = box.x + box.width / 2;
        const comments = commentCounts?.[marking.noteKey] ?? (marking.comment.trim() ? 1 : 0);
        const marker = comments > 0 ? commentMarker(box.x + box.width / 2 + size * 0.7, slots.commentY, comments, scale) : null;
        return (
          <g key={marking.noteKey} data-marking={marking.noteKey}>
            <title>{describe(marking)}</title>
            <g data-glyph="wave" data-note-key={marking.noteKey} data-kind={wave.kind} data-crests={formatNumber(wave.crests, 2)}>
              {wave.kind === "wave" ? (
                <line x1={wave.hairline.x1} x2={wave.hairline.x2} y1={wave.hairline.y} y2={wave.hairline.y} stroke={GRAPHITE} strokeWidth={0.5} strokeOpacity={0.7} />
              ) : null}
              <path d={wave.path} fill="none" stroke={INK} strokeWidth={wave.kind === "wave" ? 1.3 : 1.6} strokeLinejoin="round" strokeLinecap="round" />
            </g>
            {labelFits ? (
              <text x={box.x} y={slots.labelY} fontSize={8 * scale} fill={GRAPHITE} data-glyph="numbers">
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
                <text x={marker.textX} y={marker.textY} fontSize={7 * scale} textAnchor="middle" fill={INK}>
                  {comments}
                </text>
              </g>
            ) : null}
          </g>
        );
      })}
      {(suggestions ?? []).map((s) => {
        const anchor = roleAnchor(s.noteKey);
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
          />
        );
      })}
    </g>
  );
});

/** Without an analysis answer: the next note marked as a resolution within a few notes. */
function nextResolution(placed: Map<string, Placed>, markings: MarkingState, from: string): string | undefined {
  const keys = [...placed.keys()];
  const i = keys.indexOf(from);
  if (i < 0) return undefined;
  return keys.slice(i + 1, i + 9).find((k) => markings[k]?.role === "resolution");
}

function describe(m: { depthCents: number; speedHz: number; placement: string; onset: string; shape: string; role: Role | null; comment: string }): string {
  const vib = m.depthCents === 0 || m.speedHz === 0 ? "no vibrato (deliberate)" : `vibrato ${formatNumber(m.depthCents, 1)} cents at ${formatNumber(m.speedHz, 2)} Hz, ${m.placement === "centered" ? "centred" : "top on pitch"}, ${m.onset}, ${m.shape}`;
  const role = m.role ? `; ${ROLE_INFO[m.role].label.toLowerCase()}` : "";
  const comment = m.comment.trim() ? `; “${m.comment.trim()}”` : "";
  return `${vib}${role}${comment}`;
}
