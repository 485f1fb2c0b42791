"use client";

import Link from "next/link";
import { useState } from "react";
import { localIsoDate } from "@/lib/assignments/due";
import { DRILL_LABELS } from "@/lib/assignments/schema";
import { useAssignments } from "./api";
import { AssignmentForm } from "./assignment-form";

/**
 * For a teacher in the workspace's discussion of a note: set practice on that note without leaving
 * the score. Shown only to those the server lets assign (a teacher the part is shared with).
 */
export function AssignOnNote({ partId, noteKey, label }: { partId: string; noteKey: string; label: string }) {
  const q = useAssignments(partId);
  const [open, setOpen] = useState(false);
  const [saved, setSaved] = useState<string | null>(null);
  if (!q.data?.canAssign) return null;
  const onThisNote = q.data.assignments.filter((a) => a.noteKey === noteKey && a.doneAt === null).length;
  return (
    <section aria-label="Practice on this note" className="grid gap-2" data-testid="assign-on-note">
      {open ? (
        <>
          <h3 className="font-semibold">Assign practice on {label}</h3>
          <AssignmentForm
            partId={partId}
            note={{ key: noteKey, label }}
            today={localIsoDate(new Date())}
            onDone={(a) => {
              setOpen(false);
              setSaved(`Practice set: ${DRILL_LABELS[a.drill]} on ${label}.`);
            }}
            onCancel={() => setOpen(false)}
          />
        </>
      ) : (
        <button type="button" onClick={() => { setSaved(null); setOpen(true); }} className="justify-self-start rounded-card border border-ink/40 px-3 py-1.5 text-sm font-semibold">
          Assign practice on this note
        </button>
      )}
      {saved || onThisNote > 0 ? (
        <p role="status" className="text-sm">
          {saved ? `${saved} ` : ""}
          {onThisNote > 0 ? `${onThisNote} open on this note. ` : ""}
          <Link href={`/parts/${partId}/practice?note=${encodeURIComponent(noteKey)}#assignments`} className="text-accent-strong underline">
            See it on the practice page
          </Link>
        </p>
      ) : null}
    </section>
  );
}
