/**
 * Where OpenSheetMusicDisplay drew each selectable note, relative to the score stage.
 *
 * First from the engraver's own note objects (VexFlow's formatted stave notes), not from the drawn
 * SVG: asking the browser for an element's box right after the engraving is in the page forces a
 * layout of the whole drawing first, which at a few hundred bars costs more than a tenth of a
 * second before a note can be selected. The model gives each head exactly, and the note's stem
 * and beam, but not the marks VexFlow draws around it (accidentals, articulations, breath marks),
 * so once the page has been painted, when the browser's boxes cost little, the drawing is
 * measured and replaces the first boxes where they differ.
 */
import type { NoteBox } from "@/lib/markings/glyph-geometry";
import type { OsmdNoteRef } from "./osmd-note-keys";
import { ENGRAVING_SVG } from "./engraving-options";

/** OSMD's unit: 10 px at zoom 1. */
const UNIT_PX = 10;

/** Where the engraving's SVG starts inside the stage, in CSS pixels. */
export interface StageOffset {
  left: number;
  top: number;
}

/** The parts of VexFlow 1.2's formatted notes we read (the engraving library bundles VexFlow). */
interface VfBox {
  getX(): number;
  getY(): number;
  getW(): number;
  getH(): number;
}
interface VfHead {
  getAbsoluteX(): number;
  getY(): number;
  getWidth(): number;
}
interface VfStaveNote {
  note_heads?: VfHead[];
  getBoundingBox?(): VfBox | null;
  getStave?(): { getSpacingBetweenLines(): number } | undefined;
}

/**
 * Boxes in the SVG's own units at zoom 1 (VexFlow draws at zoom 1 and the SVG's viewBox scales),
 * or null when the engraver's objects don't carry what we need.
 */
function modelBox(ref: OsmdNoteRef): { x: number; width: number; top: number; bottom: number } | null {
  const vf = (ref.graphicalNote as unknown as { vfnote?: [VfStaveNote, number] }).vfnote;
  const note = vf?.[0];
  const heads = note?.note_heads;
  if (!note || !heads || heads.length === 0 || typeof note.getBoundingBox !== "function") return null;
  const head = heads.length === 1 ? heads[0] : heads[chordIndex(ref, heads.length)];
  const box = note.getBoundingBox();
  const spacing = note.getStave?.()?.getSpacingBetweenLines() ?? 10;
  if (!box || !head) return null;
  const x = head.getAbsoluteX();
  const width = head.getWidth();
  const headTop = head.getY() - spacing / 2;
  const top = Math.min(box.getY(), headTop);
  const bottom = Math.max(box.getY() + box.getH(), headTop + spacing);
  if (![x, width, top, bottom].every(Number.isFinite) || width <= 0) return null;
  return { x, width, top, bottom };
}

/** VexFlow orders a chord's heads low to high; find this note's place by pitch. */
function chordIndex(ref: OsmdNoteRef, count: number): number {
  const notes = ref.graphicalNote.parentVoiceEntry?.notes ?? [];
  const pitches = notes.map((n) => n.sourceNote.halfTone).sort((a, b) => a - b);
  return Math.min(Math.max(0, pitches.indexOf(ref.graphicalNote.sourceNote.halfTone)), count - 1);
}

function staffTopOf(ref: OsmdNoteRef, offset: StageOffset, zoom: number): number | null {
  const measure = ref.graphicalNote.parentVoiceEntry?.parentStaffEntry?.parentMeasure;
  const staffY = measure?.PositionAndShape?.AbsolutePosition?.y;
  return typeof staffY === "number" ? offset.top + staffY * UNIT_PX * zoom : null;
}

const selectable = (ref: OsmdNoteRef) => !ref.isRest && !ref.isTieContinuation && !!ref.key && !!ref.svgGroup;

/**
 * Every selectable note's box from the engraver's model, without asking the browser for layout.
 * Returns null if any note cannot be placed that way, so the caller measures the drawing instead.
 */
export function noteBoxesFromModel(refs: readonly OsmdNoteRef[], offset: StageOffset, zoom: number): NoteBox[] | null {
  const boxes: NoteBox[] = [];
  const seen = new Set<string>();
  for (const ref of refs) {
    if (!selectable(ref) || seen.has(ref.key)) continue;
    const box = modelBox(ref);
    const staffTop = staffTopOf(ref, offset, zoom);
    if (!box || staffTop === null) return null;
    seen.add(ref.key);
    boxes.push({
      key: ref.key,
      x: offset.left + box.x * zoom,
      y: offset.top + box.top * zoom,
      width: box.width * zoom,
      height: (box.bottom - box.top) * zoom,
      staffTop,
      measureIndex: ref.measureIndex,
    });
  }
  return boxes;
}

/** Every selectable note's box measured from the drawn SVG (forces a layout; the fallback). */
export function measureNoteBoxes(refs: readonly OsmdNoteRef[], stage: HTMLElement, zoom: number): NoteBox[] {
  const origin = stage.getBoundingClientRect();
  const svg = stage.querySelector(ENGRAVING_SVG);
  const svgTop = (svg?.getBoundingClientRect().top ?? origin.top) - origin.top;
  const boxes: NoteBox[] = [];
  const seen = new Set<string>();
  for (const ref of refs) {
    if (!selectable(ref) || seen.has(ref.key)) continue;
    const group = ref.svgGroup!.getBoundingClientRect();
    if (group.width === 0 && group.height === 0) continue;
    const head = noteheadRect(ref) ?? group;
    const staffTop = staffTopOf(ref, { left: 0, top: svgTop }, zoom) ?? group.top - origin.top;
    seen.add(ref.key);
    boxes.push({
      key: ref.key,
      x: head.left - origin.left,
      y: Math.min(group.top, head.top) - origin.top,
      width: head.width,
      height: group.height,
      staffTop,
      measureIndex: ref.measureIndex,
    });
  }
  return boxes;
}

/**
 * The note's own head; in a chord the stem group holds several, matched low to high by pitch.
 * Grace notes are drawn inside the main note's group (as its modifiers): their heads don't count.
 */
function noteheadRect(ref: OsmdNoteRef): DOMRect | null {
  const heads = [...(ref.svgGroup?.querySelectorAll(":scope > .vf-note .vf-notehead") ?? [])].map((h) => h.getBoundingClientRect());
  if (heads.length === 0) return null;
  if (heads.length === 1) return heads[0];
  const lowToHigh = heads.sort((a, b) => b.top - a.top);
  return lowToHigh[chordIndex(ref, lowToHigh.length)];
}
