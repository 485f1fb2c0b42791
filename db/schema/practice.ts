import { index, jsonb, pgTable, real, text, timestamp, uuid } from "drizzle-orm/pg-core";
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
