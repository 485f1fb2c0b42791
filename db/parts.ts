import "server-only";
import { and, asc, desc, eq, getTableColumns, ilike, isNotNull, isNull, or, sql, type SQL } from "drizzle-orm";
import { AppError } from "@/lib/errors";
import type { ListedPart, PartPermission, PartSort } from "@/lib/parts/dto";
import type { IngestedScore } from "@/lib/parts/ingest";

export type { PartPermission };
import type { AnyPgColumn } from "drizzle-orm/pg-core";
import type { MarkingValues } from "@/lib/markings/schema";
import { db, type Executor } from "./client";
import { insertImportedMarkings } from "./markings";
import { markings, parts, shares, users, type NewPart, type Part } from "./schema";


export interface PartAccess {
  part: Part;
  permission: PartPermission;
}

/** The part without its analyses and uploaded bytes (each as large as the text, or larger). */
export type PartText = Omit<Part, "analysis" | "lineAnalysis" | "sourceBytes">;

export interface PartTextAccess {
  part: PartText;
  permission: PartPermission;
}

/** Columns for lists: everything but the stored file and text, which can be megabytes. */
const partSummaryColumns = {
  id: parts.id,
  ownerId: parts.ownerId,
  title: parts.title,
  composer: parts.composer,
  keyLabel: parts.keyLabel,
  tempo: parts.tempo,
  measureCount: parts.measureCount,
  noteCount: parts.noteCount,
  sourceFileName: parts.sourceFileName,
  sourceFormat: parts.sourceFormat,
  readNotices: parts.readNotices,
  sizeBytes: parts.sizeBytes,
  partList: parts.partList,
  chosenPartId: parts.chosenPartId,
  version: parts.version,
  updatedAt: parts.updatedAt,
  createdAt: parts.createdAt,
};

/** The viewer's accepted, unrevoked share of the part in the row, joined beside it. */
const liveShareOf = (viewerId: string) =>
  and(eq(shares.partId, parts.id), eq(shares.userId, viewerId), isNotNull(shares.acceptedAt), isNull(shares.revokedAt));

/** The viewer's permission from a row of a part and its share: owner, the share's, or none. */
function grantOf<P extends { ownerId: string }>(row: { part: P; permission: PartPermission | null } | undefined, viewerId: string): { part: P; permission: PartPermission } | null {
  if (!row) return null;
  if (row.part.ownerId === viewerId) return { part: row.part, permission: "owner" };
  if (row.permission) return { part: row.part, permission: row.permission };
  return null;
}

/**
 * The part and the viewer's permission on it, or null when the viewer may not see it
 * (owner, or an accepted, unrevoked share). Checked on every request: shares end at once.
 */
export async function getPartAccessById({ partId, viewerId }: { partId: string; viewerId: string }): Promise<PartAccess | null> {
  const [row] = await db()
    .select({ part: parts, permission: shares.permission })
    .from(parts)
    .leftJoin(shares, liveShareOf(viewerId))
    .where(eq(parts.id, partId))
    .limit(1);
  return grantOf(row, viewerId);
}

const { analysis: _analysis, lineAnalysis: _lineAnalysis, sourceBytes: _sourceBytes, ...partTextColumns } = getTableColumns(parts);

/**
 * `getPartAccessById` for what draws the part (its text, title, tempo, permission): the analyses
 * and the uploaded bytes, megabytes on a long part, are not read.
 */
export async function getPartTextAccessById({ partId, viewerId }: { partId: string; viewerId: string }): Promise<PartTextAccess | null> {
  const [row] = await db()
    .select({ part: partTextColumns, permission: shares.permission })
    .from(parts)
    .leftJoin(shares, liveShareOf(viewerId))
    .where(eq(parts.id, partId))
    .limit(1);
  return grantOf(row, viewerId);
}

/**
 * The part's note keys and the viewer's permission, for a page that keys its drawn notes: none of
 * the part's large columns (text, file, analyses) are read.
 */
export async function getPartNoteKeysAccessById({ partId, viewerId }: { partId: string; viewerId: string }): Promise<{ part: { id: string; ownerId: string; noteKeys: string[] }; permission: PartPermission } | null> {
  const [row] = await db()
    .select({ part: { id: parts.id, ownerId: parts.ownerId, noteKeys: parts.noteKeys }, permission: shares.permission })
    .from(parts)
    .leftJoin(shares, liveShareOf(viewerId))
    .where(eq(parts.id, partId))
    .limit(1);
  return grantOf(row, viewerId);
}

/** Who may do what on a part, without the part's text, file or analysis. */
export interface PartGrant {
  partId: string;
  ownerId: string;
  permission: PartPermission;
  /** Whether `noteKey` (when asked) is one of the part's markable notes. */
  hasNote: boolean;
}

/**
 * The narrow form of `getPartAccessById` for writes that need only the owner, the viewer's
 * permission and whether a note exists: the part row's large columns (text, file, analysis) are
 * never read. With `lock`, the part row is locked for the caller's transaction (one writer per
 * part keeps versions and the undo chain consistent); only a viewer who may see the part gets
 * a row, so a stranger never holds the lock.
 */
export async function getPartGrantById({ partId, viewerId, noteKey, lock = false, tx }: { partId: string; viewerId: string; noteKey?: string; lock?: boolean; tx?: Executor }): Promise<PartGrant | null> {
  const result = await (tx ?? db()).execute<{ owner_id: string; permission: PartPermission | null; has_note: boolean }>(sql`
    select ${parts.ownerId} as owner_id, ${shares.permission} as permission,
      ${noteKey === undefined ? sql`false` : sql`${noteKey}::text = any(${parts.noteKeys})`} as has_note
    from ${parts}
    left join ${shares} on ${shares.partId} = ${parts.id} and ${shares.userId} = ${viewerId}
      and ${shares.acceptedAt} is not null and ${shares.revokedAt} is null
    where ${parts.id} = ${partId} and (${parts.ownerId} = ${viewerId} or ${shares.userId} is not null)
    ${lock ? sql`for update of ${parts}` : sql``}`);
  const row = result.rows[0];
  if (!row) return null;
  return { partId, ownerId: row.owner_id, permission: row.owner_id === viewerId ? "owner" : (row.permission as PartPermission), hasNote: row.has_note };
}

/** The stored text and chosen part, to name a part's bars in a message sent outside any request for it. */
export async function getPartTextById({ partId }: { partId: string }): Promise<{ musicxml: string; chosenPartId: string } | null> {
  const [row] = await db().select({ musicxml: parts.musicxml, chosenPartId: parts.chosenPartId }).from(parts).where(eq(parts.id, partId)).limit(1);
  return row ?? null;
}

/** The row of a new part, from a read and analysed file. */
export function newPartValues(o: { ownerId: string; fileName: string; bytes: Uint8Array; ingested: IngestedScore }): NewPart {
  const { ingested } = o;
  return {
    ownerId: o.ownerId,
    title: ingested.title,
    composer: ingested.composer,
    sourceFileName: o.fileName.slice(0, 255),
    sourceFormat: ingested.format,
    sourceBytes: Buffer.from(o.bytes),
    sizeBytes: o.bytes.byteLength,
    musicxml: ingested.partwiseXml,
    partList: ingested.partList,
    chosenPartId: ingested.chosenPartId,
    analysis: ingested.analysis,
    analysisVersion: ingested.analysisVersion,
    readNotices: ingested.notices,
    ...ingested.summary,
  };
}

export interface Quota {
  maxParts: number;
  maxBytes: number;
}

/**
 * Stores a new part. The owner's row is locked for the transaction so two uploads at once
 * cannot both slip under the quota.
 */
export async function insertPart({
  values,
  quota,
  withMarkings = [],
  groupId,
}: {
  values: NewPart;
  quota: Quota;
  /** Markings the file brought (an Ondula export), written in the same transaction. */
  withMarkings?: ReadonlyArray<{ noteKey: string; values: MarkingValues }>;
  /** History group of those markings (one undo takes them all back). */
  groupId?: string;
}): Promise<{ part: Part; importedMarkings: number }> {
  return db().transaction(async (tx) => {
    await tx.execute(sql`select id from ${users} where ${users.id} = ${values.ownerId} for update`);
    const [usage] = await tx
      .select({ count: sql<number>`count(*)::int`, bytes: sql<number>`coalesce(sum(${parts.sizeBytes}), 0)::bigint` })
      .from(parts)
      .where(eq(parts.ownerId, values.ownerId));
    if (usage.count >= quota.maxParts) {
      throw new AppError("quota:parts", `You have reached the limit of ${quota.maxParts} parts. Delete parts you no longer need to upload more.`);
    }
    if (Number(usage.bytes) + values.sizeBytes > quota.maxBytes) {
      const mb = (quota.maxBytes / 1024 / 1024).toFixed(0);
      throw new AppError("quota:bytes", `This upload would take your files past the ${mb} MB you can store. Delete parts you no longer need to make room.`);
    }
    const [row] = await tx.insert(parts).values(values).returning();
    const importedMarkings = withMarkings.length
      ? await insertImportedMarkings(tx, { partId: row.id, actorId: values.ownerId, groupId: groupId ?? crypto.randomUUID(), markings: withMarkings })
      : 0;
    return { part: row, importedMarkings };
  });
}


/** The parts a viewer owns or has been shared, searched, sorted and paged in the database. */
export async function listPartsForViewer({
  viewerId,
  query,
  sort,
  page,
  pageSize,
}: {
  viewerId: string;
  query: string;
  sort: PartSort;
  page: number;
  pageSize: number;
}): Promise<{ items: ListedPart[]; total: number }> {
  const markingCount = sql<number>`(select count(*)::int from ${markings} where ${markings.partId} = ${parts.id})`;
  // Who a part is shared with (pending invitations included) is the owner's to see, not the invitees'.
  const sharedWith = sql<string[]>`case when ${parts.ownerId} = ${viewerId} then coalesce((select array_agg(${shares.email} order by ${shares.email}) from ${shares} where ${shares.partId} = ${parts.id} and ${shares.revokedAt} is null), '{}') else '{}' end`;
  const viewerShare = sql<string | null>`(select ${shares.permission}::text from ${shares} where ${shares.partId} = ${parts.id} and ${shares.userId} = ${viewerId} and ${shares.acceptedAt} is not null and ${shares.revokedAt} is null limit 1)`;

  const visible = or(eq(parts.ownerId, viewerId), sql`${viewerShare} is not null`);
  const q = query.trim();
  const pattern = `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
  const where: SQL | undefined = q ? and(visible, or(ilike(parts.title, pattern), ilike(parts.composer, pattern))) : visible;

  const sortColumns: Record<string, SQL | AnyPgColumn> = {
    title: sql`lower(${parts.title})`,
    composer: sql`lower(${parts.composer})`,
    key: parts.keyLabel,
    bars: parts.measureCount,
    markings: markingCount,
    updated: parts.updatedAt,
  };
  const descending = sort.startsWith("-");
  const column = sortColumns[sort.replace(/^-/, "")] ?? parts.updatedAt;
  const order = descending ? desc(column) : asc(column);

  const [rows, [{ total }]] = await Promise.all([
    db()
      .select({
        ...partSummaryColumns,
        ownerName: users.name,
        markingCount,
        sharedWith,
        viewerShare,
      })
      .from(parts)
      .innerJoin(users, eq(users.id, parts.ownerId))
      .where(where)
      .orderBy(order, desc(parts.updatedAt), asc(parts.id))
      .limit(pageSize)
      .offset((page - 1) * pageSize),
    db().select({ total: sql<number>`count(*)::int` }).from(parts).where(where),
  ]);

  return {
    total,
    items: rows.map((r) => ({
      id: r.id,
      title: r.title,
      composer: r.composer,
      keyLabel: r.keyLabel,
      measureCount: r.measureCount,
      noteCount: r.noteCount,
      markingCount: r.markingCount,
      sharedWith: r.sharedWith,
      ownerName: r.ownerName,
      isOwner: r.ownerId === viewerId,
      permission: r.ownerId === viewerId ? "owner" : ((r.viewerShare as PartPermission | null) ?? "comment"),
      sourceFileName: r.sourceFileName,
      notices: r.readNotices,
      updatedAt: r.updatedAt.toISOString(),
    })),
  };
}

/** Updates title, composer or chosen part; `version` guards against a concurrent edit. */
export async function updatePartById({
  partId,
  changes,
  expectedVersion,
}: {
  partId: string;
  changes: Partial<Pick<Part, "title" | "composer" | "chosenPartId" | "noteKeys" | "keyLabel" | "tempo" | "workingTempo" | "measureCount" | "noteCount" | "line">>;
  expectedVersion?: number;
}): Promise<Part> {
  const where = expectedVersion === undefined ? eq(parts.id, partId) : and(eq(parts.id, partId), eq(parts.version, expectedVersion));
  const [row] = await db()
    .update(parts)
    .set({ ...changes, version: sql`${parts.version} + 1`, updatedAt: new Date() })
    .where(where)
    .returning();
  if (!row) {
    throw new AppError("conflict:part", "This part was changed in another window. Reload to see the latest version, then try again.");
  }
  return row;
}

export async function storeAnalysisById({ partId, analysis, analysisVersion }: { partId: string; analysis: unknown; analysisVersion: number }) {
  await db().update(parts).set({ analysis, analysisVersion }).where(eq(parts.id, partId));
}

/** Keeps the chosen part's analysis on the lower line, under the key it was made for. */
export async function storeLineAnalysisById({ partId, key, analysis }: { partId: string; key: string; analysis: unknown }) {
  await db().update(parts).set({ lineAnalysis: { key, analysis } }).where(eq(parts.id, partId));
}

/** Deleting a part removes its markings, history, comments, proposals and invitations (cascade). */
export async function deletePartById({ partId }: { partId: string }): Promise<void> {
  await db().delete(parts).where(eq(parts.id, partId));
}

