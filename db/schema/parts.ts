import { sql } from "drizzle-orm";
import {
  bigserial, customType, index, integer, jsonb, pgEnum, pgTable, primaryKey, real, text, timestamp, uniqueIndex, uuid,
} from "drizzle-orm/pg-core";
import { users } from "./auth";

const bytea = customType<{ data: Buffer; driverData: Buffer }>({ dataType: () => "bytea" });

export const sourceFormat = pgEnum("source_format", ["musicxml", "mxl"]);
export const placement = pgEnum("marking_placement", ["centered", "top-on-pitch"]);
export const vibratoOnset = pgEnum("marking_onset", ["immediate", "delayed"]);
export const vibratoShape = pgEnum("marking_shape", ["steady", "growing", "fading"]);
export const markingRole = pgEnum("marking_role", ["phrase-start", "peak", "tension", "resolution"]);
export const historyAction = pgEnum("history_action", ["create", "update", "delete"]);
export const suggestionDecision = pgEnum("suggestion_decision", ["accepted", "dismissed"]);
/** Which player's line of a staff carrying two players (lib/musicxml/lines.ts). */
export const partLine = pgEnum("part_line", ["upper", "lower"]);

export const parts = pgTable(
  "parts",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    ownerId: uuid("owner_id").notNull().references(() => users.id, { onDelete: "cascade" }),
    title: text("title").notNull(),
    composer: text("composer").notNull().default(""),
    sourceFileName: text("source_file_name").notNull(),
    sourceFormat: sourceFormat("source_format").notNull(),
    /** The uploaded file as it came, for "download the original". */
    sourceBytes: bytea("source_bytes").notNull(),
    sizeBytes: integer("size_bytes").notNull(),
    /** Normalized, re-serialized partwise MusicXML: the only text the browser is sent. */
    musicxml: text("musicxml").notNull(),
    partList: jsonb("part_list").$type<{ id: string; name: string }[]>().notNull(),
    chosenPartId: text("chosen_part_id").notNull(),
    keyLabel: text("key_label").notNull().default(""),
    tempo: real("tempo"),
    /** The player's working tempo (♩ per minute) when they set one; else the part's own tempo is used. */
    workingTempo: real("working_tempo"),
    measureCount: integer("measure_count").notNull().default(0),
    noteCount: integer("note_count").notNull().default(0),
    /** Keys of the chosen part's markable notes; a marking on any other key is refused. */
    noteKeys: text("note_keys").array().notNull().default(sql`'{}'::text[]`),
    /** The analysis result of every part of the score (command-line shape), with its version. */
    analysis: jsonb("analysis"),
    analysisVersion: integer("analysis_version").notNull().default(0),
    /**
     * The player's line when the chosen part's staff carries two players: analysis, practice and
     * playback follow it. `analysis` holds every part on its upper line.
     */
    line: partLine("line").notNull().default("upper"),
    /** The chosen part's analysis on the lower line, kept under the key it was made for
     * (analysis version, part, line), so switching lines does not analyse again. */
    lineAnalysis: jsonb("line_analysis").$type<{ key: string; analysis: unknown }>(),
    /** What the reader read as written and the player should know (lib/musicxml ReadNotice messages). */
    readNotices: jsonb("read_notices").$type<string[]>().notNull().default(sql`'[]'::jsonb`),
    version: integer("version").notNull().default(1),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("parts_owner_updated_idx").on(t.ownerId, t.updatedAt),
    index("parts_title_lower_idx").on(sql`lower(${t.title})`),
  ],
);

export const markings = pgTable(
  "markings",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    partId: uuid("part_id").notNull().references(() => parts.id, { onDelete: "cascade" }),
    noteKey: text("note_key").notNull(),
    authorId: uuid("author_id").notNull().references(() => users.id, { onDelete: "cascade" }),
    depthCents: real("depth_cents").notNull(),
    speedHz: real("speed_hz").notNull(),
    placement: placement("placement").notNull().default("centered"),
    onset: vibratoOnset("onset").notNull().default("immediate"),
    shape: vibratoShape("shape").notNull().default("steady"),
    role: markingRole("role"),
    comment: text("comment").notNull().default(""),
    version: integer("version").notNull().default(1),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("markings_part_note_idx").on(t.partId, t.noteKey)],
);

/** Every marking change, so no edit is lost and undo/redo survive a reload. */
export const markingHistory = pgTable(
  "marking_history",
  {
    id: bigserial("id", { mode: "number" }).primaryKey(),
    partId: uuid("part_id").notNull().references(() => parts.id, { onDelete: "cascade" }),
    noteKey: text("note_key").notNull(),
    actorId: uuid("actor_id").notNull().references(() => users.id, { onDelete: "cascade" }),
    action: historyAction("action").notNull(),
    before: jsonb("before"),
    after: jsonb("after"),
    /** Changes made by one gesture (e.g. applying to a multi-note selection) undo together. */
    groupId: uuid("group_id").notNull(),
    /** Set when the change came from accepting a teacher's proposal. */
    proposalId: uuid("proposal_id"),
    /** Undo marks a row undone; a new edit after undo discards the undone rows (redo is gone). */
    undoneAt: timestamp("undone_at", { withTimezone: true }),
    discardedAt: timestamp("discarded_at", { withTimezone: true }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("marking_history_part_idx").on(t.partId, t.id),
    // Every write ends the redo chain by marking the part's undone rows; without this index that
    // update reads the part's whole history on every save.
    index("marking_history_undone_idx").on(t.partId).where(sql`${t.undoneAt} is not null and ${t.discardedAt} is null`),
  ],
);

export const suggestionDecisions = pgTable(
  "suggestion_decisions",
  {
    partId: uuid("part_id").notNull().references(() => parts.id, { onDelete: "cascade" }),
    noteKey: text("note_key").notNull(),
    role: markingRole("role").notNull(),
    decision: suggestionDecision("decision").notNull(),
    userId: uuid("user_id").notNull().references(() => users.id, { onDelete: "cascade" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.partId, t.noteKey, t.role] })],
);

export type Part = typeof parts.$inferSelect;
export type NewPart = typeof parts.$inferInsert;
export type Marking = typeof markings.$inferSelect;
export type NewMarking = typeof markings.$inferInsert;
export type MarkingHistoryRow = typeof markingHistory.$inferSelect;
