import { ROLE_INFO, ROLE_ORDER } from "@/lib/markings/roles";
import { roleShapePath, vibratoWave } from "@/lib/markings/glyph-geometry";

const INK = "#1B1A17";

function WaveIcon({ depthCents }: { depthCents: number }) {
  const wave = vibratoWave({ x: 2, width: 32, hairline: 8, depthCents, speedHz: 5, placement: "centered", onset: "immediate", shape: "steady", durationSeconds: 1 });
  return (
    <svg width="36" height="16" viewBox="0 0 36 16" aria-hidden="true" className="shrink-0">
      <path d={wave.path} fill="none" stroke={INK} strokeWidth={1.3} strokeLinejoin="round" />
    </svg>
  );
}

/** The legend's essentials on one line, for the stand (the full legend is on the stand copy). */
export function StandLegend() {
  return (
    <ul className="flex flex-wrap items-center gap-x-5 gap-y-1 text-sm" aria-label="Legend" data-testid="stand-legend">
      <li className="flex items-center gap-1.5">
        <WaveIcon depthCents={40} />
        vibrato (height: depth in ¢, crests: speed in Hz)
      </li>
      <li className="flex items-center gap-1.5">
        <WaveIcon depthCents={0} />
        no vibrato
      </li>
      {ROLE_ORDER.map((role) => (
        <li key={role} className="flex items-center gap-1.5">
          <svg width="16" height="16" viewBox="0 0 16 16" aria-hidden="true" className="shrink-0">
            <path d={roleShapePath(role, 8, 8, 12)} fill={ROLE_INFO[role].color} stroke={INK} strokeWidth={1} strokeLinejoin="round" />
          </svg>
          {ROLE_INFO[role].label.toLowerCase()}
        </li>
      ))}
    </ul>
  );
}
