import { z } from "zod";
import { markingValuesSchema } from "@/lib/markings/schema";
import { normalizeCommentText, COMMENT_MAX_LENGTH } from "./comment-text";

export const SHARE_PERMISSIONS = ["comment", "propose"] as const;
export type SharePermission = (typeof SHARE_PERMISSIONS)[number];

/** The thread about the whole part; every other thread key is a note key. */
export const PART_THREAD = "part";

export const shareParams = z.object({
  partId: z.string().uuid("That is not a part id."),
  shareId: z.string().uuid("That is not an invitation id."),
});

export const commentParams = z.object({
  partId: z.string().uuid("That is not a part id."),
  commentId: z.string().uuid("That is not a comment id."),
});

export const proposalParams = z.object({
  partId: z.string().uuid("That is not a part id."),
  proposalId: z.string().uuid("That is not a proposal id."),
});

export const inviteBody = z.object({
  email: z
    .string()
    .trim()
    .max(254, "That e-mail address is too long.")
    .pipe(z.email({ error: "Enter the e-mail address of the person to share with." })),
  permission: z.enum(SHARE_PERMISSIONS, { error: "Choose comment or propose." }),
});

export const patchShareBody = z.object({
  permission: z.enum(SHARE_PERMISSIONS, { error: "Choose comment or propose." }),
});

export const acceptBody = z.object({
  token: z.string().min(20, "This invitation link is incomplete.").max(200, "This invitation link is not valid."),
});

export const threadQuery = z.object({
  thread: z.string().min(1, "Name the thread: a note key, or “part”.").max(200, "That thread key is too long."),
});

/** Plain text only: line breaks kept, surrounding blank space trimmed, no markup interpreted. */
export const commentTextSchema = z
  .string({ error: "Write the comment as text." })
  .transform(normalizeCommentText)
  .pipe(
    z
      .string()
      .min(1, "A comment cannot be empty.")
      .max(COMMENT_MAX_LENGTH, `A comment can hold at most ${COMMENT_MAX_LENGTH} characters.`),
  );

export const commentBody = z.object({ body: commentTextSchema });

export const resolveBody = z.object({
  thread: threadQuery.shape.thread,
  resolved: z.boolean().default(true),
});

export const proposalBody = z.object({
  noteKey: z.string().min(1).max(200, "That note key is too long."),
  /** The marking version the proposal starts from; null when the note has no marking. */
  baseVersion: z.number().int().positive().nullable(),
  marking: markingValuesSchema,
  comment: z
    .string()
    .transform(normalizeCommentText)
    .pipe(z.string().max(COMMENT_MAX_LENGTH, `A comment can hold at most ${COMMENT_MAX_LENGTH} characters.`))
    .default(""),
});

export const declineBody = z.object({
  reply: z
    .string()
    .transform(normalizeCommentText)
    .pipe(z.string().max(COMMENT_MAX_LENGTH, `A reply can hold at most ${COMMENT_MAX_LENGTH} characters.`))
    .default(""),
});

export const notificationsQuery = z.object({
  partId: z.string().uuid("That is not a part id.").optional(),
});

export const readBody = z
  .object({
    partId: z.string().uuid("That is not a part id."),
    /** Only this thread's notifications (a note key or "part"); all of the part's when absent. */
    thread: z.string().min(1).max(200).optional(),
    /** Only notifications of this kind (the practice page reads the practice it lists). */
    kind: z.enum(["assignment"]).optional(),
  })
  .strict();
