import "server-only";
import { randomUUID } from "node:crypto";
import type { CurrentUser } from "@/lib/auth/types";
import { AppError } from "@/lib/errors";
import type { MarkingDto, MarkingValues } from "@/lib/markings/schema";
import { assertCan, type Action } from "@/lib/auth/policy";
import { transaction, type Tx } from "@/db/client";
import { historyStateByPartId, listMarkingsByPartId, redoLatest, undoLatest, writeMarkingInLockedPart, type HistoryChange, type WriteResult } from "@/db/markings";
import { getPartGrantById, type PartGrant } from "@/db/parts";
import { PART_NOT_FOUND } from "./parts";

/**
 * The part as far as a marking request needs it (owner, the viewer's permission, whether the note
 * exists), asked of the policy. A save never reads the part's text, file or analysis: under a
 * crowd, loading those with every save was most of its cost.
 */
async function grantFor(user: CurrentUser, partId: string, action: Action, o: { noteKey?: string; tx?: Tx; lock?: boolean } = {}): Promise<PartGrant> {
  const grant = await getPartGrantById({ partId, viewerId: user.id, noteKey: o.noteKey, lock: o.lock, tx: o.tx });
  if (!grant) throw new AppError("not_found:part", PART_NOT_FOUND);
  assertCan(user, action, {
    type: "part",
    part: { id: grant.partId, ownerId: grant.ownerId },
    share: grant.permission === "owner" ? null : { permission: grant.permission },
  });
  if (o.noteKey !== undefined && !grant.hasNote) {
    throw new AppError("not_found:note", "That note is not in this part. Reload the page: the part may have changed.");
  }
  return grant;
}

/** Checks access, locks the part and writes, all in one transaction. */
function writeChecked(user: CurrentUser, o: { partId: string; noteKey: string; values: MarkingValues | null; version: number | undefined; group: string | undefined }): Promise<WriteResult> {
  return transaction(async (tx) => {
    await grantFor(user, o.partId, "marking:write", { noteKey: o.noteKey, tx, lock: true });
    return writeMarkingInLockedPart(tx, { partId: o.partId, noteKey: o.noteKey, values: o.values, expectedVersion: o.version, actorId: user.id, groupId: o.group ?? randomUUID() });
  });
}

/** A write made against an older version: nothing changes, and the marking as it is now goes back. */
export function markingConflict(current: MarkingDto | null): AppError {
  return new AppError("conflict:marking", "This note's marking was changed elsewhere since you opened it. Choose which version to keep.", { state: { current } });
}

function written(result: WriteResult): MarkingDto | null {
  if (!result.ok) throw markingConflict(result.current);
  return result.marking;
}

export async function listMarkings(user: CurrentUser, partId: string): Promise<{ markings: MarkingDto[] }> {
  await grantFor(user, partId, "part:view");
  return { markings: await listMarkingsByPartId({ partId }) };
}

/**
 * Writes a note's marking if the caller edited the current version (`version` undefined: there
 * was none). `created` says whether the note had no marking before.
 */
export async function saveMarking(
  user: CurrentUser,
  o: { partId: string; noteKey: string; values: MarkingValues; version: number | undefined; group: string | undefined },
): Promise<{ marking: MarkingDto | null; created: boolean }> {
  const result = await writeChecked(user, o);
  return { marking: written(result), created: o.version === undefined };
}

export async function removeMarking(user: CurrentUser, o: { partId: string; noteKey: string; version: number; group: string | undefined }): Promise<{ noteKey: string; deleted: true }> {
  written(await writeChecked(user, { ...o, values: null }));
  return { noteKey: o.noteKey, deleted: true };
}

export async function getHistory(user: CurrentUser, partId: string) {
  await grantFor(user, partId, "part:view");
  return historyStateByPartId({ partId });
}

/** Undoes (or redoes) the latest gesture on the part and says what can be undone or redone next. */
export async function stepHistory(user: CurrentUser, partId: string, direction: "undo" | "redo"): Promise<{ changes: HistoryChange[]; canUndo: boolean; canRedo: boolean }> {
  await grantFor(user, partId, "marking:write");
  const changes = await (direction === "undo" ? undoLatest : redoLatest)({ partId, actorId: user.id });
  const { canUndo, canRedo } = await historyStateByPartId({ partId, limit: 1 });
  return { changes, canUndo, canRedo };
}
