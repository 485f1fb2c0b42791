import { date, index, integer, jsonb, pgEnum, pgTable, real, text, timestamp, uuid } from "drizzle-orm/pg-core";
import { users } from "./auth";
import { parts } from "./parts";

export const practiceEntries = pgTable(
  "practice_entries",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    userId: uuid("user_id").notNull().references(() => users.id, { onDelete: "cascade" }),
    partId: uuid("part_id").notNull().references(() => parts.id, { onDelete: "cascade" }),
    noteKey: text("note_key"),
    kind: text("kind").notNull(),
    minutes: real("minutes").notNull().default(0),
    notes: text("notes").notNull().default(""),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("practice_entries_user_part_idx").on(t.userId, t.partId)],
);

/** A recorded take with the measured vibrato per note. Audio itself is not kept. */
export const takes = pgTable(
  "takes",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    userId: uuid("user_id").notNull().references(() => users.id, { onDelete: "cascade" }),
    partId: uuid("part_id").notNull().references(() => parts.id, { onDelete: "cascade" }),
    noteKey: text("note_key"),
    measured: jsonb("measured").notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("takes_part_idx").on(t.partId)],
);

export const assignmentDrill = pgEnum("assignment_drill", ["pulse-trainer", "hold-ladder", "take", "free"]);

/**
 * Practice a teacher sets for a student on a shared part: a drill, optionally on one note,
 * with instructions and a date. The student ticks it off; the teacher sees the progress.
 */
export const practiceAssignments = pgTable(
  "practice_assignments",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    partId: uuid("part_id").notNull().references(() => parts.id, { onDelete: "cascade" }),
    assignedBy: uuid("assigned_by").notNull().references(() => users.id, { onDelete: "cascade" }),
    noteKey: text("note_key"),
    drill: assignmentDrill("drill").notNull(),
    instructions: text("instructions").notNull().default(""),
    /** Minutes a day the teacher asks for; null when not set. */
    minutesPerDay: integer("minutes_per_day"),
    dueOn: date("due_on"),
    doneAt: timestamp("done_at", { withTimezone: true }),
    version: integer("version").notNull().default(1),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("practice_assignments_part_idx").on(t.partId, t.doneAt)],
);
