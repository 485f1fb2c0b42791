"use client";

import Link from "next/link";
import { useCallback, useEffect, useLayoutEffect, useMemo, useRef, useState } from "react";
import type { AnalyzedNote } from "@/lib/analysis/types";
import { toState } from "@/lib/markings/changes";
import { noteDurations } from "@/lib/markings/durations";
import type { MarkingDto } from "@/lib/markings/schema";
import { pageOfSystem, paginateSystems, standZoom } from "@/lib/stand-view/pages";
import { StandCopyScore } from "@/components/score/stand-copy-score";
import { StandLegend } from "./stand-legend";
import { useOfflineCopy } from "./use-offline-copy";
import { useWakeLock } from "./use-wake-lock";

export interface StandViewData {
  partId: string;
  title: string;
  composer: string;
  tempo: number | null;
  xml: string;
  /** The server's note keys of the part: the engraved notes are keyed by them. */
  noteKeys: string[];
  markings: MarkingDto[];
  notes: Pick<AnalyzedNote, "key" | "duration">[];
  resolutions: Record<string, string>;
  /** When the server made this page (ISO): what a kept copy shows "as of". */
  asOf: string;
}

/** The bar at the top of the screen. */
const BAR_PX = 48;
const PAD_PX = 12;
const GAP_PX = 8;
/** A horizontal move this long (px), longer than it is tall, is a swipe rather than a tap. */
const SWIPE_PX = 50;
const RESIZE_DEBOUNCE_MS = 250;

const NEXT_KEYS = new Set(["ArrowRight", "ArrowDown", "PageDown", " ", "Enter"]);
const PREVIOUS_KEYS = new Set(["ArrowLeft", "ArrowUp", "PageUp"]);

function useScreenSize(): { width: number; height: number } | null {
  const [size, setSize] = useState<{ width: number; height: number } | null>(null);
  useLayoutEffect(() => {
    let timer = 0;
    const read = () => setSize({ width: window.innerWidth, height: window.innerHeight });
    read();
    const onResize = () => {
      clearTimeout(timer);
      timer = window.setTimeout(read, RESIZE_DEBOUNCE_MS);
    };
    window.addEventListener("resize", onResize);
    return () => {
      clearTimeout(timer);
      window.removeEventListener("resize", onResize);
    };
  }, []);
  return size;
}

function formatAsOf(iso: string): string {
  const d = new Date(iso);
  return d.toLocaleString(undefined, { day: "numeric", month: "short", hour: "2-digit", minute: "2-digit" });
}

/**
 * The marked part a screenful at a time, for a tablet on the stand. Read-only: taps and keys only
 * turn pages (tap the left third to go back, anywhere else to go on; swipe; arrow keys, PageUp and
 * PageDown, which page-turn pedals send). The part is engraved at the screen's width and its
 * systems are dealt into pages of the screen's height.
 */
export function StandView({ data }: { data: StandViewData }) {
  const size = useScreenSize();
  const [systems, setSystems] = useState<SVGSVGElement[]>([]);
  const [page, setPage] = useState(0);
  const [showLegend, setShowLegend] = useState(false);
  /** The written number of the first bar on the page shown: kept when the systems are dealt again. */
  const firstBarShown = useRef<number | null>(null);
  const pageRefs = useRef<(HTMLDivElement | null)[]>([]);
  const swipe = useRef<{ x: number; y: number; swiped: boolean } | null>(null);
  const wake = useWakeLock();
  const offline = useOfflineCopy(systems.length > 0);

  const markings = useMemo(() => toState(data.markings), [data.markings]);
  const noteKeys = useMemo(() => ({ keys: data.noteKeys }), [data.noteKeys]);
  const durations = useMemo(() => noteDurations(data.notes, data.tempo), [data.notes, data.tempo]);

  const width = size ? Math.max(280, size.width - 2 * PAD_PX) : 0;
  const zoom = size ? standZoom(size.width, size.height) : 1;
  const available = size ? size.height - BAR_PX - 2 * PAD_PX : 0;

  const pages = useMemo(
    () => paginateSystems(systems.map((s) => Number(s.getAttribute("height")) || 0), available, GAP_PX),
    [systems, available],
  );
  const current = Math.min(page, Math.max(0, pages.length - 1));

  // The slices are built once per engraving; dealing them into pages moves them, nothing is redrawn.
  useLayoutEffect(() => {
    pages.forEach((p, i) => pageRefs.current[i]?.replaceChildren(...systems.slice(p.first, p.end)));
  }, [pages, systems]);

  // A new screen size deals the systems again: stay on the page with the same music.
  const onSystems = useCallback((next: SVGSVGElement[]) => setSystems(next), []);
  const barOf = useCallback((system: number | undefined) => (system === undefined ? null : Number(systems[system]?.getAttribute("data-first-bar") ?? NaN)), [systems]);
  useEffect(() => {
    const bar = firstBarShown.current;
    if (bar === null || pages.length === 0) return;
    // The last system starting at or before that bar.
    let system = 0;
    systems.forEach((s, i) => {
      if (Number(s.getAttribute("data-first-bar")) <= bar) system = i;
    });
    setPage(pageOfSystem(pages, system));
  }, [pages, systems]);

  const turn = useCallback(
    (delta: number) => {
      setPage((p) => {
        const next = Math.min(Math.max(0, p + delta), Math.max(0, pages.length - 1));
        firstBarShown.current = barOf(pages[next]?.first);
        return next;
      });
    },
    [pages, barOf],
  );
  const goTo = useCallback(
    (index: number) => {
      const next = Math.min(Math.max(0, index), Math.max(0, pages.length - 1));
      firstBarShown.current = barOf(pages[next]?.first);
      setPage(next);
    },
    [pages, barOf],
  );

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.altKey || e.ctrlKey || e.metaKey) return;
      const target = e.target as HTMLElement | null;
      // Enter and Space on a focused control do what the control does.
      if ((e.key === "Enter" || e.key === " ") && target?.closest("a, button:not([data-tap-zone]), input, select, textarea")) return;
      if (NEXT_KEYS.has(e.key)) turn(1);
      else if (PREVIOUS_KEYS.has(e.key)) turn(-1);
      else if (e.key === "Home") goTo(0);
      else if (e.key === "End") goTo(Number.MAX_SAFE_INTEGER);
      else return;
      e.preventDefault();
    };
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  }, [turn, goTo]);

  const onPointerDown = (e: React.PointerEvent) => {
    swipe.current = { x: e.clientX, y: e.clientY, swiped: false };
  };
  const onPointerUp = (e: React.PointerEvent) => {
    const start = swipe.current;
    if (!start) return;
    const dx = e.clientX - start.x;
    const dy = e.clientY - start.y;
    if (Math.abs(dx) >= SWIPE_PX && Math.abs(dx) > Math.abs(dy)) {
      start.swiped = true;
      turn(dx < 0 ? 1 : -1);
    }
  };
  const onTap = (delta: number) => {
    // The click that ends a swipe has already turned the page.
    if (swipe.current?.swiped) {
      swipe.current = null;
      return;
    }
    swipe.current = null;
    turn(delta);
  };

  const status = offline === "offline" ? `Offline · as of ${formatAsOf(data.asOf)}` : offline === "saved" ? "Kept for offline" : offline === "failed" ? "Not kept for offline" : "";

  return (
    <div
      className="fixed inset-0 z-50 flex select-none flex-col bg-white text-ink"
      data-testid="stand-view"
      data-page={current + 1}
      data-pages={pages.length}
      data-offline-copy={offline}
      data-wake-lock={wake}
    >
      <header className="flex shrink-0 items-center gap-3 border-b border-rule px-3 text-sm" style={{ height: BAR_PX }}>
        <Link href={`/parts/${data.partId}`} className="inline-flex h-11 items-center rounded px-2 font-medium underline-offset-4 hover:underline" aria-label="Close the stand view">
          ✕ Close
        </Link>
        <h1 className="min-w-0 flex-1 truncate font-serif text-base font-semibold">
          {data.title}
          {data.composer ? <span className="font-normal text-graphite"> · {data.composer}</span> : null}
        </h1>
        <span className="hidden text-graphite sm:inline" role="status" data-testid="stand-offline">
          {status}
        </span>
        <button type="button" className="h-11 rounded px-2 hover:bg-paper" aria-expanded={showLegend} onClick={() => setShowLegend((v) => !v)}>
          Legend
        </button>
        <span className="tabular-nums" aria-live="polite" data-testid="stand-page">
          {pages.length ? `Page ${current + 1} of ${pages.length}` : ""}
        </span>
      </header>
      {offline === "offline" ? (
        <p className="shrink-0 bg-paper-deep px-3 py-1 text-sm sm:hidden" role="status">
          {status}
        </p>
      ) : null}
      {showLegend ? (
        <div className="shrink-0 border-b border-rule bg-paper px-3 py-2">
          <StandLegend />
        </div>
      ) : null}

      <div className="relative min-h-0 flex-1 overflow-hidden" style={{ touchAction: "pinch-zoom" }} onPointerDown={onPointerDown} onPointerUp={onPointerUp}>
        {size ? (
          <>
            {/* Engraved off-screen at the screen's width; a new width is a new engraving. */}
            <div className="absolute h-0 w-0 overflow-hidden" aria-hidden="true">
              <StandCopyScore key={`${width}:${zoom}`} xml={data.xml} noteKeys={noteKeys} width={width} zoom={zoom} markings={markings} resolutions={data.resolutions} durations={durations} onSystems={onSystems} />
            </div>
            {systems.length === 0 ? (
              <p className="p-6 text-graphite" role="status">
                Engraving the part…
              </p>
            ) : null}
            {pages.map((p, i) => (
              <div
                key={i}
                ref={(el) => {
                  pageRefs.current[i] = el;
                }}
                hidden={i !== current}
                className="stand-view-page flex flex-col items-center"
                style={{ padding: PAD_PX, gap: GAP_PX }}
                data-testid="stand-view-page"
                aria-label={`Page ${i + 1} of ${pages.length}`}
              />
            ))}
            <button type="button" data-tap-zone="previous" aria-label="Previous page" className="absolute inset-y-0 left-0 w-1/3 cursor-w-resize opacity-0" onClick={() => onTap(-1)} disabled={current === 0} />
            <button
              type="button"
              data-tap-zone="next"
              aria-label="Next page"
              className="absolute inset-y-0 right-0 w-2/3 cursor-e-resize opacity-0"
              onClick={() => onTap(1)}
              disabled={current >= pages.length - 1}
            />
          </>
        ) : null}
      </div>
      {wake === "on" ? <span className="sr-only">The screen stays on while the stand view is open.</span> : null}
    </div>
  );
}
