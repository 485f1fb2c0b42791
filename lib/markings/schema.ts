import { z } from "zod";

/** The marking fields a player edits. Ranges: depth 0–100 cents (peak, ±), speed 0–12 Hz. */
export const PLACEMENTS = ["centered", "top-on-pitch"] as const;
export const ONSETS = ["immediate", "delayed"] as const;
export const SHAPES = ["steady", "growing", "fading"] as const;
export const ROLES = ["phrase-start", "peak", "tension", "resolution"] as const;

export const markingValuesSchema = z.object({
  depthCents: z
    .number({ error: "Depth must be a number (of ¢)." })
    .min(0, "Depth cannot be below 0¢.")
    .max(100, "Depth cannot be above 100¢."),
  speedHz: z
    .number({ error: "Speed must be a number of pulses per second (Hz)." })
    .min(0, "Speed cannot be below 0 Hz.")
    .max(12, "Speed cannot be above 12 Hz."),
  placement: z.enum(PLACEMENTS),
  onset: z.enum(ONSETS),
  shape: z.enum(SHAPES),
  role: z.enum(ROLES).nullable(),
  comment: z.string().max(2000, "A comment can hold at most 2000 characters."),
});

export type MarkingValues = z.infer<typeof markingValuesSchema>;

/** Body of PUT /api/parts/[partId]/markings/[noteKey]. `version` is absent for a new marking. */
export const putMarkingBodySchema = markingValuesSchema.extend({
  version: z.number().int().positive().optional(),
  /** Client-made id shared by the changes of one gesture, so they undo together. */
  group: z.string().uuid().optional(),
});
export type PutMarkingBody = z.infer<typeof putMarkingBodySchema>;

/** What the API returns for a marking. */
export interface MarkingDto extends MarkingValues {
  noteKey: string;
  version: number;
  authorId: string;
  updatedAt: string;
}

/** A flute player's everyday starting point (common practice: about 5–6 Hz, a few cents). */
export const DEFAULT_MARKING: MarkingValues = {
  depthCents: 20,
  speedHz: 5.5,
  placement: "centered",
  onset: "immediate",
  shape: "steady",
  role: null,
  comment: "",
};

export const decisionBodySchema = z.object({
  noteKey: z.string().min(1).max(200),
  role: z.enum(ROLES),
  decision: z.enum(["accepted", "dismissed"]),
});
