"use client";

import { useEffect, useState } from "react";

export type WakeState = "on" | "off" | "unsupported";

/**
 * Keeps the screen on while the stand view is shown, where the browser allows (Screen Wake Lock
 * API). The browser drops the lock when the page is hidden, so it is asked for again on return.
 */
export function useWakeLock(): WakeState {
  const [state, setState] = useState<WakeState>("off");
  useEffect(() => {
    if (!("wakeLock" in navigator)) {
      setState("unsupported");
      return;
    }
    let lock: WakeLockSentinel | null = null;
    let live = true;
    const acquire = async () => {
      if (document.visibilityState !== "visible" || (lock && !lock.released)) return;
      try {
        const next = await navigator.wakeLock.request("screen");
        if (!live) {
          void next.release();
          return;
        }
        lock = next;
        setState("on");
        next.addEventListener("release", () => live && setState("off"));
      } catch {
        // Refused (battery saver, no user gesture yet, policy): the view works without it.
        if (live) setState("off");
      }
    };
    void acquire();
    document.addEventListener("visibilitychange", acquire);
    // Some browsers grant the lock only after a gesture: ask again on the first tap.
    document.addEventListener("pointerdown", acquire);
    return () => {
      live = false;
      document.removeEventListener("visibilitychange", acquire);
      document.removeEventListener("pointerdown", acquire);
      if (lock && !lock.released) void lock.release();
    };
  }, []);
  return state;
}
