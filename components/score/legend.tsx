import { ROLE_INFO, ROLE_ORDER } from "@/lib/markings/roles";
import { roleShapePath, suggestionDash, vibratoWave, commentMarker, tensionArc } from "@/lib/markings/glyph-geometry";
import type { MarkingValues } from "@/lib/markings/schema";
import { GLYPH_TEXT_PX } from "@/lib/stand-copy/options";

const INK = "#1B1A17";
const GRAPHITE = "#4A4740";

function Wave({ values, caption }: { values: Partial<MarkingValues>; caption: string }) {
  const v = { depthCents: 40, speedHz: 5, placement: "centered", onset: "immediate", shape: "steady", ...values } as MarkingValues;
  const hairline = v.placement === "top-on-pitch" ? 5 : 11;
  const wave = vibratoWave({ x: 2, width: 56, hairline, depthCents: v.depthCents, speedHz: v.speedHz, placement: v.placement, onset: v.onset, shape: v.shape, durationSeconds: 1 });
  return (
    <li className="flex items-center gap-3 break-inside-avoid">
      <svg width="60" height="22" viewBox="0 0 60 22" aria-hidden="true" className="shrink-0">
        {wave.kind === "wave" ? <line x1={2} x2={58} y1={hairline} y2={hairline} stroke={GRAPHITE} strokeWidth={0.5} /> : null}
        <path d={wave.path} fill="none" stroke={INK} strokeWidth={1.3} strokeLinejoin="round" />
      </svg>
      <span className="text-sm">{caption}</span>
    </li>
  );
}

/**
 * What every glyph means. Printable (no colour needed, no interactive parts): reused on the stand
 * copy.
 */
export function Legend({ className = "" }: { className?: string }) {
  // The count at the stand copy's glyph text size, so the legend shows it as printed.
  const marker = commentMarker(3, 2, 2, 1, GLYPH_TEXT_PX);
  const arc = tensionArc({ x: 8, y: 16, row: 0 }, { x: 52, y: 16, row: 0 })[0];
  return (
    <section aria-labelledby="legend-title" className={`space-y-4 text-ink ${className}`} data-testid="legend">
      <h2 id="legend-title" className="text-lg font-semibold">
        Legend
      </h2>
      <div className="grid gap-x-8 gap-y-4 sm:grid-cols-2 print:grid-cols-2">
        <div>
          <h3 className="mb-2 font-sans text-sm font-semibold uppercase tracking-wide text-graphite">Vibrato (above each note)</h3>
          <ul className="space-y-1.5">
            <Wave values={{ depthCents: 15 }} caption="Shallow: the wave’s height follows depth (¢)" />
            <Wave values={{ depthCents: 80 }} caption="Deep" />
            <Wave values={{ speedHz: 8 }} caption="Faster: more crests across the note (Hz)" />
            <Wave values={{ depthCents: 0 }} caption="Flat with end caps: deliberately no vibrato" />
            <Wave values={{ placement: "top-on-pitch" }} caption="Hanging from the hairline: top on the pitch" />
            <Wave values={{ onset: "delayed" }} caption="Flat start: delayed onset" />
            <Wave values={{ shape: "growing" }} caption="Swelling: growing" />
            <Wave values={{ shape: "fading" }} caption="Narrowing: fading" />
          </ul>
          <p className="mt-2 text-xs text-graphite">Small numbers under a wave: depth in ¢, then speed in Hz (e.g. “20¢ 5.5”); “none” under a flat line.</p>
        </div>
        <div>
          <h3 className="mb-2 font-sans text-sm font-semibold uppercase tracking-wide text-graphite">Roles in the phrase</h3>
          <ul className="space-y-1.5">
            {ROLE_ORDER.map((role) => (
              <li key={role} className="flex items-center gap-3 break-inside-avoid">
                <svg width="60" height="18" viewBox="0 0 60 18" aria-hidden="true" className="shrink-0">
                  <path d={roleShapePath(role, 14, 9, 12)} fill={ROLE_INFO[role].color} stroke={INK} strokeWidth={1} strokeLinejoin="round" />
                  <path d={roleShapePath(role, 40, 9, 12)} fill="none" stroke={INK} strokeWidth={1} strokeDasharray={suggestionDash()} strokeLinejoin="round" />
                </svg>
                <span className="text-sm">
                  <strong>{ROLE_INFO[role].label}</strong> ({ROLE_INFO[role].shape}) — {ROLE_INFO[role].description}
                </span>
              </li>
            ))}
            <li className="flex items-center gap-3">
              <span className="w-[60px] shrink-0 text-center text-xs text-graphite" data-legend-icon-text>solid · dashed</span>
              <span className="text-sm">Solid: your marking. Hollow and dashed: a suggestion not yet decided.</span>
            </li>
            <li className="flex items-center gap-3 break-inside-avoid">
              <svg width="60" height="20" viewBox="0 0 60 20" aria-hidden="true" className="shrink-0">
                <path d={arc} fill="none" stroke={GRAPHITE} strokeWidth={1} />
              </svg>
              <span className="text-sm">Arc: from a tension tone to its resolution</span>
            </li>
            <li className="flex items-center gap-3 break-inside-avoid">
              <svg width="60" height="16" viewBox="0 0 60 16" aria-hidden="true" className="shrink-0" data-legend-icon>
                <path d={marker.path} fill="white" stroke={INK} strokeWidth={0.9} />
                <text x={marker.textX} y={marker.textY} fontSize={GLYPH_TEXT_PX} textAnchor="middle">2</text>
              </svg>
              <span className="text-sm">Comment tab with the number of comments</span>
            </li>
          </ul>
        </div>
      </div>
    </section>
  );
}
