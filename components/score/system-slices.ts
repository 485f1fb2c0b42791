/**
 * Cuts the engraved part and our glyph layer into one standalone SVG per system, so a printed
 * page (CSS `break-inside: avoid`) or a PDF page (one `svg2pdf` call per system) never splits a
 * line of music. Each slice holds clones of only the drawing elements that belong to its system
 * (our glyphs say which; the engraving's go to the nearest staff), in the stage's pixel coordinates.
 */
import type { SystemBox } from "./measure-systems";
import { barSpanName, type WrittenBar } from "@/lib/musicxml/bar-names";

const SVG_NS = "http://www.w3.org/2000/svg";

export interface SliceBand {
  top: number;
  bottom: number;
}

interface Extent {
  top: number;
  bottom: number;
  /** The system the element belongs to, when it says so (our glyphs carry `data-system`). */
  system?: number;
}

/** Elements drawn as one piece: never split between slices, only cloned into each they touch. */
const ATOMIC = /(^|\s)vf-(stavenote|stave|beam|clef|keysignature|timesignature)(\s|$)/;

function rectIn(el: Element, origin: DOMRect): Extent | null {
  const r = el.getBoundingClientRect();
  if (r.width === 0 && r.height === 0) return null;
  return { top: r.top - origin.top, bottom: r.bottom - origin.top };
}

type Staff = Pick<SystemBox, "staffTop" | "staffBottom">;

function nearestSystem(systems: readonly Staff[], e: Extent): number {
  if (e.system !== undefined && e.system >= 0 && e.system < systems.length) return e.system;
  const centre = (e.top + e.bottom) / 2;
  let best = 0;
  let distance = Infinity;
  systems.forEach((s, i) => {
    const d = centre < s.staffTop ? s.staffTop - centre : centre > s.staffBottom ? centre - s.staffBottom : 0;
    if (d < distance) {
      distance = d;
      best = i;
    }
  });
  return best;
}

/**
 * Bands that hold each system whole: from the highest to the lowest thing drawn for it (notes,
 * slurs, our glyphs), plus `pad`. Two bands may overlap where one system's marks come close to
 * the next's: each slice then still shows only its own system's elements (see `ownerOf`), so
 * nothing is cut off and nothing is printed twice.
 */
export function systemBands(systems: readonly Staff[], extents: readonly Extent[], pad: number, height: number): SliceBand[] {
  const reach = systems.map((s) => ({ top: s.staffTop, bottom: s.staffBottom }));
  for (const e of extents) {
    const r = reach[nearestSystem(systems, e)];
    r.top = Math.min(r.top, e.top);
    r.bottom = Math.max(r.bottom, e.bottom);
  }
  return reach.map((r) => ({ top: Math.max(0, r.top - pad), bottom: Math.min(height, r.bottom + pad) }));
}

/** The one slice an element is drawn in: the system it names, or the nearest staff. */
export function ownerOf(systems: readonly Staff[], e: Extent): number {
  return nearestSystem(systems, e);
}

/** Top-level drawing elements (descending into groups that span several systems). */
function leaves(root: Element, origin: DOMRect, systems: readonly Staff[]): { el: Element; extent: Extent | null }[] {
  const out: { el: Element; extent: Extent | null }[] = [];
  const walk = (parent: Element) => {
    for (const el of Array.from(parent.children)) {
      const tag = el.tagName.toLowerCase();
      if (tag === "defs" || tag === "style") {
        out.push({ el, extent: null });
        continue;
      }
      const extent = rectIn(el, origin);
      if (!extent) continue;
      const tagged = el.getAttribute("data-system");
      if (tagged !== null && /^\d+$/.test(tagged)) {
        out.push({ el, extent: { ...extent, system: Number(tagged) } });
        continue;
      }
      const spansSeveral = systems.filter((s, i) => {
        const next = systems[i + 1];
        return extent.top < (next ? next.staffTop : Infinity) && extent.bottom > s.staffTop;
      }).length > 1;
      if (tag === "g" && spansSeveral && !ATOMIC.test(el.getAttribute("class") ?? "") && el.children.length > 0) walk(el);
      else out.push({ el, extent });
    }
  };
  walk(root);
  return out;
}

export interface SliceSource {
  stage: HTMLElement;
  /** The engraving's own <svg>. */
  engraving: SVGSVGElement;
  /** Our glyph layer (a <g> in stage coordinates). */
  glyphs: Element | null;
  systems: readonly SystemBox[];
  width: number;
  height: number;
  /** Free space kept around each system. */
  pad: number;
  /** Prefix of the clip-path ids (unique on the page). */
  idPrefix: string;
  /** The part's bars as written, to name each system's bars. */
  bars?: readonly WrittenBar[];
}

/** "Bars 5–8", "Pickup to bar 3": the bars of a system as the part writes them, when they are known. */
function systemLabel(sys: SystemBox, bars: readonly WrittenBar[] | undefined): string {
  if (bars && bars.length > 0 && sys.firstIndex !== undefined && sys.lastIndex !== undefined) return barSpanName(bars, sys.firstIndex, sys.lastIndex, "heading");
  return sys.firstBar === sys.lastBar ? `Bar ${sys.firstBar}` : `Bars ${sys.firstBar} to ${sys.lastBar}`;
}

/** Builds the slices; call after the engraving and the overlay are in the document. */
export function buildSystemSlices(src: SliceSource): SVGSVGElement[] {
  if (src.systems.length === 0) return [];
  const origin = src.stage.getBoundingClientRect();
  const svgRect = src.engraving.getBoundingClientRect();
  const viewBox = src.engraving.viewBox?.baseVal;
  const scale = viewBox && viewBox.width > 0 ? svgRect.width / viewBox.width : 1;
  const offsetX = svgRect.left - origin.left - (viewBox?.x ?? 0) * scale;
  const offsetY = svgRect.top - origin.top - (viewBox?.y ?? 0) * scale;

  const engraved = leaves(src.engraving, origin, src.systems);
  const glyphs = src.glyphs ? leaves(src.glyphs, origin, src.systems) : [];
  const extents = [...engraved, ...glyphs].map((l) => l.extent).filter((e): e is Extent => e !== null);
  const bands = systemBands(src.systems, extents, src.pad, src.height);

  return bands.map((band, i) => {
    const h = band.bottom - band.top;
    const svg = document.createElementNS(SVG_NS, "svg");
    svg.setAttribute("xmlns", SVG_NS);
    svg.setAttribute("width", String(src.width));
    svg.setAttribute("height", String(Math.ceil(h)));
    svg.setAttribute("viewBox", `0 ${band.top} ${src.width} ${h}`);
    svg.setAttribute("class", "stand-system");
    svg.setAttribute("data-system", String(i));
    svg.setAttribute("role", "img");
    const sys = src.systems[i];
    svg.setAttribute("data-first-bar", String(sys.firstBar));
    svg.setAttribute("aria-label", systemLabel(sys, src.bars));

    const defs = document.createElementNS(SVG_NS, "defs");
    const clip = document.createElementNS(SVG_NS, "clipPath");
    const clipId = `${src.idPrefix}-${i}`;
    clip.setAttribute("id", clipId);
    const rect = document.createElementNS(SVG_NS, "rect");
    rect.setAttribute("x", "0");
    rect.setAttribute("y", String(band.top));
    rect.setAttribute("width", String(src.width));
    rect.setAttribute("height", String(h));
    clip.appendChild(rect);
    defs.appendChild(clip);
    svg.appendChild(defs);

    const clipped = document.createElementNS(SVG_NS, "g");
    clipped.setAttribute("clip-path", `url(#${clipId})`);
    const music = document.createElementNS(SVG_NS, "g");
    music.setAttribute("transform", `translate(${offsetX} ${offsetY}) scale(${scale})`);
    // Each element goes into its own system's slice only (definitions go everywhere).
    const holds = (e: Extent | null) => e === null || ownerOf(src.systems, e) === i;
    for (const { el, extent } of engraved) if (holds(extent)) music.appendChild(el.cloneNode(true));
    clipped.appendChild(music);
    const marks = document.createElementNS(SVG_NS, "g");
    marks.setAttribute("data-layer", "glyphs");
    for (const { el, extent } of glyphs) if (holds(extent)) marks.appendChild(el.cloneNode(true));
    clipped.appendChild(marks);
    svg.appendChild(clipped);
    return svg;
  });
}
