"use client";

import { onlineManager, useMutationState, useQueryClient } from "@tanstack/react-query";
import { useSyncExternalStore } from "react";
import { markingKeys } from "@/components/client/keys";
import { useConflicts } from "./write-state";

/**
 * `unsaved`: edits the server has not taken yet because it could not be reached (a failed try, or
 * the browser offline); they are kept and sent again. `offline`: nothing waits, but the browser is
 * offline, so the next edit will wait too.
 */
export type SaveState = "saved" | "saving" | "unsaved" | "offline" | "conflict";

export interface SaveStatus {
  state: SaveState;
  /** Edits not yet saved (sent, waiting to be sent again, or queued behind them). */
  waiting: number;
  online: boolean;
}

/** Derives the save state from the part's pending writes and the connection. */
export function deriveSaveState(input: { pending: number; failing: number; online: boolean; conflicts: number }): SaveState {
  if (input.conflicts > 0) return "conflict";
  if (input.pending > 0 && (input.failing > 0 || !input.online)) return "unsaved";
  if (input.pending > 0) return "saving";
  if (!input.online) return "offline";
  return "saved";
}

const subscribeOnline = (cb: () => void) => onlineManager.subscribe(cb);

/** The part's save state, derived from its write queue, the connection and its open conflicts. */
export function useSaveStatus(partId: string): SaveStatus {
  const writes = useMutationState({
    filters: { mutationKey: markingKeys.write(partId), status: "pending" },
    // A write paused while offline has not failed yet; `online` covers it. (Writes queued behind
    // another in the part's scope are paused too, so `isPaused` alone says nothing.)
    select: (m) => m.state.failureCount > 0,
  });
  const online = useSyncExternalStore(subscribeOnline, () => onlineManager.isOnline(), () => true);
  const conflicts = useConflicts(useQueryClient(), partId).length;
  const state = deriveSaveState({
    pending: writes.length,
    failing: writes.filter(Boolean).length,
    online,
    conflicts,
  });
  return { state, waiting: writes.length, online };
}

export function useSaveState(partId: string): SaveState {
  return useSaveStatus(partId).state;
}
