"use client";

import { useEffect, useRef, useState } from "react";
import type { AnalyzedNote, PhraseResult } from "@/lib/analysis/types";
import { auditionNotes, DEFAULT_VOLUME, MAX_VOLUME, type AuditionHandle } from "@/lib/export/audition";
import { phraseAround, planAuditionNotes } from "@/lib/markings/audition-plan";
import type { MarkingValues } from "@/lib/markings/schema";
import { AUDITION_CAUTION } from "@/lib/practice/cautions";

export interface AuditionControlProps {
  /** The selected notes (score order is restored from the analysis). */
  keys: readonly string[];
  notes: readonly AnalyzedNote[];
  phrases: readonly PhraseResult[];
  markings: Readonly<Record<string, MarkingValues | undefined>>;
  tempo: number | null;
}


/**
 * Plays the selection (or the phrase around one selected note) with the marked vibrato. The level
 * starts low and the tone ramps in; the caution stays in view next to the control.
 */
export function AuditionControl({ keys, notes, phrases, markings, tempo }: AuditionControlProps) {
  const [volume, setVolume] = useState(DEFAULT_VOLUME);
  const [wholePhrase, setWholePhrase] = useState(false);
  const [playing, setPlaying] = useState(false);
  const ctxRef = useRef<AudioContext | null>(null);
  const handleRef = useRef<AuditionHandle | null>(null);

  const phrase = keys.length === 1 ? phraseAround(keys[0], notes, phrases) : null;
  const chosen = wholePhrase && phrase ? phrase : keys;

  const stop = () => {
    handleRef.current?.stop();
    handleRef.current = null;
    setPlaying(false);
  };

  const play = async () => {
    stop();
    const planned = planAuditionNotes(chosen, [...notes], markings, tempo);
    if (planned.length === 0) return;
    const ctx = (ctxRef.current ??= new AudioContext());
    if (ctx.state === "suspended") await ctx.resume();
    const handle = auditionNotes(ctx, planned, { volume });
    handleRef.current = handle;
    setPlaying(true);
    void handle.finished.then(() => {
      if (handleRef.current === handle) {
        handleRef.current = null;
        setPlaying(false);
      }
    });
  };

  useEffect(
    () => () => {
      handleRef.current?.stop();
      void ctxRef.current?.close();
    },
    [],
  );

  const what = chosen.length === 0 ? "Select a note to listen to it." : wholePhrase && phrase ? `the phrase (${phrase.length} notes)` : chosen.length === 1 ? "the selected note" : `${chosen.length} selected notes`;

  return (
    <section aria-label="Listen" className="flex flex-wrap items-center gap-x-3 gap-y-1 text-sm" data-testid="audition">
      <button
        type="button"
        onClick={play}
        disabled={chosen.length === 0}
        className="h-11 rounded border border-ink/30 px-3 font-medium hover:bg-paper-deep disabled:cursor-not-allowed disabled:text-graphite/60"
        aria-label={chosen.length ? `Listen to ${what}` : "Listen"}
      >
        ▶ Listen
      </button>
      <button
        type="button"
        onClick={stop}
        disabled={!playing}
        className="h-11 rounded border border-ink/30 px-3 font-medium hover:bg-paper-deep disabled:cursor-not-allowed disabled:text-graphite/60"
      >
        ■ Stop
      </button>
      <label className="flex h-11 items-center gap-1.5">
        <input type="checkbox" checked={wholePhrase} disabled={!phrase} onChange={(e) => setWholePhrase(e.target.checked)} />
        Whole phrase
      </label>
      <label className="flex h-11 items-center gap-2">
        Volume
        <input
          type="range"
          min={0}
          max={MAX_VOLUME}
          step={0.01}
          value={volume}
          onChange={(e) => setVolume(Number(e.target.value))}
          aria-valuetext={`${Math.round((volume / MAX_VOLUME) * 100)} %`}
          className="h-6 w-24"
        />
        <span className="w-10 tabular-nums text-graphite">{Math.round((volume / MAX_VOLUME) * 100)} %</span>
      </label>
      <p className="text-xs text-graphite" data-testid="audition-caution">
        <span aria-hidden="true">⚠ </span>
        {AUDITION_CAUTION}
      </p>
      <span className="sr-only" role="status" aria-live="polite">
        {playing ? `Playing ${what}.` : ""}
      </span>
    </section>
  );
}
