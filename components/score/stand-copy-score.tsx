"use client";

import { useCallback, useEffect, useId, useMemo, useRef, useState } from "react";
import type { MarkingState } from "@/lib/markings/changes";
import { MarkingOverlay, type PendingSuggestion } from "./marking-overlay";
import { ScoreView, type ScoreLayout } from "./score-view";
import type { ServerNoteKeys } from "./osmd-note-keys";
import { buildSystemSlices } from "./system-slices";
import { writtenBarsFromText } from "@/lib/musicxml/bar-names";
import { measureSky, type SkyBox } from "./engraving-sky";
import { GLYPH_TEXT_PX } from "@/lib/stand-copy/options";
import { ENGRAVING_SVG } from "./engraving-options";

export interface StandCopyScoreProps {
  xml: string;
  /** The server's note keys of the part (see ScoreView's `noteKeys`). */
  noteKeys?: ServerNoteKeys | null;
  /** The printable width in CSS pixels: the engraving is laid out at exactly this width. */
  width: number;
  zoom: number;
  markings: MarkingState;
  suggestions?: PendingSuggestion[];
  resolutions?: Readonly<Record<string, string>>;
  durations?: Readonly<Record<string, number>>;
  commentCounts?: Readonly<Record<string, number>>;
  /** Called with the per-system SVGs once they are built (for the PDF). */
  onSystems?: (systems: SVGSVGElement[]) => void;
}

const NO_SELECTION = { keys: [], focus: null, anchor: null };

/**
 * The engraved part with our glyphs, read-only, as one SVG per system: the workspace's score view
 * and overlay are drawn off-screen at the paper's width, then cut into systems (see
 * system-slices.ts) so print and PDF keep every system whole on a page.
 */
export function StandCopyScore({ xml, noteKeys = null, width, zoom, markings, suggestions, resolutions, durations, commentCounts, onSystems }: StandCopyScoreProps) {
  const sourceRef = useRef<HTMLDivElement>(null);
  const slicesRef = useRef<HTMLDivElement>(null);
  const [layout, setLayout] = useState<ScoreLayout | null>(null);
  const [status, setStatus] = useState<"engraving" | "ready" | "empty">("engraving");
  const idPrefix = `stand-clip${useId().replace(/[^\w-]/g, "")}`;
  const onSystemsRef = useRef(onSystems);
  useEffect(() => {
    onSystemsRef.current = onSystems;
  }, [onSystems]);

  const [sky, setSky] = useState<SkyBox[][]>([]);
  // Measured once per engraving, right after it is drawn (the overlay is not there yet).
  const onLayout = useCallback((l: ScoreLayout) => {
    const stage = sourceRef.current?.querySelector<HTMLElement>("[data-score-status]");
    const engraving = stage?.querySelector<SVGSVGElement>(ENGRAVING_SVG);
    setSky(stage && engraving ? measureSky(engraving, stage, l.systems) : []);
    setLayout(l);
  }, []);
  const systems = useMemo(() => layout?.systems.map((s, i) => ({ ...s, sky: sky[i] ?? [] })), [layout, sky]);

  useEffect(() => {
    const source = sourceRef.current;
    const target = slicesRef.current;
    if (!layout || !source || !target) return;
    let frame = 0;
    const build = () => {
      const stage = source.querySelector<HTMLElement>("[data-score-status]");
      const engraving = stage?.querySelector<SVGSVGElement>(ENGRAVING_SVG);
      const overlay = stage?.querySelector('[data-testid="marking-overlay"]');
      if (!stage || !engraving || !overlay) {
        frame = requestAnimationFrame(build);
        return;
      }
      const slices = buildSystemSlices({
        stage,
        engraving,
        glyphs: overlay.querySelector('[data-layer="glyphs"]'),
        systems: layout.systems,
        width: layout.width,
        height: layout.height,
        pad: 6 * zoom,
        idPrefix,
        bars: writtenBarsFromText(xml),
      });
      target.replaceChildren(...slices);
      setStatus(slices.length ? "ready" : "empty");
      onSystemsRef.current?.(slices);
    };
    frame = requestAnimationFrame(build);
    return () => cancelAnimationFrame(frame);
  }, [layout, markings, suggestions, resolutions, durations, commentCounts, zoom, idPrefix, xml]);

  return (
    <div data-stand-score={status}>
      {/* The source keeps its width but no height, in print too, so it never re-lays out. */}
      {/* It also undoes the page's viewing scale (--stand-zoom, see stand-copy.tsx), so what is
          measured from it is in the paper's own pixels on any screen. */}
      <div ref={sourceRef} className="pointer-events-none h-0 overflow-hidden [zoom:calc(1/var(--stand-zoom,1))] print:[zoom:1]" aria-hidden="true" inert>
        <div style={{ width }}>
          <ScoreView xml={xml} noteKeys={noteKeys} zoom={zoom} onLayout={onLayout} minTextPx={GLYPH_TEXT_PX} layoutFrom="drawing">
            {layout ? (
              <MarkingOverlay
                boxes={layout.boxes}
                width={layout.width}
                height={layout.height}
                scale={zoom}
                markings={markings}
                suggestions={suggestions}
                resolutions={resolutions}
                durations={durations}
                commentCounts={commentCounts}
                systems={systems}
                minTextPx={GLYPH_TEXT_PX}
                selection={NO_SELECTION}
              />
            ) : null}
          </ScoreView>
        </div>
      </div>
      <div ref={slicesRef} className="stand-systems" data-testid="stand-systems" />
      {status === "engraving" ? <p className="py-8 text-graphite" role="status">Engraving the part…</p> : null}
      {status === "empty" ? <p className="py-8 text-graphite">This part has no music to engrave.</p> : null}
    </div>
  );
}
