import "server-only";
import { and, desc, eq, sum } from "drizzle-orm";
import type { PracticeEntryDto, PracticeKind, TakeDto } from "@/lib/practice/schema";
import { db } from "./client";
import { practiceEntries, takes } from "./schema";

/** How many entries and takes a list returns, newest first. */
const LIST_LIMIT = 100;

type EntryRow = typeof practiceEntries.$inferSelect;
type TakeRow = typeof takes.$inferSelect;
type Measured = Omit<TakeDto, "id" | "noteKey" | "createdAt">;

const toEntryDto = (r: EntryRow): PracticeEntryDto => ({
  id: r.id,
  kind: r.kind as PracticeKind,
  minutes: r.minutes,
  noteKey: r.noteKey,
  notes: r.notes,
  createdAt: r.createdAt.toISOString(),
});

const toTakeDto = (r: TakeRow): TakeDto => ({ id: r.id, noteKey: r.noteKey ?? "", ...(r.measured as Measured), createdAt: r.createdAt.toISOString() });

/** The owner's practice log of a part, newest first, with the minutes of every entry summed. */
export async function listPracticeEntriesByPartId({ partId, userId }: { partId: string; userId: string }) {
  const where = and(eq(practiceEntries.partId, partId), eq(practiceEntries.userId, userId));
  const [rows, [total]] = await Promise.all([
    db().select().from(practiceEntries).where(where).orderBy(desc(practiceEntries.createdAt)).limit(LIST_LIMIT),
    db().select({ minutes: sum(practiceEntries.minutes).mapWith(Number) }).from(practiceEntries).where(where),
  ]);
  return { entries: rows.map(toEntryDto), totalMinutes: total?.minutes ?? 0 };
}

export async function insertPracticeEntry(values: { partId: string; userId: string; kind: PracticeKind; minutes: number; noteKey: string | null; notes: string }) {
  const [row] = await db().insert(practiceEntries).values(values).returning();
  return toEntryDto(row);
}

export async function listTakesByPartId({ partId, userId, noteKey }: { partId: string; userId: string; noteKey?: string }) {
  const rows = await db()
    .select()
    .from(takes)
    .where(and(eq(takes.partId, partId), eq(takes.userId, userId), noteKey ? eq(takes.noteKey, noteKey) : undefined))
    .orderBy(desc(takes.createdAt))
    .limit(LIST_LIMIT);
  return rows.map(toTakeDto);
}

export async function insertTake(o: { partId: string; userId: string; noteKey: string; measured: Measured }) {
  const [row] = await db().insert(takes).values({ partId: o.partId, userId: o.userId, noteKey: o.noteKey, measured: o.measured }).returning();
  return toTakeDto(row);
}
