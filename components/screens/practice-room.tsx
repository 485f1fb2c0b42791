"use client";

import Link from "next/link";
import { useMemo, useRef, useState } from "react";
import { auditionNotes, DEFAULT_VOLUME, type AuditionHandle } from "@/lib/export/audition";
import type { MarkingValues } from "@/lib/markings/schema";
import { pulsesPerBeat } from "@/lib/analysis/vibrato";
import { formatNumber } from "@/lib/markings/pulses";
import type { AssignmentDto } from "@/lib/assignments/schema";
import { PracticeAssignments } from "@/components/assignments/assignment-list";
import { selectClass } from "@/components/ui/styles";
import { AudioCaution, VolumeControl } from "@/components/practice/audio-caution";
import { audioContext } from "@/components/practice/audio";
import { HoldLadder } from "@/components/practice/hold-ladder";
import { PracticeLog } from "@/components/practice/practice-log";
import { PulseTrainer } from "@/components/practice/pulse-trainer";
import { TakeRecorder } from "@/components/practice/take-recorder";
import { Button, Figure, fmt } from "@/components/practice/ui";
import { PracticeTempoPrompt } from "@/components/score/working-tempo";

export interface PracticeNote {
  key: string;
  label: string;
  midi: number;
  /** Written length in beats of the tempo (quarter notes). */
  beats: number;
  marking: MarkingValues | null;
}

interface Props {
  partId: string;
  title: string;
  /** The part's working tempo (♩ per minute); null when the part gives none and no one has set it. */
  tempo: number | null;
  /** Whether this viewer may set the working tempo (the part's owner). */
  canSetTempo: boolean;
  notes: PracticeNote[];
  /** On a staff carrying two players: whose line `notes` are (chosen in the score). */
  line?: "upper" | "lower" | null;
  canWrite: boolean;
  /** The note to open on (from `?note=`); otherwise the first marked note. */
  initialNoteKey?: string | null;
  /** The server's day, for due dates until the browser's own calendar takes over. */
  serverToday: string;
}

/** Where each drill lives on the page (its section heading's id); free practice goes to the log. */
const DRILL_SECTION: Record<AssignmentDto["drill"], string> = {
  "pulse-trainer": "pulse-trainer",
  "hold-ladder": "hold-ladder",
  take: "take",
  free: "practice-log",
};

function markingSummary(m: MarkingValues | null): string {
  if (!m) return "not marked";
  if (m.depthCents === 0) return "no vibrato";
  return `±${formatNumber(m.depthCents, 0)}¢, ${formatNumber(m.speedHz, 1)} Hz`;
}

/** The practice page of one part: choose a note, then drill it with the pulse trainer, the hold ladder and takes. */
export function PracticeRoom({ partId, title, tempo, canSetTempo, notes, line = null, canWrite, initialNoteKey = null, serverToday }: Props) {
  const marked = useMemo(() => notes.filter((n) => n.marking), [notes]);
  const others = useMemo(() => notes.filter((n) => !n.marking), [notes]);
  const [noteKey, setNoteKey] = useState<string | null>(initialNoteKey ?? marked[0]?.key ?? notes[0]?.key ?? null);
  const [volume, setVolume] = useState(DEFAULT_VOLUME);
  const [hearing, setHearing] = useState(false);
  const audition = useRef<AuditionHandle | null>(null);
  const note = notes.find((n) => n.key === noteKey) ?? null;
  const labels = useMemo(() => new Map(notes.map((n) => [n.key, n.label])), [notes]);
  const m = note?.marking ?? null;
  const markedHz = m && m.depthCents > 0 ? m.speedHz : null;

  const hear = async () => {
    if (!note) return;
    audition.current?.stop();
    const ctx = await audioContext();
    // At least two seconds, so the vibrato can be heard on a short note; two seconds when the
    // part has no tempo yet (its written length cannot be timed).
    const seconds = tempo ? Math.max(2, (note.beats * 60) / tempo) : 2;
    const handle = auditionNotes(ctx, [{ midi: note.midi, startSeconds: 0, durationSeconds: seconds, marking: m ?? undefined }], { volume });
    audition.current = handle;
    setHearing(true);
    void handle.finished.then(() => audition.current === handle && setHearing(false));
  };
  /** Opens an assignment's drill on its note: the note is chosen, then its section is brought into view. */
  const practise = (a: AssignmentDto) => {
    if (a.noteKey && notes.some((n) => n.key === a.noteKey)) setNoteKey(a.noteKey);
    // After the room has re-rendered on the new note.
    requestAnimationFrame(() => {
      const heading = document.getElementById(DRILL_SECTION[a.drill]);
      const reduce = window.matchMedia?.("(prefers-reduced-motion: reduce)").matches;
      heading?.scrollIntoView({ behavior: reduce ? "auto" : "smooth", block: "start" });
    });
  };
  const stopHearing = () => {
    audition.current?.stop();
    audition.current = null;
    setHearing(false);
  };

  return (
    <div className="mx-auto grid max-w-6xl gap-5 px-gutter py-6" data-testid="practice-room">
      <header className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <p className="text-sm text-graphite">
            <Link href={`/parts/${partId}`} className="inline-flex min-h-6 items-center underline underline-offset-4 hover:text-ink">
              ← Back to the score
            </Link>
          </p>
          <h1 className="text-2xl font-semibold tracking-tight">Practise · {title}</h1>
          <div className="text-sm text-graphite" data-testid="practice-tempo">
            {tempo !== null ? (
              <>Working tempo ♩ = {fmt(tempo, 0)}</>
            ) : canSetTempo ? (
              <PracticeTempoPrompt partId={partId} />
            ) : (
              "This part gives no tempo, and its player has not set a working tempo yet."
            )}
          </div>
          {line ? (
            <p className="text-sm text-graphite" data-testid="practice-line">
              Two players share this staff: you practise the {line} line (choose the line in the score).
            </p>
          ) : null}
        </div>
      </header>

      <PracticeAssignments
        partId={partId}
        labelOf={(k) => labels.get(k) ?? k}
        chosenNote={note ? { key: note.key, label: note.label } : null}
        serverToday={serverToday}
        onPractise={practise}
      />

      <section aria-labelledby="note-heading" className="rounded-card border border-rule bg-paper-card p-5">
        <h2 id="note-heading" className="sr-only">
          The chosen note
        </h2>
        {notes.length === 0 ? (
          <p>This part has no notes to practise.</p>
        ) : (
          <div className="flex flex-wrap items-end gap-x-8 gap-y-4">
            <label className="min-w-64 text-sm font-medium">
              Note to practise
              <select value={noteKey ?? ""} onChange={(e) => setNoteKey(e.target.value)} className={`mt-1 h-11 ${selectClass}`}>
                {marked.length > 0 ? (
                  <optgroup label="Marked notes">
                    {marked.map((n) => (
                      <option key={n.key} value={n.key}>
                        {n.label} — {markingSummary(n.marking)}
                      </option>
                    ))}
                  </optgroup>
                ) : null}
                <optgroup label={marked.length ? "Other notes" : "Notes (none is marked yet)"}>
                  {others.map((n) => (
                    <option key={n.key} value={n.key}>
                      {n.label}
                    </option>
                  ))}
                </optgroup>
              </select>
            </label>
            {note ? (
              <dl className="flex flex-wrap gap-x-8 gap-y-2" data-testid="note-summary">
                <Figure label="Depth" value={m ? `±${fmt(m.depthCents, 0)}` : "–"} unit="¢" />
                <Figure label="Speed" value={m && m.depthCents > 0 ? fmt(m.speedHz, 1) : "–"} unit="Hz" />
                <Figure label="Pulses per beat" value={markedHz && tempo ? fmt(pulsesPerBeat(markedHz, tempo), 2) : "–"} unit={tempo ? `at ♩ = ${fmt(tempo, 0)}` : "no tempo yet"} />
                <Figure label="Written length" value={formatNumber(note.beats)} unit={note.beats === 1 ? "beat" : "beats"} />
              </dl>
            ) : null}
            {note ? (
              <div className="flex flex-wrap items-center gap-3">
                <Button onClick={hearing ? stopHearing : () => void hear()}>{hearing ? "Stop" : "Hear it as marked"}</Button>
                <VolumeControl id="hear-volume" value={volume} onChange={setVolume} />
                <AudioCaution />
              </div>
            ) : null}
          </div>
        )}
        {note && !m ? <p className="mt-3 text-sm text-graphite">This note is not marked yet: mark it in the score to practise towards its depth and speed.</p> : null}
      </section>

      {note ? (
        <>
          {tempo !== null ? (
            <div className="grid gap-5 lg:grid-cols-2">
              <PulseTrainer key={`pulse-${note.key}`} tempo={tempo} markedHz={markedHz} volume={volume} onVolume={setVolume} />
              <HoldLadder key={`hold-${note.key}`} tempo={tempo} writtenBeats={note.beats} markedHz={markedHz} />
            </div>
          ) : (
            <p className="rounded-card border border-rule bg-paper-card p-5 text-sm" data-testid="drills-need-tempo" id="pulse-trainer">
              The pulse trainer and the hold ladder count in beats, and this part gives no tempo.{" "}
              {canSetTempo ? "Set its working tempo above; Ondula keeps it with the part." : "Its player sets the working tempo on this page."}
            </p>
          )}
          <TakeRecorder
            key={`take-${note.key}`}
            partId={partId}
            noteKey={note.key}
            noteLabel={note.label}
            midi={note.midi}
            marked={m ? { speedHz: m.speedHz, depthCents: m.depthCents } : null}
            canWrite={canWrite}
          />
        </>
      ) : null}
      <PracticeLog partId={partId} noteKey={note?.key ?? null} noteLabel={note?.label ?? null} labelOf={(k) => labels.get(k) ?? k} />
    </div>
  );
}
