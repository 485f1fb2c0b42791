/**
 * What the engraving drew above each system's staff — slurs, words like "rit.", tempo marks, bar
 * numbers, fermatas — as boxes in the stage's pixels, so our glyphs can rise above them instead
 * of printing over them.
 */
import type { SystemBox } from "./measure-systems";

export interface SkyBox {
  left: number;
  right: number;
  top: number;
}

const DRAWN = "path, text, rect, line, polyline, polygon, ellipse, circle, use";

export function measureSky(engraving: SVGSVGElement, stage: HTMLElement, systems: readonly SystemBox[]): SkyBox[][] {
  const origin = stage.getBoundingClientRect();
  const out: SkyBox[][] = systems.map(() => []);
  if (systems.length === 0) return out;
  const wide = origin.width * 0.9;
  for (const el of Array.from(engraving.querySelectorAll(DRAWN))) {
    const r = el.getBoundingClientRect();
    if (r.width === 0 && r.height === 0) continue;
    // A background or a staff line is not something to rise above.
    if (r.width >= wide) continue;
    const top = r.top - origin.top;
    const bottom = r.bottom - origin.top;
    const centre = (top + bottom) / 2;
    // The system whose staff is nearest below or around the element.
    let system = -1;
    for (let i = 0; i < systems.length; i++) {
      const previousBottom = i > 0 ? systems[i - 1].staffBottom : -Infinity;
      if (centre > previousBottom && centre <= systems[i].staffBottom) {
        system = i;
        break;
      }
    }
    if (system < 0 || top >= systems[system].staffTop - 2) continue;
    // Below the previous system's middle it belongs to this system's sky, not the one above's bottom.
    const previous = systems[system - 1];
    if (previous && centre < (previous.staffBottom + systems[system].staffTop) / 2) continue;
    out[system].push({ left: r.left - origin.left, right: r.right - origin.left, top });
  }
  return out;
}
