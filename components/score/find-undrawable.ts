/**
 * Which bars the engraver cannot draw, found by trying: the part is drawn off screen with every bar
 * from some point on shown as a rest bar, and the point is moved by halves until the first bar
 * that makes drawing fail is found; it is set aside and the search goes on until the part draws.
 * Costs about log2(bars) drawings per bad bar, and runs only when the whole part failed.
 */
import type { OpenSheetMusicDisplay } from "opensheetmusicdisplay";
import { blankFrom, blankMeasures, measureCount } from "@/lib/engraving/repair";

/** Past this many bad bars the part is not worth drawing piecemeal. */
const MAX_BAD_BARS = 24;

export class UndrawableError extends Error {}

/** Loads and renders `text` in `host`; true when the engraver throws. */
async function failsToDraw(make: (host: HTMLElement) => OpenSheetMusicDisplay, host: HTMLElement, text: string): Promise<boolean> {
  host.replaceChildren();
  try {
    const osmd = make(host);
    await osmd.load(text);
    osmd.render();
    return false;
  } catch {
    return true;
  } finally {
    host.replaceChildren();
  }
}

/** Lets a click or a paint through between two trial drawings. */
const breathe = () => new Promise((resolve) => setTimeout(resolve, 0));

/**
 * The measure indices to draw as rest bars so that `text` draws, at the width of `width` px.
 * Throws `UndrawableError` when even a part of rest bars fails or there are too many bad bars.
 */
export async function findUndrawableMeasures(
  make: (host: HTMLElement) => OpenSheetMusicDisplay,
  text: string,
  width: number,
  isCancelled: () => boolean,
): Promise<Set<number>> {
  const host = document.createElement("div");
  host.setAttribute("aria-hidden", "true");
  Object.assign(host.style, { position: "absolute", left: "-100000px", top: "0", width: `${width}px`, visibility: "hidden" });
  document.body.append(host);
  try {
    const n = measureCount(text);
    const bad = new Set<number>();
    const fails = async (t: string) => {
      await breathe();
      if (isCancelled()) throw new UndrawableError("cancelled");
      return failsToDraw(make, host, t);
    };
    while (await fails(blankMeasures(text, bad))) {
      if (bad.size >= MAX_BAD_BARS) throw new UndrawableError("too many bars the engraver cannot draw");
      if (await fails(blankFrom(text, 0, bad))) throw new UndrawableError("even rest bars cannot be drawn");
      // Drawing with bars from `lo` on blanked works, from `hi` on fails: bar `lo` is bad.
      let lo = 0;
      let hi = n;
      while (hi - lo > 1) {
        const mid = (lo + hi) >> 1;
        if (await fails(blankFrom(text, mid, bad))) hi = mid;
        else lo = mid;
      }
      bad.add(lo);
    }
    return bad;
  } finally {
    host.remove();
  }
}
