"use client";

import { useId, useState, type FormEvent } from "react";
import { ASSIGNMENT_DRILLS, DRILL_LABELS, INSTRUCTIONS_MAX_LENGTH, MINUTES_PER_DAY_MAX, type AssignmentDrill, type AssignmentDto } from "@/lib/assignments/schema";
import { ApiError } from "@/components/client/fetch-json";
import { fieldClass, inputClass, selectClass } from "@/components/ui/styles";
import { conflictCurrent, useCreateAssignment, useUpdateAssignment } from "./api";

export interface NoteOption {
  key: string;
  /** "Bar 3 · A5" */
  label: string;
}

interface Props {
  partId: string;
  /** The note the practice may be set on (the chosen or selected one); none for the whole part. */
  note: NoteOption | null;
  /** Editing this practice; absent to set new practice. */
  initial?: AssignmentDto;
  /** Today in the teacher's calendar, the earliest due date offered. */
  today: string;
  onDone?: (saved: AssignmentDto) => void;
  onCancel?: () => void;
  /** The practice was changed elsewhere; it is shown as it is now. */
  onConflict?: (current: AssignmentDto | null) => void;
}

/** Setting practice: a drill, optionally on one note, with instructions, minutes a day and a due date. */
export function AssignmentForm({ partId, note, initial, today, onDone, onCancel, onConflict }: Props) {
  const id = useId();
  const create = useCreateAssignment(partId);
  const update = useUpdateAssignment(partId);
  const mutation = initial ? update : create;
  const [drill, setDrill] = useState<AssignmentDrill>(initial?.drill ?? "pulse-trainer");
  const [onNote, setOnNote] = useState(initial ? initial.noteKey !== null : note !== null);
  const [instructions, setInstructions] = useState(initial?.instructions ?? "");
  const [minutes, setMinutes] = useState(initial?.minutesPerDay ? String(initial.minutesPerDay) : "");
  const [dueOn, setDueOn] = useState(initial?.dueOn ?? "");
  const error = mutation.error instanceof ApiError && !mutation.error.isConflict ? mutation.error : null;
  const invalid = (field: string) => error?.field === field;

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const fields = {
      drill,
      noteKey: onNote && note ? note.key : null,
      instructions,
      minutesPerDay: minutes.trim() === "" ? null : Number(minutes),
      dueOn: dueOn === "" ? null : dueOn,
    };
    const handlers = {
      onSuccess: (saved: AssignmentDto) => {
        if (!initial) {
          setInstructions("");
          setMinutes("");
          setDueOn("");
        }
        onDone?.(saved);
      },
      onError: (err: unknown) => {
        if (err instanceof ApiError && err.isConflict) onConflict?.(conflictCurrent(err));
      },
    };
    if (initial) update.mutate({ id: initial.id, version: initial.version, ...fields }, handlers);
    else create.mutate(fields, handlers);
  };

  return (
    <form onSubmit={submit} noValidate className="grid gap-3 sm:grid-cols-2" aria-label={initial ? "Change this practice" : "Assign practice"} data-testid="assignment-form">
      <label className="text-sm font-medium">
        Drill
        <select value={drill} onChange={(e) => setDrill(e.target.value as AssignmentDrill)} aria-invalid={invalid("drill")} className={`mt-1 h-11 ${selectClass}`}>
          {ASSIGNMENT_DRILLS.map((d) => (
            <option key={d} value={d}>{DRILL_LABELS[d]}</option>
          ))}
        </select>
      </label>
      <div className="flex items-end">
        {note ? (
          <label className="flex min-h-11 items-center gap-2 text-sm">
            <input type="checkbox" checked={onNote} onChange={(e) => setOnNote(e.target.checked)} className="h-5 w-5 accent-accent" />
            On {note.label}
          </label>
        ) : (
          <p className="min-h-11 text-sm text-graphite">On the whole part (choose a note first to set practice on it).</p>
        )}
      </div>
      <label className="text-sm font-medium sm:col-span-2">
        Instructions
        <textarea
          value={instructions}
          onChange={(e) => setInstructions(e.target.value)}
          rows={3}
          maxLength={INSTRUCTIONS_MAX_LENGTH}
          placeholder="What to listen for, how to start, when it counts as done"
          aria-invalid={invalid("instructions")}
          className={`mt-1 ${fieldClass}`}
        />
      </label>
      <label className="text-sm font-medium">
        Minutes a day <span className="font-normal text-graphite">(optional)</span>
        <input
          type="number"
          inputMode="numeric"
          min={1}
          max={MINUTES_PER_DAY_MAX}
          step={1}
          value={minutes}
          onChange={(e) => setMinutes(e.target.value)}
          aria-invalid={invalid("minutesPerDay")}
          className={`mt-1 h-11 tabular-nums ${inputClass}`}
        />
      </label>
      <label className="text-sm font-medium">
        Due on <span className="font-normal text-graphite">(optional)</span>
        <input type="date" min={today} value={dueOn} onChange={(e) => setDueOn(e.target.value)} aria-invalid={invalid("dueOn")} className={`mt-1 h-11 ${inputClass}`} />
      </label>
      <div className="flex flex-wrap items-center gap-3 sm:col-span-2">
        <button type="submit" disabled={mutation.isPending} className="min-h-11 rounded-card bg-accent-strong px-4 text-sm font-semibold text-paper-card hover:bg-ink disabled:opacity-50">
          {initial ? "Save changes" : "Assign practice"}
        </button>
        {onCancel ? (
          <button type="button" onClick={onCancel} className="min-h-11 rounded-card border border-graphite/60 px-4 text-sm font-semibold">
            Cancel
          </button>
        ) : null}
        {error ? (
          <span id={`${id}-error`} role="alert" className="text-sm font-semibold text-danger">
            {error.message}
          </span>
        ) : null}
      </div>
    </form>
  );
}
