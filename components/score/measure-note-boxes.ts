/**
 * Measures where OpenSheetMusicDisplay drew each selectable note, relative to the score stage.
 * The model's own boxes have no width for notes, so positions come from the SVG elements.
 */
import type { NoteBox } from "@/lib/markings/glyph-geometry";
import type { OsmdNoteRef } from "./osmd-note-keys";

/** OSMD's unit: 10 px at zoom 1. */
const UNIT_PX = 10;

export function measureNoteBoxes(refs: readonly OsmdNoteRef[], stage: HTMLElement, zoom: number): NoteBox[] {
  const origin = stage.getBoundingClientRect();
  const svg = stage.querySelector("svg");
  const svgTop = (svg?.getBoundingClientRect().top ?? origin.top) - origin.top;
  const boxes: NoteBox[] = [];
  const seen = new Set<string>();
  for (const ref of refs) {
    if (ref.isRest || ref.isTieContinuation || !ref.key || !ref.svgGroup || seen.has(ref.key)) continue;
    const group = ref.svgGroup.getBoundingClientRect();
    if (group.width === 0 && group.height === 0) continue;
    const head = noteheadRect(ref) ?? group;
    const measure = ref.graphicalNote.parentVoiceEntry?.parentStaffEntry?.parentMeasure;
    const staffY = measure?.PositionAndShape?.AbsolutePosition?.y;
    const staffTop = typeof staffY === "number" ? svgTop + staffY * UNIT_PX * zoom : group.top - origin.top;
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

/** The note's own head; in a chord the stem group holds several, matched low to high by pitch. */
function noteheadRect(ref: OsmdNoteRef): DOMRect | null {
  const heads = [...(ref.svgGroup?.querySelectorAll(".vf-notehead") ?? [])].map((h) => h.getBoundingClientRect());
  if (heads.length === 0) return null;
  if (heads.length === 1) return heads[0];
  const notes = ref.graphicalNote.parentVoiceEntry?.notes ?? [];
  const pitches = notes.map((n) => n.sourceNote.halfTone).sort((a, b) => a - b);
  const index = Math.max(0, pitches.indexOf(ref.graphicalNote.sourceNote.halfTone));
  const lowToHigh = heads.sort((a, b) => b.top - a.top);
  return lowToHigh[Math.min(index, lowToHigh.length - 1)];
}
