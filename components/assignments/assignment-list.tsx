"use client";

import { useEffect, useRef, useState } from "react";
import { arrangeAssignments, dueStatus, type DueStatus } from "@/lib/assignments/due";
import { DRILL_LABELS, type AssignmentDto } from "@/lib/assignments/schema";
import { ApiError } from "@/components/client/fetch-json";
import { useAssignments, useDeleteAssignment, useReadAssignmentNotifications, useUpdateAssignment } from "./api";
import { AssignmentForm, type NoteOption } from "./assignment-form";
import { useToday } from "./use-today";

const dayFormat = new Intl.DateTimeFormat("en-GB", { weekday: "short", day: "numeric", month: "short", timeZone: "UTC" });
const formatDay = (iso: string) => dayFormat.format(new Date(`${iso}T00:00:00Z`));

interface Props {
  partId: string;
  labelOf: (noteKey: string) => string;
  /** The note chosen in the practice room, offered when setting practice. */
  chosenNote: NoteOption | null;
  /** The server's day, until the browser's own calendar takes over. */
  serverToday: string;
  /** Opens the drill of this practice in the room, on its note. */
  onPractise: (assignment: AssignmentDto) => void;
}

/**
 * The practice page's assignments. The part's owner sees "From your teacher": open practice on
 * top, each with a Done box, and done practice folded away below. A teacher the part is shared
 * with sees the same list with their own practice editable, and sets new practice.
 */
export function PracticeAssignments({ partId, labelOf, chosenNote, serverToday, onPractise }: Props) {
  const q = useAssignments(partId);
  const today = useToday(serverToday);
  const read = useReadAssignmentNotifications(partId);
  const [assigning, setAssigning] = useState(false);
  const [notice, setNotice] = useState<string | null>(null);
  const list = q.data?.assignments ?? [];
  const canMarkDone = q.data?.canMarkDone ?? false;
  const canAssign = q.data?.canAssign ?? false;
  const { open, done } = arrangeAssignments(list);

  // The owner has now seen the practice set on this part.
  const readOnce = useRef(false);
  const { mutate: markRead } = read;
  useEffect(() => {
    if (readOnce.current || !canMarkDone || list.length === 0) return;
    readOnce.current = true;
    markRead();
  }, [canMarkDone, list.length, markRead]);

  if (q.isError) return <p role="alert" className="text-danger">The practice set on this part could not be loaded: {q.error.message}</p>;
  if (!q.data || (!canAssign && list.length === 0)) return null;

  const title = canMarkDone ? "From your teacher" : canAssign ? "Practice set on this part" : "Practice set by the teacher";
  return (
    <section aria-labelledby="assignments" className="rounded-card border-2 border-ink/70 bg-paper-card p-5" data-testid="assignments">
      <div className="mb-3 flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="assignments" className="text-lg font-semibold" tabIndex={-1}>
          {title}
        </h2>
        <span className="text-sm text-graphite">
          {open.length} open{done.length ? ` · ${done.length} done` : ""}
        </span>
      </div>
      {notice ? (
        <p role="status" className="mb-3 text-sm">
          {notice}
        </p>
      ) : null}
      {open.length === 0 ? <p className="text-sm text-graphite">{canMarkDone ? "Nothing open: all the practice set here is done." : "No open practice on this part."}</p> : null}
      <ul className="grid gap-3">
        {open.map((a) => (
          <AssignmentCard key={a.id} partId={partId} assignment={a} today={today} labelOf={labelOf} canMarkDone={canMarkDone} onPractise={onPractise} />
        ))}
      </ul>
      {done.length > 0 ? (
        <details className="mt-3" data-testid="done-assignments">
          <summary className="min-h-11 cursor-pointer py-2 text-sm font-semibold">Done ({done.length})</summary>
          <ul className="grid gap-3">
            {done.map((a) => (
              <AssignmentCard key={a.id} partId={partId} assignment={a} today={today} labelOf={labelOf} canMarkDone={canMarkDone} onPractise={onPractise} />
            ))}
          </ul>
        </details>
      ) : null}
      {canAssign ? (
        <div className="mt-4 border-t border-rule pt-4">
          {assigning ? (
            <AssignmentForm
              partId={partId}
              note={chosenNote}
              today={today}
              onDone={(saved) => {
                setAssigning(false);
                setNotice(`Practice set: ${DRILL_LABELS[saved.drill]}${saved.noteKey ? ` on ${labelOf(saved.noteKey)}` : ""}. The player has been told.`);
              }}
              onCancel={() => setAssigning(false)}
            />
          ) : (
            <button
              type="button"
              onClick={() => {
                setNotice(null);
                setAssigning(true);
              }}
              className="min-h-11 rounded-card border border-ink/40 px-4 text-sm font-semibold"
            >
              Assign practice
            </button>
          )}
        </div>
      ) : null}
    </section>
  );
}

function DueText({ status, dueOn }: { status: DueStatus; dueOn: string | null }) {
  if (!dueOn) return <span className="text-sm text-graphite">{status.text}</span>;
  const text = `${status.text} · ${formatDay(dueOn)}`;
  if (status.state === "overdue") {
    // Words and a mark carry the lateness; the colour only repeats it.
    return (
      <span className="inline-flex items-center gap-1 rounded border border-danger px-1.5 text-sm font-semibold text-danger" data-testid="due" data-state={status.state}>
        <span aria-hidden="true">!</span>
        {text}
      </span>
    );
  }
  return (
    <span className={`text-sm ${status.state === "later" ? "" : "font-semibold"}`} data-testid="due" data-state={status.state}>
      {text}
    </span>
  );
}

function AssignmentCard({ partId, assignment: a, today, labelOf, canMarkDone, onPractise }: {
  partId: string;
  assignment: AssignmentDto;
  today: string;
  labelOf: (noteKey: string) => string;
  canMarkDone: boolean;
  onPractise: (a: AssignmentDto) => void;
}) {
  const update = useUpdateAssignment(partId);
  const remove = useDeleteAssignment(partId);
  const canEdit = useCanEdit(partId, a);
  const [editing, setEditing] = useState(false);
  const [confirming, setConfirming] = useState(false);
  const [conflict, setConflict] = useState<string | null>(null);
  // The tick as clicked, until the list is read again. Local state rather than the mutation's
  // variables: a controlled checkbox is put back to its rendered value right after the click, and
  // the mutation's state reaches React only on a later tick.
  const [tick, setTick] = useState<boolean | null>(null);
  const isDone = a.doneAt !== null;
  const what = `${DRILL_LABELS[a.drill]}${a.noteKey ? `, ${labelOf(a.noteKey)}` : ""}`;
  const failure = [update.error, remove.error].find((e) => e instanceof ApiError) as ApiError | undefined;
  const message = conflict ?? (failure && !failure.isConflict ? failure.message : null);
  const onConflict = () => setConflict("This practice was changed in another window. It is shown as it is now; make your change again if it still applies.");

  return (
    <li className={`rounded-card border border-rule p-4 ${isDone ? "bg-paper" : "bg-paper-card"}`} data-testid="assignment" data-state={isDone ? "done" : "open"}>
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <p className="font-semibold">
          {DRILL_LABELS[a.drill]}
          <span className="font-normal"> · {a.noteKey ? labelOf(a.noteKey) : "any note"}</span>
        </p>
        {isDone ? <span className="text-sm text-graphite">Done {formatDay(a.doneAt!.slice(0, 10))}</span> : <DueText status={dueStatus(a.dueOn, today)} dueOn={a.dueOn} />}
      </div>
      {a.instructions ? <p className="mt-1 whitespace-pre-line">{a.instructions}</p> : null}
      <p className="mt-1 text-sm text-graphite">
        {a.minutesPerDay ? `${a.minutesPerDay} min a day · ` : ""}Set by {a.assignedByName}
      </p>
      {editing ? (
        <div className="mt-3">
          <AssignmentForm
            key={a.version}
            partId={partId}
            note={a.noteKey ? { key: a.noteKey, label: labelOf(a.noteKey) } : null}
            initial={a}
            today={today}
            onDone={() => {
              setConflict(null);
              setEditing(false);
            }}
            onCancel={() => setEditing(false)}
            onConflict={onConflict}
          />
        </div>
      ) : (
        <div className="mt-3 flex flex-wrap items-center gap-3">
          {!isDone ? (
            <button type="button" onClick={() => onPractise(a)} className="min-h-11 rounded-card border border-graphite/60 px-4 text-sm font-semibold hover:bg-paper-deep" aria-label={`Practise this: ${what}`}>
              Practise this
            </button>
          ) : null}
          {canMarkDone ? (
            <label className="flex min-h-11 items-center gap-2 text-sm font-semibold">
              <input
                type="checkbox"
                // The tick shows at once; a refusal puts it back when the list is read again.
                checked={tick ?? isDone}
                disabled={update.isPending}
                onChange={(e) => {
                  setConflict(null);
                  setTick(e.target.checked);
                  update.mutate(
                    { id: a.id, version: a.version, done: e.target.checked },
                    { onError: (err) => err instanceof ApiError && err.isConflict && onConflict(), onSettled: () => setTick(null) },
                  );
                }}
                className="h-5 w-5 accent-accent"
                aria-label={`Done: ${what}`}
              />
              Done
            </label>
          ) : null}
          {canEdit ? (
            confirming ? (
              <span className="flex flex-wrap items-center gap-2 text-sm">
                Remove this practice?
                <button type="button" className="min-h-11 rounded-card border border-danger px-3 font-semibold text-danger" onClick={() => remove.mutate({ id: a.id, version: a.version }, { onError: (err) => err instanceof ApiError && err.isConflict && onConflict(), onSettled: () => setConfirming(false) })}>
                  Yes, remove
                </button>
                <button type="button" className="min-h-11 rounded-card border border-graphite/60 px-3 font-semibold" onClick={() => setConfirming(false)}>
                  Keep it
                </button>
              </span>
            ) : (
              <>
                <button type="button" onClick={() => { setConflict(null); setEditing(true); }} className="min-h-11 rounded-card px-3 text-sm font-semibold underline underline-offset-4">
                  Edit
                </button>
                <button type="button" onClick={() => setConfirming(true)} className="min-h-11 rounded-card px-3 text-sm font-semibold text-danger underline underline-offset-4">
                  Remove
                </button>
              </>
            )
          ) : null}
        </div>
      )}
      {message ? (
        <p role="alert" className="mt-2 text-sm font-semibold text-danger">
          {message}
        </p>
      ) : null}
    </li>
  );
}

/** A teacher edits the practice they set; the server decides the same through the policy. */
function useCanEdit(partId: string, a: AssignmentDto): boolean {
  const q = useAssignments(partId);
  return (q.data?.canAssign ?? false) && q.data?.viewerId === a.assignedById;
}
