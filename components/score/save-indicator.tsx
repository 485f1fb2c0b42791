"use client";

import type { SaveState } from "./api/save-state";

/** Plain words: what happened to the player's edits, and what happens next. */
function sentence(state: SaveState, waiting: number, online: boolean): string {
  switch (state) {
    case "saved":
      return "All changes saved";
    case "saving":
      return "Saving…";
    case "unsaved":
      // The edits are kept in this page and sent again by themselves.
      return `Not saved yet · ${online ? "trying again" : "offline"}${waiting > 0 ? ` · ${waiting === 1 ? "1 change" : `${waiting} changes`}` : ""}`;
    case "offline":
      return "Offline · all changes saved";
    case "conflict":
      return "Someone else changed a note — choose a version";
  }
}

/** Shape and words carry the state; colour is only a second cue. */
const MARK: Record<SaveState, string> = {
  saved: "✓",
  saving: "…",
  unsaved: "↻",
  offline: "⊘",
  conflict: "!",
};

export function SaveIndicator({ state, error, waiting = 0, online = true }: { state: SaveState; error?: string | null; waiting?: number; online?: boolean }) {
  const refused = state === "saved" && Boolean(error);
  const alarming = state === "conflict" || state === "unsaved" || refused;
  const text = refused ? `Not saved: ${error}` : sentence(state, waiting, online);
  return (
    <p
      role="status"
      aria-live="polite"
      data-testid="save-state"
      data-state={state}
      className={`flex items-center gap-1.5 text-sm ${alarming ? "font-semibold text-danger" : "text-graphite"}`}
    >
      <span aria-hidden="true" className="inline-flex h-5 w-5 shrink-0 items-center justify-center rounded-full border border-current text-xs">
        {refused ? "!" : MARK[state]}
      </span>
      <span>{text}</span>
    </p>
  );
}
