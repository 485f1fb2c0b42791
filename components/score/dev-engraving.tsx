"use client";

import { useEffect, useRef, useState } from "react";
import type { NoteBox } from "@/lib/markings/glyph-geometry";
import { measureNoteBoxes, noteBoxesFromModel } from "./measure-note-boxes";
import { collectOsmdNotes, osmdNoteKeys, sheetNoteKeys } from "./osmd-note-keys";

declare global {
  interface Window {
    /** Set by the development engraving page for the end-to-end key comparison. */
    __ondulaKeys?: string[];
    /** The same keys read from the loaded model alone, before any drawing. */
    __ondulaSheetKeys?: string[];
    /** The notes' boxes as the workspace reads them from the model, and as measured from the drawing. */
    __ondulaNoteBoxes?: { model: NoteBox[] | null; drawn: NoteBox[] };
  }
}

type State = "loading" | "ready" | "error";

/**
 * Engraves normalized partwise MusicXML with OpenSheetMusicDisplay and publishes the browser's
 * note keys on `window.__ondulaKeys`; the wrapper's `data-ready` turns "true" once they are there.
 */
export function DevEngraving({ xml }: { xml: string }) {
  const host = useRef<HTMLDivElement>(null);
  const [state, setState] = useState<State>("loading");
  const [error, setError] = useState<string | null>(null);

  useEffect(() => {
    let cancelled = false;
    (async () => {
      try {
        // The engraving library touches the DOM when loaded: load it in the browser only.
        const { OpenSheetMusicDisplay } = await import("opensheetmusicdisplay");
        const el = host.current;
        if (cancelled || !el) return;
        el.replaceChildren();
        const osmd = new OpenSheetMusicDisplay(el, { backend: "svg", autoResize: false, drawTitle: true });
        await osmd.load(xml);
        if (cancelled) return;
        window.__ondulaSheetKeys = sheetNoteKeys(osmd.Sheet);
        osmd.render();
        window.__ondulaKeys = osmdNoteKeys(osmd);
        const refs = collectOsmdNotes(osmd);
        const svg = el.querySelector("svg")!.getBoundingClientRect();
        const origin = el.getBoundingClientRect();
        window.__ondulaNoteBoxes = {
          model: noteBoxesFromModel(refs, { left: svg.left - origin.left, top: svg.top - origin.top }, osmd.Zoom),
          drawn: measureNoteBoxes(refs, el, osmd.Zoom),
        };
        setState("ready");
      } catch (err) {
        if (cancelled) return;
        setError(err instanceof Error ? err.message : String(err));
        setState("error");
      }
    })();
    return () => {
      cancelled = true;
    };
  }, [xml]);

  return (
    <div data-ready={state === "ready" ? "true" : "false"} data-state={state}>
      {state === "loading" && <p className="text-graphite">Engraving…</p>}
      {error && (
        <p role="alert" className="text-ink">
          The score could not be engraved: {error}
        </p>
      )}
      <div ref={host} className="relative bg-white" />
    </div>
  );
}
