"use client";

import { useSyncExternalStore } from "react";
import { localIsoDate } from "@/lib/assignments/due";

const noSubscription = () => () => {};

/**
 * Today in the viewer's own calendar. The server renders with its (UTC) day, and the browser
 * takes over with the local one right after hydration, so a due date turns overdue at the
 * player's midnight, not the server's.
 */
export function useToday(serverToday: string): string {
  return useSyncExternalStore(noSubscription, () => localIsoDate(new Date()), () => serverToday);
}
