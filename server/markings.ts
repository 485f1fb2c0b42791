import "server-only";
import { randomUUID } from "node:crypto";
import type { CurrentUser } from "@/lib/auth/types";
import { AppError } from "@/lib/errors";
import type { MarkingDto, MarkingValues } from "@/lib/markings/schema";
import { historyStateByPartId, listMarkingsByPartId, redoLatest, undoLatest, writeMarking, type HistoryChange, type WriteResult } from "@/db/markings";
import type { Part } from "@/db/schema";
import { loadPart } from "./parts";

function assertNoteExists(part: Part, noteKey: string) {
  if (!part.noteKeys.includes(noteKey)) {
    throw new AppError("not_found:note", "That note is not in this part. Reload the page: the part may have changed.");
  }
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
  await loadPart(user, partId, "part:view");
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
  const { part } = await loadPart(user, o.partId, "marking:write");
  assertNoteExists(part, o.noteKey);
  const result = await writeMarking({ partId: o.partId, noteKey: o.noteKey, values: o.values, expectedVersion: o.version, actorId: user.id, groupId: o.group ?? randomUUID() });
  return { marking: written(result), created: o.version === undefined };
}

export async function removeMarking(user: CurrentUser, o: { partId: string; noteKey: string; version: number; group: string | undefined }): Promise<{ noteKey: string; deleted: true }> {
  const { part } = await loadPart(user, o.partId, "marking:write");
  assertNoteExists(part, o.noteKey);
  written(await writeMarking({ partId: o.partId, noteKey: o.noteKey, values: null, expectedVersion: o.version, actorId: user.id, groupId: o.group ?? randomUUID() }));
  return { noteKey: o.noteKey, deleted: true };
}

export async function getHistory(user: CurrentUser, partId: string) {
  await loadPart(user, partId, "part:view");
  return historyStateByPartId({ partId });
}

/** Undoes (or redoes) the latest gesture on the part and says what can be undone or redone next. */
export async function stepHistory(user: CurrentUser, partId: string, direction: "undo" | "redo"): Promise<{ changes: HistoryChange[]; canUndo: boolean; canRedo: boolean }> {
  await loadPart(user, partId, "marking:write");
  const changes = await (direction === "undo" ? undoLatest : redoLatest)({ partId, actorId: user.id });
  const { canUndo, canRedo } = await historyStateByPartId({ partId, limit: 1 });
  return { changes, canUndo, canRedo };
}
