import type { Role } from "@/lib/analysis/types";

/**
 * How each role is named and drawn. Colours are the Okabe–Ito tokens of tailwind.config.ts
 * (`role.*`); the shape alone must already tell the roles apart.
 */
export const ROLE_INFO: Record<Role, { label: string; shape: string; color: string; token: string; description: string }> = {
  "phrase-start": {
    label: "Phrase start",
    shape: "flag",
    color: "#009E73",
    token: "role-start",
    description: "Where a phrase begins: set up the breath and the line here.",
  },
  peak: {
    label: "Peak",
    shape: "triangle",
    color: "#D55E00",
    token: "role-peak",
    description: "The high point the phrase travels to.",
  },
  tension: {
    label: "Tension tone",
    shape: "diamond",
    color: "#CC79A7",
    token: "role-tension",
    description: "A note that pulls toward another (a leading tone, a tendency tone).",
  },
  resolution: {
    label: "Resolution",
    shape: "disc",
    color: "#0072B2",
    token: "role-resolution",
    description: "Where a tension tone comes to rest.",
  },
};

export const ROLE_ORDER: Role[] = ["phrase-start", "peak", "tension", "resolution"];
