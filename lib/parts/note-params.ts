import { z } from "zod";

/** Route params for a note: the key arrives URL-decoded by the framework. */
export const noteParams = z.object({
  partId: z.string().uuid("That is not a part id."),
  noteKey: z.string().min(1).max(200, "That note key is too long."),
});
