"use client";

import { useState, type FormEvent } from "react";
import { PRACTICE_KIND_LABELS, PRACTICE_KINDS, type PracticeKind } from "@/lib/practice/schema";
import { ApiError } from "@/components/client/fetch-json";
import { selectClass, inputClass, fieldClass } from "@/components/ui/styles";
import { useAddPracticeEntry, usePracticeLog } from "./api";
import { Button, fmt, Section } from "./ui";

interface Props {
  partId: string;
  noteKey: string | null;
  noteLabel: string | null;
  labelOf: (key: string) => string;
}

/** The owner's practice log: what was practised, for how long, on which note. */
export function PracticeLog({ partId, noteKey, noteLabel, labelOf }: Props) {
  const log = usePracticeLog(partId);
  const add = useAddPracticeEntry(partId);
  const [kind, setKind] = useState<PracticeKind>("pulse-trainer");
  const [minutes, setMinutes] = useState("10");
  const [aboutNote, setAboutNote] = useState(true);
  const [notes, setNotes] = useState("");
  const canWrite = log.data?.canWrite ?? false;
  const error = add.error instanceof ApiError ? add.error : null;

  const submit = (e: FormEvent) => {
    e.preventDefault();
    add.mutate(
      { kind, minutes: Number(minutes), noteKey: aboutNote && noteKey ? noteKey : null, notes },
      { onSuccess: () => setNotes("") },
    );
  };

  return (
    <Section
      title="Practice log"
      id="practice-log"
      aside={log.data ? <span className="text-sm tabular-nums text-graphite" data-testid="total-minutes">{fmt(log.data.totalMinutes, 0)} minutes in all</span> : null}
    >
      {canWrite ? (
        <form onSubmit={submit} className="mb-4 grid gap-3 sm:grid-cols-[12rem_7rem_1fr]" noValidate>
          <label className="text-sm font-medium">
            What
            <select value={kind} onChange={(e) => setKind(e.target.value as PracticeKind)} className={`mt-1 h-11 ${selectClass}`}>
              {PRACTICE_KINDS.map((k) => (
                <option key={k} value={k}>
                  {PRACTICE_KIND_LABELS[k]}
                </option>
              ))}
            </select>
          </label>
          <label className="text-sm font-medium">
            Minutes
            <input
              type="number"
              inputMode="numeric"
              min={1}
              max={600}
              value={minutes}
              onChange={(e) => setMinutes(e.target.value)}
              aria-invalid={error?.field === "minutes"}
              aria-describedby={error?.field === "minutes" ? "log-error" : undefined}
              className={`mt-1 h-11 tabular-nums ${inputClass}`}
            />
          </label>
          <label className="text-sm font-medium sm:col-span-1">
            Notes
            <textarea
              value={notes}
              onChange={(e) => setNotes(e.target.value)}
              rows={2}
              maxLength={2000}
              placeholder="What went well, what to try next"
              aria-invalid={error?.field === "notes"}
              className={`mt-1 ${fieldClass}`}
            />
          </label>
          <div className="flex flex-wrap items-center gap-4 sm:col-span-3">
            {noteKey ? (
              <label className="flex min-h-11 items-center gap-2 text-sm">
                <input type="checkbox" checked={aboutNote} onChange={(e) => setAboutNote(e.target.checked)} className="h-5 w-5 accent-accent" />
                About {noteLabel}
              </label>
            ) : null}
            <Button type="submit" kind="primary" disabled={add.isPending}>
              Add to the log
            </Button>
            {error ? (
              <span id="log-error" role="alert" className="text-sm font-semibold text-danger">
                {error.message}
              </span>
            ) : null}
          </div>
        </form>
      ) : log.data ? (
        <p className="mb-3 text-sm text-graphite">You are reading this part&apos;s practice log; only its owner adds entries.</p>
      ) : null}

      {log.isPending ? <p className="text-sm text-graphite">Loading the log…</p> : null}
      {log.data && log.data.entries.length === 0 ? <p className="text-sm text-graphite">Nothing logged yet.</p> : null}
      {log.data && log.data.entries.length > 0 ? (
        <ul className="divide-y divide-rule" data-testid="log-entries">
          {log.data.entries.map((e) => (
            <li key={e.id} className="grid gap-x-4 py-2 text-sm sm:grid-cols-[9rem_9rem_5rem_1fr]">
              <span className="text-graphite">{new Date(e.createdAt).toLocaleDateString(undefined, { day: "numeric", month: "short", year: "numeric" })}</span>
              <span className="font-semibold">{PRACTICE_KIND_LABELS[e.kind] ?? e.kind}</span>
              <span className="tabular-nums">{fmt(e.minutes, 0)} min</span>
              <span>
                {e.noteKey ? <span className="text-graphite">{labelOf(e.noteKey)}{e.notes ? " — " : ""}</span> : null}
                {e.notes}
              </span>
            </li>
          ))}
        </ul>
      ) : null}
    </Section>
  );
}
