"use client";

import { onlineManager, useMutationState, useQueryClient } from "@tanstack/react-query";
import { useSyncExternalStore } from "react";
import { markingKeys } from "@/components/client/keys";
import { useConflicts } from "./write-state";

export type SaveState = "saved" | "saving" | "offline" | "retrying" | "conflict";

/** Derives the save state from the part's pending writes and the connection. */
export function deriveSaveState(input: { pending: number; failing: number; online: boolean; conflicts: number }): SaveState {
  if (input.conflicts > 0) return "conflict";
  if (!input.online) return "offline";
  if (input.failing > 0) return "retrying";
  if (input.pending > 0) return "saving";
  return "saved";
}

const subscribeOnline = (cb: () => void) => onlineManager.subscribe(cb);

/** The part's save state, derived from its write queue, the connection and its open conflicts. */
export function useSaveState(partId: string): SaveState {
  const writes = useMutationState({
    filters: { mutationKey: markingKeys.write(partId), status: "pending" },
    select: (m) => m.state.failureCount,
  });
  const online = useSyncExternalStore(subscribeOnline, () => onlineManager.isOnline(), () => true);
  const conflicts = useConflicts(useQueryClient(), partId).length;
  return deriveSaveState({
    pending: writes.length,
    failing: writes.filter((n) => n > 0).length,
    online,
    conflicts,
  });
}
