import type { Page } from "playwright-core";

/** The four screens every page must fit: a phone and a tablet, portrait and landscape. */
export const VIEWPORTS = [
  { name: "phone-portrait", width: 390, height: 844 },
  { name: "phone-landscape", width: 844, height: 390 },
  { name: "tablet-portrait", width: 820, height: 1180 },
  { name: "tablet-landscape", width: 1180, height: 820 },
] as const;

/** WCAG 2.2 SC 2.5.8 Target Size (Minimum): 24 by 24 CSS pixels. */
export const MIN_TARGET = 24;
/** Controls used while playing: WCAG 2.2 SC 2.5.5 Target Size (Enhanced), 44 by 44 CSS pixels. */
export const PLAYING_TARGET = 44;

export interface SmallTarget {
  name: string;
  width: number;
  height: number;
}

export interface LayoutMeasure {
  viewportWidth: number;
  /** The document's scrollable width; wider than the viewport means the page scrolls sideways. */
  documentWidth: number;
  /** The widest elements that stick out past the viewport's right edge (for the failure message). */
  overflowing: string[];
  /** Visible controls smaller than MIN_TARGET in either direction, outside the WCAG exceptions. */
  small: SmallTarget[];
  /** Boxes inside the page that scroll sideways (a wide table in a scroller, say). */
  sidewaysScrollers: string[];
}

/**
 * Measures the page as laid out: the document's width and every visible control smaller than
 * 24×24 CSS px. Exceptions from SC 2.5.8 that apply here: a link inside a sentence ("Inline"),
 * and an input whose label (which works it when clicked) is big enough — the native checkbox and
 * radio, or a visually hidden file input behind a styled label.
 * Boxes that scroll sideways inside the page count too, except `[data-scroll-x]`: the score's
 * scroller, which may when the player zooms in.
 */
export async function measureLayout(page: Page, minTarget = MIN_TARGET): Promise<LayoutMeasure> {
  // esbuild (tsx) may wrap the inner functions below in its `__name` helper, absent in the page.
  await page.evaluate("globalThis.__name ??= (f) => f");
  return page.evaluate((min) => {
    const describe = (el: Element) => {
      const label = el.getAttribute("aria-label") ?? (el as HTMLElement).innerText ?? el.getAttribute("title") ?? "";
      const id = el.id ? `#${el.id}` : "";
      return `${el.tagName.toLowerCase()}${id} "${label.trim().replace(/\s+/g, " ").slice(0, 60)}"`;
    };
    const visible = (el: Element) => {
      const style = getComputedStyle(el);
      if (style.visibility === "hidden" || style.display === "none") return false;
      const r = el.getBoundingClientRect();
      return r.width > 0 && r.height > 0 && !el.closest("[inert],[aria-hidden='true']");
    };
    const inSentence = (el: Element) => {
      if (el.tagName !== "A" || getComputedStyle(el).display !== "inline") return false;
      const block = el.parentElement;
      if (!block) return false;
      const text = (block.textContent ?? "").replace(/\s+/g, " ").trim();
      const own = (el.textContent ?? "").replace(/\s+/g, " ").trim();
      return text.length > own.length + 3;
    };
    // Clicking a control's label works the control, so a big enough label is its target (the
    // native checkbox, or a visually hidden file input behind a styled label).
    const bigEnoughLabel = (el: Element) => {
      if (el.tagName !== "INPUT") return false;
      const label = el.closest("label") ?? (el.id ? document.querySelector(`label[for="${CSS.escape(el.id)}"]`) : null);
      if (!label) return false;
      const r = label.getBoundingClientRect();
      return r.width >= min && r.height >= min;
    };
    const selector = [
      "a[href]",
      "button",
      "input:not([type=hidden])",
      "select",
      "textarea",
      "summary",
      "[role=button]",
      "[role=tab]",
      "[role=menuitem]",
      "[role=checkbox]",
      "[role=switch]",
      "[role=slider]",
      "[role=option]",
      "[tabindex]:not([tabindex='-1'])",
    ].join(",");
    const small: { name: string; width: number; height: number }[] = [];
    for (const el of document.querySelectorAll(selector)) {
      if (!visible(el) || inSentence(el) || bigEnoughLabel(el)) continue;
      if ((el as HTMLElement).matches("[disabled]")) continue;
      // A note's hit area in the score overlay is measured on its own (larger) terms.
      if (el.closest("[data-note-key]") && el.closest("svg")) continue;
      const r = el.getBoundingClientRect();
      if (r.width < min - 0.01 || r.height < min - 0.01) small.push({ name: describe(el), width: Math.round(r.width * 10) / 10, height: Math.round(r.height * 10) / 10 });
    }
    const viewportWidth = document.documentElement.clientWidth;
    const overflowing: string[] = [];
    for (const el of document.body.querySelectorAll("*")) {
      if (el.closest("[data-scroll-x]")) continue;
      const r = el.getBoundingClientRect();
      if (r.right > viewportWidth + 0.5 && visible(el)) {
        const parent = el.parentElement;
        // Report the outermost element that sticks out.
        if (parent && parent.getBoundingClientRect().right > viewportWidth + 0.5 && parent !== document.body) continue;
        overflowing.push(`${describe(el)} right=${Math.round(r.right)}`);
      }
    }
    const sidewaysScrollers: string[] = [];
    for (const el of document.body.querySelectorAll("*")) {
      if (el.closest("[data-scroll-x]") || !visible(el)) continue;
      const overflowX = getComputedStyle(el).overflowX;
      if ((overflowX === "auto" || overflowX === "scroll") && el.scrollWidth > el.clientWidth + 1) {
        sidewaysScrollers.push(`${describe(el)} scrolls ${el.scrollWidth} in ${el.clientWidth}`);
      }
    }
    return { sidewaysScrollers, viewportWidth, documentWidth: document.documentElement.scrollWidth, overflowing: overflowing.slice(0, 8), small };
  }, minTarget);
}
