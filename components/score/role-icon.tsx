import type { Role } from "@/lib/analysis/types";
import { roleShapePath } from "@/lib/markings/glyph-geometry";
import { ROLE_INFO } from "@/lib/markings/roles";

/** A role's shape as a small inline icon (solid for a marking, hollow dashed for a suggestion). */
export function RoleIcon({ role, size = 14, hollow = false }: { role: Role; size?: number; hollow?: boolean }) {
  const s = size - 2;
  return (
    <svg width={size} height={size} viewBox={`0 0 ${size} ${size}`} aria-hidden="true" className="inline-block shrink-0 align-[-2px]">
      <path
        d={roleShapePath(role, size / 2, size / 2, s)}
        fill={hollow ? "none" : ROLE_INFO[role].color}
        stroke="#1B1A17"
        strokeWidth={1}
        strokeDasharray={hollow ? "2 1.5" : undefined}
        strokeLinejoin="round"
      />
    </svg>
  );
}
