"use client";

import { memo, useMemo } from "react";
import type { PhraseResult } from "@/lib/analysis/types";
import type { MarkingState } from "@/lib/markings/changes";
import { ROLE_INFO } from "@/lib/markings/roles";
import { roleShapePath } from "@/lib/markings/glyph-geometry";

export interface PhraseMapProps {
  /** Note keys of the part in time order (the analysis' notes). */
  noteOrder: readonly string[];
  phrases: readonly PhraseResult[];
  markings: MarkingState;
  labelOf: (noteKey: string) => string;
  onJump: (noteKey: string) => void;
}

/** Room for the start and peak marks (24 px targets) above a 24 px phrase bar. */
const H = 48;

/** A strip of the whole part: each phrase a span with its start, peak and end, and the marked notes. */
/** Memoized: a click on a note re-renders the workspace, and nothing here depends on the selection. */
export const PhraseMap = memo(function PhraseMap({ noteOrder, phrases, markings, labelOf, onJump }: PhraseMapProps) {
  const index = useMemo(() => new Map(noteOrder.map((k, i) => [k, i])), [noteOrder]);
  const n = Math.max(1, noteOrder.length - 1);
  const pct = (key: string) => ((index.get(key) ?? 0) / n) * 100;
  const marked = Object.values(markings).filter((m) => index.has(m.noteKey));
  if (noteOrder.length === 0) return null;
  return (
    <nav aria-label="Phrase map" className="relative w-full" data-testid="phrase-map">
      <div className="relative" style={{ height: H }}>
        <div className="absolute inset-x-0 top-[36px] h-px bg-rule" aria-hidden="true" />
        {phrases.map((p, i) => {
          const left = pct(p.start);
          const right = pct(p.end);
          return (
            <div key={`${p.start}-${i}`} className="absolute top-0 h-full" style={{ left: `${left}%`, width: `${Math.max(0.5, right - left)}%` }}>
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
              <Mark at={0} role="phrase-start" label={`Phrase ${i + 1} start, ${labelOf(p.start)}`} onClick={() => onJump(p.start)} />
              <Mark
                at={right - left > 0 ? ((pct(p.peak) - left) / (right - left)) * 100 : 0}
                role="peak"
                label={`Phrase ${i + 1} peak, ${labelOf(p.peak)}`}
                onClick={() => onJump(p.peak)}
              />
              <span className="absolute right-0 top-[26px] h-5 w-[3px] bg-ink" aria-hidden="true" title={`End: ${labelOf(p.end)}`} />
            </div>
          );
        })}
        {/* Where the marked notes are: a picture only, since dots this small (and this close
            together) cannot be targets a finger can hit; a tap there lands on the phrase. */}
        {marked.map((m) => (
          <span
            key={m.noteKey}
            className="pointer-events-none absolute top-[41px] h-1.5 w-1.5 -translate-x-1/2 rounded-full bg-ink"
            style={{ left: `${pct(m.noteKey)}%` }}
            aria-hidden="true"
            data-marked-note={m.noteKey}
          />
        ))}
      </div>
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
      style={{ left: `${at}%` }}
    >
      <svg width="14" height="14" viewBox="0 0 14 14" aria-hidden="true">
        <path d={roleShapePath(role, 7, 7, 12)} fill={ROLE_INFO[role].color} stroke="#1B1A17" strokeWidth={1} />
      </svg>
    </button>
  );
}
