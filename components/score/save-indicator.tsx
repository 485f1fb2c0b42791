"use client";

import type { SaveState } from "./api/save-state";

const TEXT: Record<SaveState, string> = {
  saved: "All changes saved",
  saving: "Saving…",
  offline: "Offline — changes kept, sent when back online",
  retrying: "Retrying…",
  conflict: "Someone else changed a note — choose a version",
};

/** Shape and words carry the state; colour is only a second cue. */
const MARK: Record<SaveState, string> = {
  saved: "✓",
  saving: "…",
  offline: "⊘",
  retrying: "↻",
  conflict: "!",
};

export function SaveIndicator({ state, error }: { state: SaveState; error?: string | null }) {
  const alarming = state === "conflict" || state === "offline" || (state === "saved" && error);
  return (
    <p
      role="status"
      aria-live="polite"
      data-testid="save-state"
      data-state={state}
      className={`flex items-center gap-1.5 text-sm ${alarming ? "font-semibold text-danger" : "text-graphite"}`}
    >
      <span aria-hidden="true" className="inline-flex h-5 w-5 items-center justify-center rounded-full border border-current text-xs">
        {state === "saved" && error ? "!" : MARK[state]}
      </span>
      <span>{state === "saved" && error ? `Not saved: ${error}` : TEXT[state]}</span>
    </p>
  );
}
