/**
 * Where OpenSheetMusicDisplay put each system (one line of music), relative to the score stage:
 * the top line of its first staff and the bottom line of its last, in CSS pixels.
 */
import type { OpenSheetMusicDisplay } from "opensheetmusicdisplay";
import type { StageOffset } from "./measure-note-boxes";

export interface SystemBox {
  staffTop: number;
  staffBottom: number;
  /** The ends of the staff lines (the system's left and right margins). */
  left: number;
  right: number;
  /** Written measure numbers of the system's first and last bar. */
  firstBar: number;
  lastBar: number;
  /** 0-based measure indices of the system's first and last bar (to name them as written). */
  firstIndex?: number;
  lastIndex?: number;
}

/** OSMD's unit: 10 px at zoom 1. */
const UNIT_PX = 10;

/** From the engraver's model alone (no layout asked of the browser); `offset`: the SVG in the stage. */
export function measureSystems(osmd: OpenSheetMusicDisplay, offset: StageOffset, zoom: number): SystemBox[] {
  const { top: svgTop, left: svgLeft } = offset;
  const out: SystemBox[] = [];
  for (const page of osmd.GraphicSheet?.MusicPages ?? []) {
    for (const system of page.MusicSystems ?? []) {
      const lines = system.StaffLines ?? [];
      if (lines.length === 0) continue;
      const first = lines[0];
      const last = lines[lines.length - 1];
      const top = first.PositionAndShape.AbsolutePosition.y;
      const bottom = last.PositionAndShape.AbsolutePosition.y + last.StaffHeight;
      const measures = first.Measures ?? [];
      const tail = measures[measures.length - 1]?.PositionAndShape;
      // The staff lines start at the staff line's own origin (before the clef), end with the last bar.
      const left = first.PositionAndShape.AbsolutePosition.x;
      const right = tail ? tail.AbsolutePosition.x + tail.Size.width : left + first.PositionAndShape.Size.width;
      out.push({
        left: svgLeft + left * UNIT_PX * zoom,
        right: svgLeft + right * UNIT_PX * zoom,
        staffTop: svgTop + top * UNIT_PX * zoom,
        staffBottom: svgTop + bottom * UNIT_PX * zoom,
        firstBar: measures[0]?.MeasureNumber ?? 0,
        lastBar: measures[measures.length - 1]?.MeasureNumber ?? 0,
        firstIndex: measures[0]?.parentSourceMeasure?.measureListIndex,
        lastIndex: measures[measures.length - 1]?.parentSourceMeasure?.measureListIndex,
      });
    }
  }
  return out.sort((a, b) => a.staffTop - b.staffTop);
}
