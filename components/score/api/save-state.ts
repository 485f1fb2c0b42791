"use client";

import { onlineManager, useMutationState } from "@tanstack/react-query";
import { useEffect, useSyncExternalStore } from "react";
import { useEditorStore, type SaveState } from "../editor-store";
import { markingKeys } from "@/components/client/keys";

/** Derives the save state from the part's pending writes and the connection. */
export function deriveSaveState(input: { pending: number; failing: number; online: boolean; conflicts: number }): SaveState {
  if (input.conflicts > 0) return "conflict";
  if (!input.online) return "offline";
  if (input.failing > 0) return "retrying";
  if (input.pending > 0) return "saving";
  return "saved";
}

const subscribeOnline = (cb: () => void) => onlineManager.subscribe(cb);

/** Keeps the editor store's save state in step with the write queue. */
export function useSaveStateSync(partId: string): void {
  const writes = useMutationState({
    filters: { mutationKey: markingKeys.write(partId), status: "pending" },
    select: (m) => m.state.failureCount,
  });
  const online = useSyncExternalStore(subscribeOnline, () => onlineManager.isOnline(), () => true);
  const conflicts = useEditorStore((s) => s.conflicts.length);
  const setSaveState = useEditorStore((s) => s.actions.setSaveState);
  const state = deriveSaveState({
    pending: writes.length,
    failing: writes.filter((n) => n > 0).length,
    online,
    conflicts,
  });
  useEffect(() => setSaveState(state), [state, setSaveState]);
}
