"use client";

import { useMemo, useState } from "react";
import type { PhraseResult, Role, Suggestion } from "@/lib/analysis/types";
import { ROLE_INFO, ROLE_ORDER } from "@/lib/markings/roles";
import { confidenceLabel, groupByRole, rankSuggestions } from "@/lib/markings/suggestions";
import { RoleIcon } from "./role-icon";

export interface SuggestionsPanelProps {
  /** Suggestions still waiting for a decision (see pendingSuggestions). */
  pending: Suggestion[];
  /** How many were decided (accepted or dismissed) already. */
  decidedCount: number;
  labelOf: (noteKey: string) => string;
  canEdit: boolean;
  onAccept: (items: { noteKey: string; role: Role }[]) => void;
  onDismiss: (item: { noteKey: string; role: Role }) => void;
  onShow: (noteKey: string) => void;
  /** Accepts it and opens the marking panel on its note, to change depth, speed or role. */
  onEdit?: (item: { noteKey: string; role: Role }) => void;
  /** The analysis' phrases and note order: on a long part the strongest of each phrase come first. */
  phrases?: readonly PhraseResult[];
  noteOrder?: readonly string[];
  /** The analysis itself: still coming, failed, or here (the default). */
  status?: "loading" | "error" | "ready";
  errorMessage?: string;
  onRetry?: () => void;
}

/** What the two confidence words mean, said where they appear. */
export const CONFIDENCE_EXPLAINED =
  "“Suggested” (50 % or more): the key and the melody point clearly to this role. “Possible” (below 50 %): one reading among others — listen and decide.";

/** The analysis' suggestions by role, each with its reason, to accept, dismiss or look at. */
export function SuggestionsPanel({ pending, decidedCount, labelOf, canEdit, onAccept, onDismiss, onShow, onEdit, phrases = [], noteOrder = [], status = "ready", errorMessage, onRetry }: SuggestionsPanelProps) {
  const [showAll, setShowAll] = useState(false);
  const { top, rest } = useMemo(() => rankSuggestions(pending, phrases, noteOrder), [pending, phrases, noteOrder]);
  const groups = groupByRole(showAll ? pending : top, ROLE_ORDER);
  if (status !== "ready") {
    return (
      <section aria-label="Suggestions" className="space-y-3" data-testid="suggestions-panel" data-status={status}>
        <h2 className="text-lg font-semibold">Suggestions</h2>
        {status === "loading" ? (
          <p className="text-sm text-graphite" role="status">
            Reading the key and the melody…
          </p>
        ) : (
          <div role="alert" className="space-y-2 text-sm">
            <p className="text-danger">The suggestions could not be made just now. Your markings are not affected.</p>
            {errorMessage ? (
              <details>
                <summary className="cursor-pointer text-graphite">Details</summary>
                <p className="mt-1 text-graphite">{errorMessage}</p>
              </details>
            ) : null}
            {onRetry ? (
              <button type="button" onClick={onRetry} className="h-11 rounded border border-ink/30 px-3 font-medium hover:bg-paper-deep">
                Try again
              </button>
            ) : null}
          </div>
        )}
      </section>
    );
  }
  return (
    <section aria-label="Suggestions" className="space-y-5" data-testid="suggestions-panel">
      <header>
        <h2 className="text-lg font-semibold">Suggestions</h2>
        <p className="text-sm text-graphite">
          {pending.length === 0
            ? "Nothing waiting for a decision."
            : `${pending.length} waiting; outlined dashed on the score until you decide.`}
          {decidedCount > 0 ? ` ${decidedCount} decided.` : ""}
        </p>
        {rest.length > 0 ? (
          <div className="mt-2 flex flex-wrap items-center gap-2 text-sm" data-testid="suggestions-ranking">
            <span>
              {showAll
                ? `Showing all ${pending.length}.`
                : `Showing the ${top.length} strongest: the strongest of each kind in each phrase. ${rest.length} more.`}
            </span>
            <button
              type="button"
              className="h-11 rounded px-2 font-medium text-accent-strong underline-offset-2 hover:underline"
              aria-expanded={showAll}
              onClick={() => setShowAll((v) => !v)}
            >
              {showAll ? `Show the ${top.length} strongest only` : `Show all ${pending.length}`}
            </button>
          </div>
        ) : null}
        {pending.length > 0 ? (
          <p className="mt-1 text-xs text-graphite" data-testid="confidence-explained">
            {CONFIDENCE_EXPLAINED}
          </p>
        ) : null}
      </header>
      {groups.map(({ role, items }) => (
        <section key={role} aria-labelledby={`sg-${role}`} className="space-y-2">
          <div className="flex items-center justify-between gap-2">
            <h3 id={`sg-${role}`} className="flex items-center gap-2 font-sans text-base font-semibold">
              <RoleIcon role={role} hollow size={16} />
              {ROLE_INFO[role].label} <span className="font-normal text-graphite">({items.length})</span>
            </h3>
            {canEdit && items.length > 1 ? (
              <button
                type="button"
                className="h-11 rounded px-2 text-sm font-medium text-accent-strong underline-offset-2 hover:underline"
                onClick={() => onAccept(items.map((s) => ({ noteKey: s.note, role: s.role })))}
              >
                Accept all {items.length}
              </button>
            ) : null}
          </div>
          <ul className="space-y-2">
            {items.map((s) => {
              const kind = confidenceLabel(s.confidence);
              return (
                <li key={`${s.note}|${s.role}`} className="rounded-card border border-rule bg-paper-card p-3" data-suggestion={s.note} data-role={s.role}>
                  <div className="flex items-baseline justify-between gap-2">
                    <span className="font-semibold">{labelOf(s.note)}</span>
                    <span className={`text-xs ${kind === "suggested" ? "font-semibold" : "italic text-graphite"}`}>
                      {kind} · {Math.round(s.confidence * 100)}%
                    </span>
                  </div>
                  <p className="mt-1 text-sm">{s.reason}</p>
                  {s.resolvesTo ? <p className="mt-1 text-xs text-graphite">Resolves to {labelOf(s.resolvesTo)}.</p> : null}
                  <div className="mt-2 flex flex-wrap gap-2">
                    {canEdit ? (
                      <>
                        <button
                          type="button"
                          onClick={() => onAccept([{ noteKey: s.note, role: s.role }])}
                          className="h-11 rounded bg-ink px-3 text-sm font-semibold text-paper hover:bg-ink-soft"
                          aria-label={`Accept ${ROLE_INFO[s.role].label.toLowerCase()} at ${labelOf(s.note)}`}
                        >
                          Accept
                        </button>
                        {onEdit ? (
                          <button
                            type="button"
                            onClick={() => onEdit({ noteKey: s.note, role: s.role })}
                            className="h-11 rounded border border-ink/40 px-3 text-sm font-semibold hover:bg-paper-deep"
                            aria-label={`Accept and edit ${ROLE_INFO[s.role].label.toLowerCase()} at ${labelOf(s.note)}`}
                          >
                            Accept and edit
                          </button>
                        ) : null}
                        <button
                          type="button"
                          onClick={() => onDismiss({ noteKey: s.note, role: s.role })}
                          className="h-11 rounded border border-rule px-3 text-sm hover:border-graphite"
                          aria-label={`Dismiss ${ROLE_INFO[s.role].label.toLowerCase()} at ${labelOf(s.note)}`}
                        >
                          Dismiss
                        </button>
                      </>
                    ) : null}
                    <button
                      type="button"
                      onClick={() => onShow(s.note)}
                      className="h-11 rounded px-3 text-sm text-accent-strong underline-offset-2 hover:underline"
                      aria-label={`Show me ${labelOf(s.note)}`}
                    >
                      Show me
                    </button>
                  </div>
                </li>
              );
            })}
          </ul>
        </section>
      ))}
    </section>
  );
}
