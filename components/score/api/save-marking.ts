"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useCallback } from "react";
import {
  applyChanges, diffToRequests, isEmptyDiff, sameValues, toState, valuesOf,
  type MarkingChange, type MarkingDiff,
} from "@/lib/markings/changes";
import type { MarkingDto, MarkingValues } from "@/lib/markings/schema";
import { deleteMarking } from "./delete-marking";
import { ApiError, retryUntilSaved, saveRetryDelay } from "@/components/client/fetch-json";
import { historyKeys, markingKeys } from "@/components/client/keys";
import { cachedMarking, cachedMarkings, writeCachedMarking } from "./marking-cache";
import { putMarking } from "./put-marking";
import { newGroupId } from "./uuid";
import { addConflict, conflictsOf, saveErrorOf, serverVersions, setSaveError, updateConflictMine } from "./write-state";

/** One note's write: its new values, or null to clear it. */
export interface MarkingWrite {
  noteKey: string;
  values: MarkingValues | null;
  group?: string;
}

/** Thrown for a write that waits behind an open conflict on its note (it joins "mine" instead). */
class HeldByConflict extends Error {}

type WriteResult = { noteKey: string; marking: MarkingDto | null };

/**
 * A refused write whose answer says the note already holds what we sent: an earlier try of this
 * same write reached the server but its answer was lost (a retry after a dropped connection).
 */
function alreadyWritten(error: unknown, values: MarkingValues | null): MarkingDto | null | undefined {
  if (!(error instanceof ApiError && error.isConflict)) return undefined;
  const current = (error.current ?? null) as MarkingDto | null;
  if (values === null) return current === null ? null : undefined;
  return current && sameValues(current, values) ? current : undefined;
}

/**
 * The write queue of a part. Writes run one after another (one mutation scope per part, shared
 * with undo and redo) so each request carries the version the previous one got back; the cache
 * is updated optimistically per note and rolled back per note — never by restoring a snapshot of
 * the whole list, which would undo other notes' pending writes.
 *
 * An edit is never dropped for an outage: a write that gets no answer, or a 5xx/429, is sent again
 * (back-off, the server's Retry-After) until it is saved or refused, and while the browser is
 * offline the queue waits and goes on when it is back (TanStack Query's network mode "online").
 * The save indicator says "not saved yet" meanwhile, and leaving the page warns.
 */
export function useSaveMarking(partId: string) {
  const client = useQueryClient();

  return useMutation<WriteResult, Error, MarkingWrite, { previous: MarkingDto | undefined }>({
    mutationKey: markingKeys.write(partId),
    scope: { id: markingKeys.scope(partId) },
    retry: retryUntilSaved,
    retryDelay: saveRetryDelay,
    mutationFn: async ({ noteKey, values, group }) => {
      if (conflictsOf(client, partId).some((c) => c.noteKey === noteKey)) {
        updateConflictMine(client, partId, noteKey, values);
        throw new HeldByConflict();
      }
      const book = serverVersions(client, partId);
      const known = book.has(noteKey) ? book.get(noteKey) : cachedMarking(client, partId, noteKey)?.version;
      const version = known && known > 0 ? known : undefined;
      try {
        if (values) {
          const { marking } = await putMarking(partId, noteKey, { ...valuesOf(values), version, group });
          return { noteKey, marking };
        }
        // Never saved (or already gone on the server): nothing to delete there.
        if (!version) return { noteKey, marking: null };
        await deleteMarking(partId, noteKey, version, group);
        return { noteKey, marking: null };
      } catch (error) {
        const landed = alreadyWritten(error, values);
        if (landed === undefined) throw error;
        return { noteKey, marking: landed };
      }
    },
    onMutate: async ({ noteKey, values }) => {
      await client.cancelQueries({ queryKey: markingKeys.list(partId) });
      const previous = cachedMarking(client, partId, noteKey);
      writeCachedMarking(
        client,
        partId,
        noteKey,
        values
          ? { ...valuesOf(values), noteKey, version: previous?.version ?? 0, authorId: previous?.authorId ?? "", updatedAt: new Date().toISOString() }
          : null,
      );
      return { previous };
    },
    onSuccess: ({ noteKey, marking }) => {
      serverVersions(client, partId).set(noteKey, marking?.version ?? null);
      const shown = cachedMarking(client, partId, noteKey);
      if (!marking) return;
      // A later edit of this note may already be showing: keep its values, take the new version.
      if (!shown || sameValues(shown, marking)) {
        if (shown || !hasPendingWrite(client, partId, noteKey)) writeCachedMarking(client, partId, noteKey, marking);
      } else {
        writeCachedMarking(client, partId, noteKey, { ...shown, version: marking.version, authorId: marking.authorId, updatedAt: marking.updatedAt });
      }
      if (saveErrorOf(client, partId)) setSaveError(client, partId, null);
    },
    onError: (error, { noteKey, values }, context) => {
      if (error instanceof HeldByConflict) {
        const conflict = conflictsOf(client, partId).find((c) => c.noteKey === noteKey);
        writeCachedMarking(client, partId, noteKey, conflict?.current ?? null);
        return;
      }
      if (error instanceof ApiError && error.isConflict) {
        const current = (error.current ?? null) as MarkingDto | null;
        serverVersions(client, partId).set(noteKey, current?.version ?? null);
        writeCachedMarking(client, partId, noteKey, current);
        addConflict(client, partId, { noteKey, mine: values, current });
        return;
      }
      // Refused or never delivered: show what the server has, and say why.
      writeCachedMarking(client, partId, noteKey, context?.previous ?? null);
      setSaveError(client, partId, error.message);
    },
    onSettled: async () => {
      // Refetch only when the last write of the queue settles, so a refetch never paints over
      // writes still in flight (TanStack Query docs, "Optimistic Updates", concurrent mutations).
      if (client.isMutating({ mutationKey: markingKeys.write(partId) }) === 1) {
        serverVersions(client, partId).clear();
        await Promise.all([
          client.invalidateQueries({ queryKey: markingKeys.list(partId) }),
          client.invalidateQueries({ queryKey: historyKeys.list(partId) }),
        ]);
      }
    },
  });
}

function hasPendingWrite(client: ReturnType<typeof useQueryClient>, partId: string, noteKey: string): boolean {
  return client
    .getMutationCache()
    .findAll({ mutationKey: markingKeys.write(partId), status: "pending" })
    .some((m) => (m.state.variables as MarkingWrite | undefined)?.noteKey === noteKey);
}

/**
 * Commits a gesture: folds its changes into the cached markings, then sends one write per changed
 * note, all sharing one group id so the server's history undoes the gesture as one step.
 */
export function useCommitMarkings(partId: string) {
  const client = useQueryClient();
  const { mutate } = useSaveMarking(partId);
  return useCallback(
    (changes: MarkingChange[]): MarkingDiff => {
      const { diff } = applyChanges(toState(cachedMarkings(client, partId)), changes);
      if (isEmptyDiff(diff)) return diff;
      const group = newGroupId();
      for (const request of diffToRequests(diff)) {
        mutate({ noteKey: request.noteKey, values: request.method === "PUT" ? request.body : null, group });
      }
      return diff;
    },
    [client, partId, mutate],
  );
}
