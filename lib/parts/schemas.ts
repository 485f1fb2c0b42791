import { z } from "zod";
import { LINES } from "@/lib/musicxml/lines";

export const partIdParams = z.object({ partId: z.string().uuid("That is not a part id.") });

export const PART_SORTS = ["title", "-title", "composer", "-composer", "key", "-key", "bars", "-bars", "markings", "-markings", "updated", "-updated"] as const;

export const listPartsQuery = z.object({
  query: z.string().max(200).default(""),
  sort: z.enum(PART_SORTS).default("-updated"),
  page: z.coerce.number().int().min(1).max(10_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(20),
});

export const patchPartBody = z
  .object({
    title: z.string().trim().min(1, "A title cannot be empty.").max(200, "A title can hold at most 200 characters.").optional(),
    composer: z.string().trim().max(200, "A composer name can hold at most 200 characters.").optional(),
    chosenPart: z.string().min(1).max(100).optional(),
    /** ♩ per minute; null goes back to the part's own tempo. */
    workingTempo: z
      .number({ error: "The working tempo must be a number of beats (♩) per minute." })
      .min(20, "A working tempo is at least ♩ = 20.")
      .max(300, "A working tempo is at most ♩ = 300.")
      .nullable()
      .optional(),
    /** Whose line of a staff carrying two players the analysis, practice and playback follow. */
    line: z.enum(LINES, { error: 'The line is "upper" or "lower".' }).optional(),
    version: z.number().int().positive().optional(),
  })
  .refine((b) => b.title !== undefined || b.composer !== undefined || b.chosenPart !== undefined || b.workingTempo !== undefined || b.line !== undefined, {
    message: "Send at least one of title, composer, chosenPart, workingTempo or line.",
  });

/** `?line=` on the analysis: the line to analyse instead of the one the player chose. */
export const analysisQuery = z.object({ line: z.enum(LINES, { error: 'The line is "upper" or "lower".' }).optional() });

export const sampleBody = z.object({ name: z.string().regex(/^[a-z0-9-]+\.(musicxml|mxl)$/, "Unknown sample.") });
