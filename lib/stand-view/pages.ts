/**
 * The stand view's pages: consecutive systems (lines of music) that fit the screen's height
 * together. A system taller than the screen gets a page of its own (it is never cut).
 */
export interface StandPage {
  /** Index of the first system on the page. */
  first: number;
  /** Index after the last. */
  end: number;
}

export function paginateSystems(heights: readonly number[], available: number, gap: number): StandPage[] {
  const pages: StandPage[] = [];
  let first = 0;
  let used = 0;
  heights.forEach((h, i) => {
    const need = i === first ? h : used + gap + h;
    if (i > first && need > available) {
      pages.push({ first, end: i });
      first = i;
      used = h;
    } else {
      used = need;
    }
  });
  if (heights.length > first) pages.push({ first, end: heights.length });
  return pages;
}

/** The page that shows system `system` (the last page when beyond). */
export function pageOfSystem(pages: readonly StandPage[], system: number): number {
  const i = pages.findIndex((p) => system >= p.first && system < p.end);
  return i === -1 ? Math.max(0, pages.length - 1) : i;
}

/** Staff size for a screen: larger on a wide screen, never so large that a landscape page holds one line. */
export function standZoom(width: number, height: number): number {
  const z = Math.min(width, height * 1.3) / 800;
  return Math.round(Math.min(1.3, Math.max(0.75, z)) * 100) / 100;
}
