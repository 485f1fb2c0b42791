"use client";

import { useEffect, useRef, useState } from "react";
import { sheetNoteKeys } from "./osmd-note-keys";
import { sortNoteKeys } from "@/lib/musicxml/key-order";
import { reconcileNoteKeys } from "@/lib/musicxml/reconcile-keys";

/** The browser's keys of a text; with the server's keys, also the browser's keys mapped onto them. */
export type ModelKeysAnswer = { keys: string[]; mapped?: string[]; unmapped?: string[] } | { error: string };

declare global {
  interface Window {
    /**
     * Set by the development note-keys page: the browser's keys of a partwise text, from the loaded
     * model; given the server's keys, also mapped onto them as the pages map them.
     */
    __ondulaModelKeys?: (xml: string, serverKeys?: string[]) => Promise<ModelKeysAnswer>;
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
      window.__ondulaModelKeys = async (xml: string, serverKeys?: string[]) => {
        const before = osmd.Sheet;
        try {
          await osmd.load(xml);
        } catch (err) {
          // The library reads the whole model before it prepares the drawing; a file it cannot
          // draw still has its model read (drawing it is the engraving's concern, not the keys').
          if (!osmd.Sheet || osmd.Sheet === before) return { error: err instanceof Error ? err.message : String(err) };
        }
        const keys = sheetNoteKeys(osmd.Sheet);
        if (!serverKeys) return { keys };
        const result = reconcileNoteKeys(keys, serverKeys);
        const parts = osmd.Sheet.Instruments.map((instrument) => instrument.IdString);
        return { keys, mapped: sortNoteKeys(result.keys, parts), unmapped: result.unmapped };
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
