"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import { applyServerChanges, toState } from "@/lib/markings/changes";
import type { MarkingDto } from "@/lib/markings/schema";
import { useEditorStoreApi } from "../editor-store";
import { serverVersions, setSaveError } from "./write-state";
import { fetchJson, partUrl, retryDelay, retryTransient } from "@/components/client/fetch-json";
import type { HistoryState } from "./get-history";
import { historyKeys, markingKeys } from "@/components/client/keys";
import { cachedMarkings, writeCachedMarkings } from "./marking-cache";

export interface HistoryStepResult {
  changes: { noteKey: string; marking: MarkingDto | null }[];
  canUndo: boolean;
  canRedo: boolean;
}

export const postHistoryStep = (partId: string, step: "undo" | "redo") =>
  fetchJson<HistoryStepResult>(`${partUrl(partId)}/history/${step}`, { method: "POST" });

/**
 * Undo and redo run on the server's history (so they survive a reload), queued behind the part's
 * pending writes; the notes they change are written into the cached markings.
 */
export function useHistoryStep(partId: string, step: "undo" | "redo") {
  const client = useQueryClient();
  const store = useEditorStoreApi();
  return useMutation({
    mutationKey: [...historyKeys.list(partId), step],
    scope: { id: markingKeys.scope(partId) },
    retry: retryTransient,
    retryDelay,
    mutationFn: () => postHistoryStep(partId, step),
    onSuccess: async (result) => {
      await client.cancelQueries({ queryKey: markingKeys.list(partId) });
      const next = applyServerChanges(toState(cachedMarkings(client, partId)), result.changes);
      writeCachedMarkings(client, partId, Object.values(next));
      const versions = serverVersions(client, partId);
      for (const change of result.changes) versions.set(change.noteKey, change.marking?.version ?? null);
      client.setQueryData<HistoryState>(historyKeys.list(partId), (old) => ({
        entries: old?.entries ?? [],
        canUndo: result.canUndo,
        canRedo: result.canRedo,
      }));
      const first = result.changes[0]?.noteKey;
      if (first) store.getState().actions.reveal(first);
    },
    onError: (error: Error) => setSaveError(client, partId, error.message),
    onSettled: () => client.invalidateQueries({ queryKey: historyKeys.list(partId) }),
  });
}
