"use client";

import { memo, useEffect, useMemo, useRef, useState } from "react";
import type { LocalKey, PhraseResult } from "@/lib/analysis/types";
import type { MarkingState } from "@/lib/markings/changes";
import { ROLE_INFO } from "@/lib/markings/roles";
import { roleShapePath } from "@/lib/markings/glyph-geometry";
import { keyLabel, keyName, layoutDots, layoutPhrases, localKeySpans, PHRASE_MIN_PX, xOf } from "@/lib/markings/phrase-map-layout";
import { barSpanName, type WrittenBar } from "@/lib/musicxml/bar-names";
import { parseNoteKey } from "@/lib/musicxml/note-key";

export interface PhraseMapProps {
  /** Note keys of the part in time order (the analysis' notes). */
  noteOrder: readonly string[];
  phrases: readonly PhraseResult[];
  markings: MarkingState;
  labelOf: (noteKey: string) => string;
  onJump: (noteKey: string) => void;
  /** The written bar number of each note of `noteOrder`, to place the local keys. */
  noteMeasures?: readonly string[];
  /** Where the music moves to another key, as the analysis reports it. */
  localKeys?: readonly LocalKey[];
  /** The part's bars as written, to name a key's span as the part numbers it. */
  bars?: readonly WrittenBar[];
}

/** Room for the start and peak marks (24 px targets) above a 24 px phrase bar (WCAG 2.2 SC 2.5.8). */
const STRIP_H = 48;
const KEY_BAND_H = 24;
/** The furthest the map zooms in: past this a phrase is a handful of notes. */
const MAX_ZOOM = 64;

/** A strip of the whole part: each phrase a span with its start, peak and end, the marked notes and the local keys. */
/** Memoized: a click on a note re-renders the workspace, and nothing here depends on the selection. */
export const PhraseMap = memo(function PhraseMap({ noteOrder, phrases, markings, labelOf, onJump, noteMeasures = [], localKeys = [], bars = [] }: PhraseMapProps) {
  const navRef = useRef<HTMLElement>(null);
  const [available, setAvailable] = useState(0);
  const [zoom, setZoom] = useState(1);

  useEffect(() => {
    const nav = navRef.current;
    if (!nav || typeof ResizeObserver === "undefined") return;
    const observer = new ResizeObserver((entries) => setAvailable(Math.round(entries[entries.length - 1].contentRect.width)));
    observer.observe(nav);
    return () => observer.disconnect();
  }, []);

  const index = useMemo(() => new Map(noteOrder.map((k, i) => [k, i])), [noteOrder]);
  const count = noteOrder.length;
  // Before the first measurement (and in tests) a typical phone width: glyphs rather too few than overlapping.
  const base = available || 360;
  const width = base * zoom;
  const spans = useMemo(() => phrases.map((p) => ({ start: index.get(p.start) ?? 0, peak: index.get(p.peak) ?? 0, end: index.get(p.end) ?? 0 })), [phrases, index]);
  const items = useMemo(() => layoutPhrases(spans, count, width), [spans, count, width]);
  // The zoom at which the narrowest phrase has room for its own glyphs.
  const eachPhrase = useMemo(() => {
    const narrowest = Math.min(...spans.map((p) => xOf(p.end, count, base) - xOf(p.start, count, base)).filter((w) => w > 0));
    return Number.isFinite(narrowest) ? Math.min(MAX_ZOOM, Math.max(1, Math.ceil(PHRASE_MIN_PX / narrowest))) : 1;
  }, [spans, count, base]);
  const zooms = [
    { z: 1, label: "Whole part" },
    ...(eachPhrase > 4 ? [{ z: 4, label: "4×" }] : []),
    ...(eachPhrase > 1 ? [{ z: eachPhrase, label: "Each phrase" }] : []),
  ];
  const dots = useMemo(
    () => layoutDots(Object.values(markings).flatMap((m) => (index.has(m.noteKey) ? [index.get(m.noteKey)!] : [])), count, width),
    [markings, index, count, width],
  );
  const keys = useMemo(() => localKeySpans(localKeys, noteMeasures), [localKeys, noteMeasures]);
  if (count === 0) return null;
  const height = STRIP_H + (keys.length > 0 ? KEY_BAND_H + 2 : 0);
  const crowded = items.some((it) => it.kind === "group");

  return (
    <nav ref={navRef} aria-label="Phrase map" className="relative w-full" data-testid="phrase-map">
      {crowded || zoom > 1 ? (
        <div className="flex items-center gap-1 text-xs text-graphite" data-testid="phrase-map-zoom">
          <span>Map zoom:</span>
          {zooms.map(({ z, label }) => (
            <button
              key={label}
              type="button"
              aria-pressed={zoom === z}
              onClick={() => setZoom(z)}
              className={`h-7 min-w-9 rounded border px-1 ${zoom === z ? "border-ink bg-paper-deep font-semibold text-ink" : "border-rule"}`}
            >
              {label}
            </button>
          ))}
          {crowded ? <span className="ml-1">Close phrases are drawn together; zoom in to see each.</span> : null}
        </div>
      ) : null}
      <div className={zoom > 1 ? "overflow-x-auto" : ""}>
        <div className="relative mx-3" style={{ height, width: zoom > 1 ? width : undefined }}>
          <div className="absolute inset-x-0 top-[36px] h-px bg-rule" aria-hidden="true" />
          {items.map((it) => {
            if (it.kind === "group") {
              const first = phrases[it.first];
              const last = phrases[it.last];
              return (
                <button
                  key={`g${it.first}`}
                  type="button"
                  onClick={() => onJump(first.start)}
                  className="group absolute top-6 h-6"
                  style={{ left: it.left, width: it.width }}
                  aria-label={`Phrases ${it.first + 1} to ${it.last + 1}: ${labelOf(first.start)} to ${labelOf(last.end)}`}
                  title={`Phrases ${it.first + 1}–${it.last + 1}`}
                  data-phrase-group={`${it.first + 1}-${it.last + 1}`}
                >
                  {/* Hatched: several phrases drawn as one span, inside a 24 px tall target. */}
                  <span
                    className="absolute inset-x-0 top-1 h-4 rounded-sm border border-graphite group-hover:opacity-80"
                    style={{ backgroundImage: "repeating-linear-gradient(90deg, #F3EDE0 0 3px, #DDD5C4 3px 4px)" }}
                    aria-hidden="true"
                  />
                </button>
              );
            }
            const p = phrases[it.index];
            const i = it.index;
            return (
              <div key={`${p.start}-${i}`} className="absolute top-0 h-12" style={{ left: it.left, width: it.width }}>
                <button
                  type="button"
                  onClick={() => onJump(p.start)}
                  className="group absolute inset-x-0 top-6 h-6"
                  aria-label={`Phrase ${i + 1}: ${labelOf(p.start)} to ${labelOf(p.end)}, peak ${labelOf(p.peak)}`}
                  title={`Phrase ${i + 1}`}
                >
                  {/* The bar drawn inside a 24 px tall target (WCAG 2.2 SC 2.5.8). */}
                  <span className="absolute inset-x-0 top-1 h-4 rounded-sm border border-graphite bg-paper-deep group-hover:bg-rule" aria-hidden="true" />
                </button>
                {it.width >= 24 ? <Mark at={0} role="phrase-start" label={`Phrase ${i + 1} start, ${labelOf(p.start)}`} onClick={() => onJump(p.start)} /> : null}
                {it.peak !== null ? <Mark at={it.peak} role="peak" label={`Phrase ${i + 1} peak, ${labelOf(p.peak)}`} onClick={() => onJump(p.peak)} /> : null}
                <span className="absolute right-0 top-[26px] h-5 w-[3px] bg-ink" aria-hidden="true" title={`End: ${labelOf(p.end)}`} />
              </div>
            );
          })}
          {dots.map((d) => {
            const key = noteOrder[d.first];
            return (
              // A picture only: dots this small and this close together are no target a finger can hit.
              <span
                key={key}
                className="pointer-events-none absolute top-[41px] h-1.5 w-1.5 -translate-x-1/2 rounded-full bg-ink"
                style={{ left: d.x }}
                aria-hidden="true"
                data-marked-note={key}
                title={d.count > 1 ? `${d.count} marked notes from ${labelOf(key)}` : `Marked note, ${labelOf(key)}`}
              />
            );
          })}
          {keys.map((k, i) => {
            const left = xOf(k.from, count, width);
            const w = Math.max(2, xOf(k.to, count, width) - left);
            const name = keyName(k.tonic, k.mode);
            const fromBar = parseNoteKey(noteOrder[k.from])?.measureIndex;
            const toBar = parseNoteKey(noteOrder[k.to])?.measureIndex;
            const label = `${name}, ${fromBar === undefined || toBar === undefined || bars.length === 0 ? `bars ${k.fromMeasure} to ${k.toMeasure}` : barSpanName(bars, fromBar, toBar)}`;
            const look = `absolute overflow-hidden whitespace-nowrap rounded-sm border px-1 text-left text-[11px] leading-[22px] ${k.mode === "minor" ? "border-graphite bg-paper-deep" : "border-rule bg-paper-card"}`;
            // A span narrower than a finger is drawn but is no target (WCAG 2.2 SC 2.5.8); zoom in to reach it.
            if (w < 24) return <span key={`${k.from}-${i}`} className={look} style={{ top: STRIP_H + 2, height: KEY_BAND_H, left, width: w }} title={label} aria-hidden="true" data-local-key={name} />;
            return (
              <button
                key={`${k.from}-${i}`}
                type="button"
                onClick={() => onJump(noteOrder[k.from])}
                className={look}
                style={{ top: STRIP_H + 2, height: KEY_BAND_H, left, width: w }}
                aria-label={`Local key: ${label}`}
                title={label}
                data-local-key={name}
              >
                {keyLabel(k.tonic, k.mode, w)}
              </button>
            );
          })}
        </div>
      </div>
      {keys.length > 0 ? (
        <p className="mx-3 text-xs text-graphite" data-testid="phrase-map-keys-caption">
          Boxes under the map: where the music moves to another key (shaded: minor). Tap one to go there.
        </p>
      ) : null}
    </nav>
  );
});

function Mark({ at, role, label, onClick }: { at: number; role: "phrase-start" | "peak"; label: string; onClick: () => void }) {
  return (
    <button
      type="button"
      onClick={onClick}
      aria-label={label}
      title={label}
      className="absolute top-0 flex h-6 w-6 -translate-x-1/2 items-center justify-center"
      style={{ left: at }}
    >
      <svg width="14" height="14" viewBox="0 0 14 14" aria-hidden="true">
        <path d={roleShapePath(role, 7, 7, 12)} fill={ROLE_INFO[role].color} stroke="#1B1A17" strokeWidth={1} />
      </svg>
    </button>
  );
}
