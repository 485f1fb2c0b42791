"use client";

import { useQueryClient } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useId, useState } from "react";
import { formatNumber } from "@/lib/markings/pulses";
import { fetchJson } from "@/components/client/fetch-json";
import { partKeys } from "@/components/client/keys";

/**
 * The part's working tempo, shown where the part is named: the player's own, else the part's
 * written tempo. When the part gives none, it asks once; the owner can change it any time.
 * Practice, playback, MIDI and pulses per beat all follow it.
 */
export function WorkingTempo({
  partId,
  tempo,
  writtenTempo,
  canEdit,
  onSaved,
}: {
  partId: string;
  tempo: number | null;
  writtenTempo: number | null;
  canEdit: boolean;
  /** After a change is stored (a server-rendered page refreshes itself). */
  onSaved?: () => void;
}) {
  const [editing, setEditing] = useState(false);
  const [value, setValue] = useState(tempo ? String(tempo) : "");
  const [error, setError] = useState<string | null>(null);
  const [saving, setSaving] = useState(false);
  const queryClient = useQueryClient();
  const id = useId();

  const save = async (next: number | null) => {
    setSaving(true);
    setError(null);
    try {
      await fetchJson(`/api/parts/${partId}`, { method: "PATCH", headers: { "content-type": "application/json" }, body: JSON.stringify({ workingTempo: next }) });
      await queryClient.invalidateQueries({ queryKey: partKeys.detail(partId), exact: true });
      onSaved?.();
      setEditing(false);
    } catch (e) {
      setError(e instanceof Error ? e.message : String(e));
    } finally {
      setSaving(false);
    }
  };

  const asking = canEdit && (editing || tempo === null);
  if (!asking) {
    return (
      <span className="inline-flex items-center gap-1" data-testid="working-tempo">
        {tempo ? `♩ = ${formatNumber(tempo, 1)}` : "no tempo"}
        {canEdit ? (
          <button type="button" className="inline-flex h-6 min-w-6 items-center rounded px-1 text-accent-strong underline underline-offset-2" onClick={() => setEditing(true)} aria-label="change the working tempo">
            change
          </button>
        ) : null}
      </span>
    );
  }
  return (
    <form
      className="inline-flex flex-wrap items-center gap-2"
      data-testid="working-tempo"
      onSubmit={(e) => {
        e.preventDefault();
        const n = Number(value.replace(",", "."));
        if (!Number.isFinite(n) || n < 20 || n > 300) {
          setError("Enter a tempo from 20 to 300 beats (♩) per minute.");
          return;
        }
        void save(n);
      }}
    >
      <label htmlFor={id} className="text-ink">
        {tempo === null ? "This part gives no tempo. Working tempo: ♩ =" : "Working tempo: ♩ ="}
      </label>
      <input id={id} inputMode="decimal" value={value} onChange={(e) => setValue(e.target.value)} className="h-9 w-16 rounded border border-ink/30 bg-paper-card px-2 tabular-nums" aria-describedby={error ? `${id}-error` : undefined} />
      <button type="submit" disabled={saving} className="h-9 rounded bg-ink px-3 font-semibold text-paper disabled:opacity-60">
        Save
      </button>
      {tempo !== null ? (
        <button type="button" className="h-9 rounded px-2 text-graphite" onClick={() => setEditing(false)}>
          Cancel
        </button>
      ) : null}
      {writtenTempo && tempo !== writtenTempo ? (
        <button type="button" className="h-9 rounded px-2 text-accent-strong underline" onClick={() => void save(null)}>
          Back to the part’s ♩ = {formatNumber(writtenTempo, 1)}
        </button>
      ) : null}
      {error ? (
        <span id={`${id}-error`} role="alert" className="text-danger">
          {error}
        </span>
      ) : null}
    </form>
  );
}

/** The practice page's question for a part without a tempo; the page is drawn again once answered. */
export function PracticeTempoPrompt({ partId }: { partId: string }) {
  const router = useRouter();
  return <WorkingTempo partId={partId} tempo={null} writtenTempo={null} canEdit onSaved={() => router.refresh()} />;
}
