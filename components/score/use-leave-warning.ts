"use client";

import { useEffect } from "react";

/**
 * While `unsaved` is true, leaving the page (closing the tab, reloading, following an address)
 * asks the browser to confirm (the `beforeunload` event; the browser writes its own words), so
 * edits still waiting for the server are not lost with the page.
 */
export function useLeaveWarning(unsaved: boolean): void {
  useEffect(() => {
    if (!unsaved) return;
    const warn = (event: BeforeUnloadEvent) => {
      event.preventDefault();
      // Older browsers show the dialog only when returnValue is set.
      event.returnValue = "";
    };
    window.addEventListener("beforeunload", warn);
    return () => window.removeEventListener("beforeunload", warn);
  }, [unsaved]);
}
