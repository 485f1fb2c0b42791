"use client";

import { useId, useState } from "react";

export const FIRST_MARK_HINT = "Click a note to mark it; arrow keys move between notes.";

const SHORTCUTS: [string, string][] = [
  ["Click, or tap", "select a note and open its marking"],
  ["← →", "previous or next note"],
  ["↑ ↓", "previous or next bar"],
  ["Shift + arrows, Shift + click", "extend the selection"],
  ["Ctrl + click", "add or remove a note"],
  ["Enter", "open the marking panel"],
  ["Escape", "clear the selection"],
  ["Delete", "clear the marking"],
  ["Ctrl + C, Ctrl + V", "copy and paste a marking"],
  ["Ctrl + Z, Ctrl + Shift + Z", "undo, redo"],
];

/**
 * The line above the score: until the part's first marking, how to begin; always, the keyboard
 * help (open on demand, so it costs the music no room).
 */
export function WorkspaceHint({ showHint }: { showHint: boolean }) {
  const [open, setOpen] = useState(false);
  const id = useId();
  return (
    <div className="no-print border-b border-rule px-gutter text-sm">
      <div className="flex min-h-11 items-center gap-3">
        {showHint ? (
          <p className="text-ink" data-testid="first-mark-hint">
            {FIRST_MARK_HINT}
          </p>
        ) : null}
        <button
          type="button"
          className="ml-auto h-11 rounded px-2 text-graphite underline-offset-4 hover:bg-paper-deep hover:underline"
          aria-expanded={open}
          aria-controls={id}
          onClick={() => setOpen((v) => !v)}
        >
          Keyboard help
        </button>
      </div>
      {open ? (
        <dl id={id} className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 pb-3" data-testid="keyboard-help">
          {SHORTCUTS.map(([keys, what]) => (
            <div key={keys} className="contents">
              <dt className="font-semibold">{keys}</dt>
              <dd className="text-graphite">{what}</dd>
            </div>
          ))}
        </dl>
      ) : null}
    </div>
  );
}
