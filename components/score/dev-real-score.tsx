"use client";

import { useCallback, useState } from "react";
import { ScoreView, type ScoreLayout } from "./score-view";

declare global {
  interface Window {
    /** Set by the real-corpus engraving page: the note keys the workspace can select. */
    __ondulaRealScore?: { keys: string[] };
  }
}

/**
 * One part of a real file engraved exactly as the workspace engraves it (the same score view,
 * mends and fallbacks), without the workspace around it: the end-to-end check of the real corpus.
 */
export function DevRealScore({ xml, mend = true }: { xml: string; mend?: boolean }) {
  const [notes, setNotes] = useState(0);
  const onLayout = useCallback((layout: ScoreLayout) => {
    window.__ondulaRealScore = { keys: layout.boxes.map((b) => b.key) };
    setNotes(layout.boxes.length);
  }, []);
  return (
    <div data-real-notes={notes}>
      <ScoreView xml={xml} zoom={1} onLayout={onLayout} mend={mend} />
    </div>
  );
}
