import { z } from "zod";
import { PRACTICE_KIND_LABELS, PRACTICE_KINDS, type PracticeKind } from "@/lib/practice/schema";

/** What practice assignments send and receive over the wire (shared by the server and the browser). */

/**
 * The drills a teacher can set are the kinds of practice the log records (the first three are the
 * practice page's own sections), named once in lib/practice/schema.ts.
 */
export const ASSIGNMENT_DRILLS = PRACTICE_KINDS;
export type AssignmentDrill = PracticeKind;
export const DRILL_LABELS = PRACTICE_KIND_LABELS;

export const INSTRUCTIONS_MAX_LENGTH = 2000;
/** Two hours a day on one assignment is already far past a usual practice plan (common practice). */
export const MINUTES_PER_DAY_MAX = 240;

export const assignmentParams = z.object({
  partId: z.string().uuid("That is not a part id."),
  assignmentId: z.string().uuid("That is not an assignment id."),
});

/** A calendar date `YYYY-MM-DD` that exists (no 31 April). */
export const isoDateSchema = z
  .string({ error: "Write the due date as YYYY-MM-DD." })
  .regex(/^\d{4}-\d{2}-\d{2}$/, "Write the due date as YYYY-MM-DD.")
  .refine((s) => {
    const d = new Date(`${s}T00:00:00Z`);
    return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === s;
  }, "That due date is not a day of the calendar.");

const noteKey = z.string().min(1, "Choose a note, or none.").max(200, "That note key is too long.").nullable();
const drill = z.enum(ASSIGNMENT_DRILLS, { error: "Choose a drill: pulse trainer, hold ladder, take or free practice." });
const instructions = z
  .string({ error: "Write the instructions as text." })
  .trim()
  .max(INSTRUCTIONS_MAX_LENGTH, `Instructions can hold at most ${INSTRUCTIONS_MAX_LENGTH} characters.`);
const minutesPerDay = z
  .number({ error: "Minutes a day must be a whole number." })
  .int("Minutes a day must be a whole number.")
  .min(1, "Ask for at least one minute a day, or leave it empty.")
  .max(MINUTES_PER_DAY_MAX, `Ask for at most ${MINUTES_PER_DAY_MAX} minutes a day.`)
  .nullable();
const version = z.number({ error: "Send the version of the assignment you are changing." }).int().positive();

/** Body of POST /api/parts/[partId]/assignments. */
export const createAssignmentBody = z.object({
  drill,
  noteKey: noteKey.default(null),
  instructions: instructions.default(""),
  minutesPerDay: minutesPerDay.default(null),
  dueOn: isoDateSchema.nullable().default(null),
});
export type CreateAssignmentBody = z.input<typeof createAssignmentBody>;

/**
 * Body of PATCH /api/parts/[partId]/assignments/[assignmentId]: either the teacher's fields or the
 * student's `done`, never both, always with the version the change was made against.
 */
export const patchAssignmentBody = z
  .object({
    version,
    done: z.boolean({ error: "Send done as true or false." }).optional(),
    drill: drill.optional(),
    noteKey: noteKey.optional(),
    instructions: instructions.optional(),
    minutesPerDay: minutesPerDay.optional(),
    dueOn: isoDateSchema.nullable().optional(),
  })
  .strict()
  .refine((b) => Object.keys(b).some((k) => k !== "version"), { message: "Send done, or at least one field to change." })
  .refine((b) => b.done === undefined || Object.keys(b).every((k) => k === "version" || k === "done"), {
    message: "Marking practice done changes nothing else: send done on its own.",
    path: ["done"],
  });
export type PatchAssignmentBody = z.input<typeof patchAssignmentBody>;

export const deleteAssignmentQuery = z.object({
  version: z.coerce.number({ error: "Send the version of the assignment you are removing." }).int().positive("Send the version of the assignment you are removing."),
});

export interface AssignmentDto {
  id: string;
  partId: string;
  noteKey: string | null;
  drill: AssignmentDrill;
  instructions: string;
  minutesPerDay: number | null;
  /** `YYYY-MM-DD`, a calendar day with no time zone. */
  dueOn: string | null;
  doneAt: string | null;
  version: number;
  assignedById: string;
  assignedByName: string;
  createdAt: string;
  updatedAt: string;
}

export interface AssignmentListDto {
  assignments: AssignmentDto[];
  /** The viewer may set practice on this part (a teacher it is shared with). */
  canAssign: boolean;
  /** The viewer may tick practice done (the part's owner). */
  canMarkDone: boolean;
  /** Who is asking, so the teacher's own practice shows its Edit and Remove. */
  viewerId: string;
}
