"use client";

import { useEffect, useRef, useState } from "react";
import { sheetNoteKeys } from "./osmd-note-keys";

declare global {
  interface Window {
    /** Set by the development note-keys page: the browser's keys of a partwise text, from the loaded model. */
    __ondulaModelKeys?: (xml: string) => Promise<{ keys: string[] } | { error: string }>;
  }
}

/**
 * Publishes `window.__ondulaModelKeys` once the engraving library is loaded; the wrapper's
 * `data-ready` turns "true" then. One library instance serves every text, one after the other.
 */
export function DevModelKeys() {
  const host = useRef<HTMLDivElement>(null);
  const [ready, setReady] = useState(false);

  useEffect(() => {
    let cancelled = false;
    (async () => {
      // The engraving library touches the DOM when loaded: load it in the browser only.
      const { OpenSheetMusicDisplay } = await import("opensheetmusicdisplay");
      const el = host.current;
      if (cancelled || !el) return;
      const osmd = new OpenSheetMusicDisplay(el, { backend: "svg", autoResize: false, drawTitle: false });
      window.__ondulaModelKeys = async (xml: string) => {
        const before = osmd.Sheet;
        try {
          await osmd.load(xml);
        } catch (err) {
          // The library reads the whole model before it prepares the drawing; a file it cannot
          // draw still has its model read (drawing it is the engraving's concern, not the keys').
          if (!osmd.Sheet || osmd.Sheet === before) return { error: err instanceof Error ? err.message : String(err) };
        }
        return { keys: sheetNoteKeys(osmd.Sheet) };
      };
      setReady(true);
    })();
    return () => {
      cancelled = true;
      delete window.__ondulaModelKeys;
    };
  }, []);

  return (
    <div data-ready={ready ? "true" : "false"}>
      <div ref={host} hidden />
    </div>
  );
}
