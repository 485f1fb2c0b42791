import "server-only";
import { and, asc, desc, eq, isNotNull, isNull, sql } from "drizzle-orm";
import type { MarkingDto, MarkingValues } from "@/lib/markings/schema";
import { alias } from "drizzle-orm/pg-core";
import { db, type Executor, type Tx } from "./client";
import { markingHistory, markings, parts, proposals, users, type Marking } from "./schema";

const proposers = alias(users, "proposers");

/** A marking as stored in history rows and sent over the wire. */
export function toMarkingDto(m: Marking): MarkingDto {
  return {
    noteKey: m.noteKey,
    depthCents: m.depthCents,
    speedHz: m.speedHz,
    placement: m.placement,
    onset: m.onset,
    shape: m.shape,
    role: m.role,
    comment: m.comment,
    version: m.version,
    authorId: m.authorId,
    updatedAt: m.updatedAt.toISOString(),
  };
}

export async function listMarkingsByPartId({ partId }: { partId: string }): Promise<MarkingDto[]> {
  const rows = await db().select().from(markings).where(eq(markings.partId, partId)).orderBy(asc(markings.noteKey));
  return rows.map(toMarkingDto);
}

export async function getMarkingByNoteKey({ partId, noteKey, tx }: { partId: string; noteKey: string; tx?: Executor }): Promise<MarkingDto | null> {
  const [row] = await (tx ?? db()).select().from(markings).where(and(eq(markings.partId, partId), eq(markings.noteKey, noteKey)));
  return row ? toMarkingDto(row) : null;
}

export type WriteResult = { ok: true; marking: MarkingDto | null } | { ok: false; current: MarkingDto | null };

async function lockPart(tx: Tx, partId: string) {
  // One writer per part at a time keeps versions and the undo chain consistent.
  await tx.execute(sql`select id from ${parts} where ${parts.id} = ${partId} for update`);
}

async function currentMarking(tx: Tx, partId: string, noteKey: string): Promise<Marking | undefined> {
  const [row] = await tx.select().from(markings).where(and(eq(markings.partId, partId), eq(markings.noteKey, noteKey)));
  return row;
}

/**
 * Versions never repeat for a note, even across delete and re-create, so a stale tab can never
 * match a newer marking by accident.
 */
async function nextVersion(tx: Tx, partId: string, noteKey: string, current: Marking | undefined): Promise<number> {
  if (current) return current.version + 1;
  const [row] = await tx
    .select({ v: sql<number>`coalesce(max(greatest(coalesce((${markingHistory.after}->>'version')::int, 0), coalesce((${markingHistory.before}->>'version')::int, 0))), 0)::int` })
    .from(markingHistory)
    .where(and(eq(markingHistory.partId, partId), eq(markingHistory.noteKey, noteKey)));
  return (row?.v ?? 0) + 1;
}

/** Sets a note's marking to `values` (or removes it when null) and returns the stored row. */
async function applyMarking(tx: Tx, o: { partId: string; noteKey: string; values: MarkingValues | null; actorId: string; current: Marking | undefined }): Promise<Marking | null> {
  const now = new Date();
  if (o.values === null) {
    if (o.current) await tx.delete(markings).where(eq(markings.id, o.current.id));
    return null;
  }
  const version = await nextVersion(tx, o.partId, o.noteKey, o.current);
  if (o.current) {
    const [row] = await tx
      .update(markings)
      .set({ ...pickValues(o.values), version, authorId: o.actorId, updatedAt: now })
      .where(eq(markings.id, o.current.id))
      .returning();
    return row;
  }
  const [row] = await tx
    .insert(markings)
    .values({ partId: o.partId, noteKey: o.noteKey, ...pickValues(o.values), version, authorId: o.actorId, createdAt: now, updatedAt: now })
    .returning();
  return row;
}

function pickValues(v: MarkingValues): MarkingValues {
  return {
    depthCents: v.depthCents,
    speedHz: v.speedHz,
    placement: v.placement,
    onset: v.onset,
    shape: v.shape,
    role: v.role,
    comment: v.comment,
  };
}

export interface MarkingWrite {
  partId: string;
  noteKey: string;
  values: MarkingValues | null;
  expectedVersion: number | undefined;
  actorId: string;
  groupId: string;
  proposalId?: string;
}

/**
 * Writes a marking if the caller edited the version that is current (`expectedVersion`
 * undefined means "there was no marking"). Otherwise nothing changes and the current marking
 * comes back, so the caller can show both and let the person choose.
 */
export async function writeMarking(o: MarkingWrite & {
  /** The caller's transaction, when the write is one step of a larger change. */
  tx?: Executor;
}): Promise<WriteResult> {
  return (o.tx ?? db()).transaction(async (tx) => {
    await lockPart(tx, o.partId);
    return writeMarkingInLockedPart(tx, o);
  });
}

/**
 * `writeMarking` inside the caller's transaction, which already holds the part's row lock
 * (`getPartGrantById` with `lock`): no savepoint, no second lock.
 */
export async function writeMarkingInLockedPart(tx: Tx, o: MarkingWrite): Promise<WriteResult> {
  const current = await currentMarking(tx, o.partId, o.noteKey);
  const matches = current ? current.version === o.expectedVersion : o.expectedVersion === undefined;
  if (!matches) return { ok: false, current: current ? toMarkingDto(current) : null };
  if (!current && o.values === null) return { ok: true, marking: null };
  const next = await applyMarking(tx, { ...o, current });
  // A new change after undo ends the redo chain (a partial index finds the undone rows).
  await tx
    .update(markingHistory)
    .set({ discardedAt: new Date() })
    .where(and(eq(markingHistory.partId, o.partId), isNotNull(markingHistory.undoneAt), isNull(markingHistory.discardedAt)));
  await tx.insert(markingHistory).values({
    partId: o.partId,
    noteKey: o.noteKey,
    actorId: o.actorId,
    action: !current ? "create" : next ? "update" : "delete",
    before: current ? toMarkingDto(current) : null,
    after: next ? toMarkingDto(next) : null,
    groupId: o.groupId,
    proposalId: o.proposalId ?? null,
  });
  await tx.update(parts).set({ updatedAt: new Date() }).where(eq(parts.id, o.partId));
  return { ok: true, marking: next ? toMarkingDto(next) : null };
}

/**
 * The markings a new part brings with it (read back from an Ondula export), written inside the
 * transaction that stores the part, as one history step of the uploader: the part never exists
 * without them. Returns how many were written.
 */
export async function insertImportedMarkings(
  tx: Tx,
  o: { partId: string; actorId: string; groupId: string; markings: ReadonlyArray<{ noteKey: string; values: MarkingValues }> },
): Promise<number> {
  let written = 0;
  for (const { noteKey, values } of o.markings) {
    const next = await applyMarking(tx, { partId: o.partId, noteKey, values, actorId: o.actorId, current: undefined });
    if (!next) continue;
    await tx.insert(markingHistory).values({
      partId: o.partId,
      noteKey,
      actorId: o.actorId,
      action: "create",
      before: null,
      after: toMarkingDto(next),
      groupId: o.groupId,
      proposalId: null,
    });
    written += 1;
  }
  return written;
}

export interface HistoryChange {
  noteKey: string;
  marking: MarkingDto | null;
}

function valuesOf(snapshot: unknown): MarkingValues | null {
  return snapshot ? pickValues(snapshot as MarkingValues) : null;
}

/** Undoes the latest gesture on the part (all changes sharing its group). */
export async function undoLatest({ partId, actorId }: { partId: string; actorId: string }): Promise<HistoryChange[]> {
  return db().transaction(async (tx) => {
    await lockPart(tx, partId);
    const active = and(eq(markingHistory.partId, partId), isNull(markingHistory.undoneAt), isNull(markingHistory.discardedAt));
    const [latest] = await tx.select({ groupId: markingHistory.groupId }).from(markingHistory).where(active).orderBy(desc(markingHistory.id)).limit(1);
    if (!latest) return [];
    const rows = await tx.select().from(markingHistory).where(and(active, eq(markingHistory.groupId, latest.groupId))).orderBy(desc(markingHistory.id));
    const changes: HistoryChange[] = [];
    for (const row of rows) {
      const current = await currentMarking(tx, partId, row.noteKey);
      const next = await applyMarking(tx, { partId, noteKey: row.noteKey, values: valuesOf(row.before), actorId, current });
      changes.push({ noteKey: row.noteKey, marking: next ? toMarkingDto(next) : null });
    }
    await tx.update(markingHistory).set({ undoneAt: new Date() }).where(and(active, eq(markingHistory.groupId, latest.groupId)));
    return changes;
  });
}

/** Redoes the most recently undone gesture, if no new change has happened since. */
export async function redoLatest({ partId, actorId }: { partId: string; actorId: string }): Promise<HistoryChange[]> {
  return db().transaction(async (tx) => {
    await lockPart(tx, partId);
    const undone = and(eq(markingHistory.partId, partId), isNotNull(markingHistory.undoneAt), isNull(markingHistory.discardedAt));
    const [first] = await tx.select({ groupId: markingHistory.groupId }).from(markingHistory).where(undone).orderBy(asc(markingHistory.id)).limit(1);
    if (!first) return [];
    const rows = await tx.select().from(markingHistory).where(and(undone, eq(markingHistory.groupId, first.groupId))).orderBy(asc(markingHistory.id));
    const changes: HistoryChange[] = [];
    for (const row of rows) {
      const current = await currentMarking(tx, partId, row.noteKey);
      const next = await applyMarking(tx, { partId, noteKey: row.noteKey, values: valuesOf(row.after), actorId, current });
      changes.push({ noteKey: row.noteKey, marking: next ? toMarkingDto(next) : null });
    }
    await tx.update(markingHistory).set({ undoneAt: null }).where(and(undone, eq(markingHistory.groupId, first.groupId)));
    return changes;
  });
}

export async function historyStateByPartId({ partId, limit = 50 }: { partId: string; limit?: number }) {
  const [entries, [flags]] = await Promise.all([
    db()
      .select({
        id: markingHistory.id,
        noteKey: markingHistory.noteKey,
        action: markingHistory.action,
        actorName: users.name,
        proposalId: markingHistory.proposalId,
        /** Who proposed the change, when it came from an accepted proposal. */
        proposedByName: proposers.name,
        undone: sql<boolean>`${markingHistory.undoneAt} is not null`,
        createdAt: markingHistory.createdAt,
      })
      .from(markingHistory)
      .innerJoin(users, eq(users.id, markingHistory.actorId))
      .leftJoin(proposals, eq(proposals.id, markingHistory.proposalId))
      .leftJoin(proposers, eq(proposers.id, proposals.authorId))
      .where(and(eq(markingHistory.partId, partId), isNull(markingHistory.discardedAt)))
      .orderBy(desc(markingHistory.id))
      .limit(limit),
    db()
      .select({
        canUndo: sql<boolean>`bool_or(${markingHistory.undoneAt} is null)`,
        canRedo: sql<boolean>`bool_or(${markingHistory.undoneAt} is not null)`,
      })
      .from(markingHistory)
      .where(and(eq(markingHistory.partId, partId), isNull(markingHistory.discardedAt))),
  ]);
  return {
    canUndo: Boolean(flags?.canUndo),
    canRedo: Boolean(flags?.canRedo),
    entries: entries.map((e) => ({ ...e, createdAt: e.createdAt.toISOString() })),
  };
}
