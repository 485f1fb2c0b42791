import type { ContourPoint } from "@/lib/practice/take-analysis";

const W = 640;
const H = 220;
const PAD = { left: 48, right: 12, top: 12, bottom: 28 };

/**
 * The take's pitch contour around its mean, with the marked depth as a band (±depth cents).
 * Drawn in plain SVG; the band is hatched as well as tinted so it reads in grayscale.
 */
export function ContourPlot({ contour, markedDepth }: { contour: ContourPoint[]; markedDepth: number | null }) {
  if (contour.length < 2) return null;
  const t0 = contour[0].t;
  const t1 = contour.at(-1)!.t;
  const peak = Math.max(markedDepth ?? 0, ...contour.map((p) => Math.abs(p.cents)));
  const range = Math.max(20, Math.ceil((peak * 1.15) / 10) * 10);
  const x = (t: number) => PAD.left + ((t - t0) / Math.max(1e-6, t1 - t0)) * (W - PAD.left - PAD.right);
  const y = (c: number) => PAD.top + ((range - c) / (2 * range)) * (H - PAD.top - PAD.bottom);
  const path = contour.map((p, i) => `${i ? "L" : "M"}${x(p.t).toFixed(1)},${y(p.cents).toFixed(1)}`).join("");
  const ticks = [-range, -range / 2, 0, range / 2, range];
  const seconds = Math.floor(t1 - t0);
  const timeTicks = Array.from({ length: seconds + 1 }, (_, i) => i).filter((s) => seconds <= 10 || s % 2 === 0);
  const label = `Pitch contour of the take over ${(t1 - t0).toFixed(1)} s, in ¢ around its mean${markedDepth !== null ? `, with the marked depth ±${markedDepth}¢ as a band` : ""}.`;

  return (
    <figure className="mt-3">
      <svg viewBox={`0 0 ${W} ${H}`} className="h-auto w-full" role="img" aria-label={label} data-testid="contour-plot">
        <defs>
          <pattern id="band-hatch" width="6" height="6" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
            <line x1="0" y1="0" x2="0" y2="6" stroke="#0072B2" strokeOpacity="0.35" strokeWidth="1.5" />
          </pattern>
        </defs>
        <rect x={PAD.left} y={PAD.top} width={W - PAD.left - PAD.right} height={H - PAD.top - PAD.bottom} fill="#FFFDF8" stroke="#DDD5C4" />
        {markedDepth !== null && markedDepth > 0 ? (
          <g data-testid="marked-band">
            <rect x={PAD.left} y={y(markedDepth)} width={W - PAD.left - PAD.right} height={y(-markedDepth) - y(markedDepth)} fill="#56B4E9" fillOpacity="0.15" />
            <rect x={PAD.left} y={y(markedDepth)} width={W - PAD.left - PAD.right} height={y(-markedDepth) - y(markedDepth)} fill="url(#band-hatch)" />
            <line x1={PAD.left} x2={W - PAD.right} y1={y(markedDepth)} y2={y(markedDepth)} stroke="#005A8C" strokeDasharray="5 4" />
            <line x1={PAD.left} x2={W - PAD.right} y1={y(-markedDepth)} y2={y(-markedDepth)} stroke="#005A8C" strokeDasharray="5 4" />
          </g>
        ) : null}
        {ticks.map((c) => (
          <g key={c}>
            <line x1={PAD.left} x2={W - PAD.right} y1={y(c)} y2={y(c)} stroke="#DDD5C4" strokeWidth={c === 0 ? 1.5 : 0.75} />
            <text x={PAD.left - 6} y={y(c) + 4} textAnchor="end" fontSize="11" fill="#4A4740">
              {c > 0 ? `+${c}` : c} c
            </text>
          </g>
        ))}
        {timeTicks.map((s) => (
          <text key={s} x={x(t0 + s)} y={H - 8} textAnchor="middle" fontSize="11" fill="#4A4740">
            {s} s
          </text>
        ))}
        <path d={path} fill="none" stroke="#1B1A17" strokeWidth="1.5" strokeLinejoin="round" />
      </svg>
      <figcaption className="text-xs text-graphite">
        Pitch in ¢ around the take&apos;s mean.{" "}
        {markedDepth !== null && markedDepth > 0 ? `The hatched band is the marked depth, ±${markedDepth} c.` : "No depth is marked on this note."}
      </figcaption>
    </figure>
  );
}
