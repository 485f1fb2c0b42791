"use client";

import { ENGRAVING_OPTIONS } from "./engraving-options";
import { useCallback, useEffect, useLayoutEffect, useRef, useState, type ReactNode } from "react";
import type { OpenSheetMusicDisplay } from "opensheetmusicdisplay";
import { glyphBandHeight, type NoteBox } from "@/lib/markings/glyph-geometry";
import { measureNoteBoxes } from "./measure-note-boxes";
import { measureSystems, type SystemBox } from "./measure-systems";
import { collectOsmdNotes } from "./osmd-note-keys";

export interface ScoreLayout {
  boxes: NoteBox[];
  width: number;
  height: number;
  /** Each line of music, top to bottom (the stand copy keeps each on one page). */
  systems: SystemBox[];
}

export interface ScoreViewProps {
  xml: string;
  zoom: number;
  /** Called after every render (load, zoom, resize) with the notes' new positions. */
  onLayout: (layout: ScoreLayout) => void;
  /** Drawn over the engraving, in the same coordinates (the marking overlay). */
  children?: ReactNode;
  /** The overlay's glyph text is at least this many px (paper): the systems make room for it. */
  minTextPx?: number;
}

const RESIZE_DEBOUNCE_MS = 200;

/**
 * The engraving library, fetched as soon as this module runs in the browser, so its download
 * overlaps the page's own hydration instead of waiting for the first effect.
 */
let engraver: Promise<typeof import("opensheetmusicdisplay")> | null = null;
const loadEngraver = () => (engraver ??= import("opensheetmusicdisplay"));
if (typeof window !== "undefined") void loadEngraver();

/**
 * The engraved part. OpenSheetMusicDisplay is imported only here, and only in the browser, so it
 * is loaded on pages that show a score. Every render rebuilds its SVG; we never attach anything
 * to it and re-measure the notes instead.
 */
export function ScoreView({ xml, zoom, onLayout, children, minTextPx = 0 }: ScoreViewProps) {
  const stageRef = useRef<HTMLDivElement>(null);
  const hostRef = useRef<HTMLDivElement>(null);
  const osmdRef = useRef<OpenSheetMusicDisplay | null>(null);
  const zoomRef = useRef(zoom);
  const onLayoutRef = useRef(onLayout);
  const [status, setStatus] = useState<"loading" | "ready" | "error">("loading");
  const [error, setError] = useState<string | null>(null);

  useEffect(() => {
    onLayoutRef.current = onLayout;
  }, [onLayout]);

  const measure = useCallback(() => {
    const osmd = osmdRef.current;
    const stage = stageRef.current;
    if (!osmd || !stage) return;
    const boxes = measureNoteBoxes(collectOsmdNotes(osmd), stage, zoomRef.current);
    const systems = measureSystems(osmd, stage, zoomRef.current);
    onLayoutRef.current({ boxes, width: stage.scrollWidth, height: stage.scrollHeight, systems });
  }, []);

  const render = useCallback(() => {
    const osmd = osmdRef.current;
    if (!osmd) return;
    osmd.Zoom = zoomRef.current;
    // Marks let the benchmark split the time to a selectable score into its stages.
    performance.mark("ondula:render-start");
    osmd.render();
    performance.mark("ondula:rendered");
    measure();
    performance.mark("ondula:measured");
  }, [measure]);

  // A layout effect: it runs right after the first commit, before the browser paints, while a
  // passive effect after hydration can wait a frame or more — engraving is the slow part.
  useLayoutEffect(() => {
    let cancelled = false;
    const host = hostRef.current;
    if (!host) return;
    setStatus("loading");
    (async () => {
      performance.mark("ondula:engraver-import");
      const { OpenSheetMusicDisplay } = await loadEngraver();
      performance.mark("ondula:engraver-loaded");
      if (cancelled) return;
      host.replaceChildren();
      const osmd = new OpenSheetMusicDisplay(host, { ...ENGRAVING_OPTIONS });
      // Room above every system for our glyph band (OSMD units: 10 px at zoom 1, scaled by the zoom).
      const band = glyphBandHeight(zoomRef.current, minTextPx) / (10 * zoomRef.current);
      osmd.EngravingRules.MinSkyBottomDistBetweenSystems = Math.max(osmd.EngravingRules.MinSkyBottomDistBetweenSystems, band + 1);
      osmd.EngravingRules.PageTopMargin = Math.max(osmd.EngravingRules.PageTopMargin, band);
      await osmd.load(xml);
      performance.mark("ondula:loaded");
      if (cancelled) return;
      osmdRef.current = osmd;
      render();
      setStatus("ready");
    })().catch((e: unknown) => {
      if (cancelled) return;
      setError(e instanceof Error ? e.message : String(e));
      setStatus("error");
    });
    return () => {
      cancelled = true;
      osmdRef.current = null;
      host.replaceChildren();
    };
  }, [xml, render, minTextPx]);

  useEffect(() => {
    if (zoomRef.current === zoom) return;
    zoomRef.current = zoom;
    render();
  }, [zoom, render]);

  // Re-lay out when the available width changes (debounced: a drag of the window is one render).
  useEffect(() => {
    const stage = stageRef.current;
    if (!stage || typeof ResizeObserver === "undefined") return;
    let width = stage.clientWidth;
    let timer: ReturnType<typeof setTimeout> | undefined;
    const observer = new ResizeObserver(() => {
      const next = stage.clientWidth;
      if (Math.abs(next - width) < 4) return;
      width = next;
      clearTimeout(timer);
      timer = setTimeout(render, RESIZE_DEBOUNCE_MS);
    });
    observer.observe(stage);
    return () => {
      observer.disconnect();
      clearTimeout(timer);
    };
  }, [render]);

  return (
    <div ref={stageRef} className="relative w-full" data-score-status={status}>
      <div ref={hostRef} aria-hidden="true" />
      {status === "ready" ? children : null}
      {status === "loading" ? <p className="px-gutter py-12 text-graphite" role="status">Engraving the part…</p> : null}
      {status === "error" ? (
        <p className="px-gutter py-12 text-danger" role="alert">
          The part could not be engraved{error ? `: ${error}` : "."}
        </p>
      ) : null}
    </div>
  );
}
