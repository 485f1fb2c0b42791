import { z } from "zod";

/** What the practice log and the takes send and receive over the wire (shared by both sides). */

export const PRACTICE_KINDS = ["pulse-trainer", "hold-ladder", "take", "free"] as const;
export type PracticeKind = (typeof PRACTICE_KINDS)[number];

export const PRACTICE_KIND_LABELS: Record<PracticeKind, string> = {
  "pulse-trainer": "Pulse trainer",
  "hold-ladder": "Hold ladder",
  take: "Take",
  free: "Free practice",
};

const noteKey = z.string().min(1, "Choose a note.").max(200, "That note key is too long.");

export const practiceEntryBodySchema = z.object({
  kind: z.enum(PRACTICE_KINDS, { error: "Choose what you practised: pulse trainer, hold ladder, take or free practice." }),
  minutes: z
    .number({ error: "Minutes must be a number." })
    .min(1, "Log at least one minute.")
    .max(600, "A practice entry can hold at most 600 minutes."),
  noteKey: noteKey.nullable().optional(),
  notes: z.string().trim().max(2000, "Notes can hold at most 2000 characters.").default(""),
});
export type PracticeEntryBody = z.input<typeof practiceEntryBodySchema>;

export interface PracticeEntryDto {
  id: string;
  kind: PracticeKind;
  minutes: number;
  noteKey: string | null;
  notes: string;
  createdAt: string;
}

export interface PracticeLogDto {
  entries: PracticeEntryDto[];
  totalMinutes: number;
  canWrite: boolean;
}

const optionalMeasure = (max: number, what: string, min = 0) =>
  z
    .number({ error: `${what} must be a number or null.` })
    .min(min, `${what} cannot be below ${min}.`)
    .max(max, `${what} cannot be above ${max}.`)
    .nullable();

/** A take's measured numbers (the audio itself is never sent or kept). */
export const takeBodySchema = z.object({
  noteKey,
  speedHz: optionalMeasure(20, "Speed"),
  depthCents: optionalMeasure(1200, "Depth"),
  offsetCents: optionalMeasure(1200, "Pitch offset", -1200),
  voicedFraction: z.number({ error: "The voiced share must be a number." }).min(0, "The voiced share cannot be below 0.").max(1, "The voiced share cannot be above 1."),
  toneSeconds: z.number({ error: "The tone length must be a number." }).min(0, "The tone length cannot be below 0 s.").max(600, "A take can be at most 600 s long."),
  loudnessSpeedHz: optionalMeasure(20, "Loudness speed").optional().default(null),
  loudnessDepthDb: optionalMeasure(60, "Loudness depth").optional().default(null),
});
export type TakeBody = z.input<typeof takeBodySchema>;

export interface TakeDto {
  id: string;
  noteKey: string;
  speedHz: number | null;
  depthCents: number | null;
  offsetCents: number | null;
  voicedFraction: number;
  toneSeconds: number;
  loudnessSpeedHz: number | null;
  loudnessDepthDb: number | null;
  /** The note's marking when the take was saved (null when it had none). */
  marked: { speedHz: number; depthCents: number } | null;
  createdAt: string;
}

export const listTakesQuery = z.object({ noteKey: noteKey.optional() });
