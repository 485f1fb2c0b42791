"use client";

import { VALUE_WORDS, centsText, onsetAndShape } from "@/lib/markings/labels";
import { useEffect, useRef } from "react";
import type { MarkingDto, MarkingValues } from "@/lib/markings/schema";
import { formatNumber } from "@/lib/markings/pulses";
import { ROLE_INFO } from "@/lib/markings/roles";
import type { Conflict } from "./api/write-state";

export interface ConflictPromptProps {
  conflicts: Conflict[];
  labelOf: (noteKey: string) => string;
  onKeepMine: (conflict: Conflict) => void;
  onTakeTheirs: (conflict: Conflict) => void;
}

function Version({ title, values, note }: { title: string; values: MarkingValues | MarkingDto | null; note?: string }) {
  return (
    <div className="flex-1 rounded-card border border-rule bg-paper-card p-3">
      <h3 className="font-sans text-sm font-semibold">{title}</h3>
      {note ? <p className="text-xs text-graphite">{note}</p> : null}
      {values ? (
        <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-3 gap-y-0.5 text-sm">
          <dt className="text-graphite">Depth</dt>
          <dd>{centsText(formatNumber(values.depthCents, 1))}</dd>
          <dt className="text-graphite">Speed</dt>
          <dd>{formatNumber(values.speedHz, 2)} Hz</dd>
          <dt className="text-graphite">Placement</dt>
          <dd>{VALUE_WORDS.placement[values.placement]}</dd>
          <dt className="text-graphite">Onset, shape</dt>
          <dd>
            {onsetAndShape(values)}
          </dd>
          <dt className="text-graphite">Role</dt>
          <dd>{values.role ? ROLE_INFO[values.role].label : "none"}</dd>
          {values.comment ? (
            <>
              <dt className="text-graphite">Comment</dt>
              <dd className="break-words">{values.comment}</dd>
            </>
          ) : null}
        </dl>
      ) : (
        <p className="mt-2 text-sm">No marking (cleared).</p>
      )}
    </div>
  );
}

/** Shows both versions of a note that changed under the player, and lets them choose. */
export function ConflictPrompt({ conflicts, labelOf, onKeepMine, onTakeTheirs }: ConflictPromptProps) {
  const ref = useRef<HTMLDialogElement>(null);
  const conflict = conflicts[0];
  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (conflict && !dialog.open) {
      if (typeof dialog.showModal === "function") dialog.showModal();
      else dialog.setAttribute("open", "");
    }
    if (!conflict && dialog.open) dialog.close?.();
  }, [conflict]);
  return (
    <dialog
      ref={ref}
      aria-labelledby="conflict-title"
      className="w-[min(40rem,calc(100vw-2rem))] rounded-card border border-ink bg-paper p-5 text-ink backdrop:bg-ink/40"
      onCancel={(e) => e.preventDefault()}
      data-testid="conflict-prompt"
    >
      {conflict ? (
        <div className="space-y-4">
          <h2 id="conflict-title" className="text-xl font-semibold">
            {labelOf(conflict.noteKey)} was changed elsewhere
          </h2>
          <p className="text-sm">
            This note’s marking changed (in another tab or by someone else) after you opened it. Nothing has been overwritten:
            choose which version to keep.
            {conflicts.length > 1 ? ` ${conflicts.length - 1} more note${conflicts.length > 2 ? "s" : ""} after this one.` : ""}
          </p>
          <div className="flex flex-col gap-3 sm:flex-row">
            <Version title="Mine" values={conflict.mine} note="What you just set" />
            <Version title="Current" values={conflict.current} note="What is saved now" />
          </div>
          <div className="flex flex-wrap justify-end gap-2">
            <button type="button" className="h-11 rounded border border-ink px-4 font-semibold" onClick={() => onTakeTheirs(conflict)}>
              Take current
            </button>
            <button type="button" className="h-11 rounded bg-ink px-4 font-semibold text-paper" onClick={() => onKeepMine(conflict)}>
              Keep mine
            </button>
          </div>
        </div>
      ) : null}
    </dialog>
  );
}
