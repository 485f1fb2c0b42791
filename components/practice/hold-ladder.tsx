"use client";

import { useEffect, useMemo, useState } from "react";
import { formatNumber } from "@/lib/markings/pulses";
import { holdLadder } from "@/lib/practice/hold-ladder";
import { Button, fmt, Section } from "./ui";

type Phase = "hold" | "rest";
interface Run {
  step: number;
  phase: Phase;
  startedAt: number;
}

/** The brief's caution for long holds, shown where the holds are. */
export function HoldCaution() {
  return (
    <div role="note" className="mb-4 rounded-card border-2 border-caution bg-paper px-4 py-3 text-sm" data-testid="hold-caution">
      <p className="font-semibold">Take care with long holds</p>
      <p>
        Long holds and breathing drills can make you light-headed. If that happens, stop and breathe normally. Pain while playing is a
        matter for a qualified teacher or health professional, not for an app.
      </p>
    </div>
  );
}

/** Holds from long to the note's written length, with a rest to breathe after each. */
export function HoldLadder({ tempo, writtenBeats, markedHz }: { tempo: number; writtenBeats: number; markedHz: number | null }) {
  const ladder = useMemo(() => {
    try {
      return holdLadder({ writtenBeats, bpm: tempo, speedHz: markedHz ?? 0 });
    } catch {
      return [];
    }
  }, [tempo, writtenBeats, markedHz]);
  const [run, setRun] = useState<Run | null>(null);
  const [now, setNow] = useState(0);

  useEffect(() => {
    if (!run) return;
    const timer = setInterval(() => {
      const t = performance.now();
      setNow(t);
      const step = ladder[run.step];
      const length = (run.phase === "hold" ? step.seconds : step.restSeconds) * 1000;
      if (t - run.startedAt < length) return;
      if (run.phase === "hold" && step.restSeconds > 0) setRun({ step: run.step, phase: "rest", startedAt: t });
      else if (run.phase === "rest" && run.step + 1 < ladder.length) setRun({ step: run.step + 1, phase: "hold", startedAt: t });
      else setRun(null);
    }, 100);
    return () => clearInterval(timer);
  }, [run, ladder]);

  const start = (step: number) => {
    const t = performance.now();
    setNow(t);
    setRun({ step, phase: "hold", startedAt: t });
  };
  const active = run ? ladder[run.step] : null;
  const total = active ? (run!.phase === "hold" ? active.seconds : active.restSeconds) : 0;
  const elapsed = run ? Math.min(total, Math.max(0, (now - run.startedAt) / 1000)) : 0;

  return (
    <Section title="Hold ladder" id="hold-ladder">
      <HoldCaution />
      <p className="mb-3 text-sm text-graphite">
        Hold the note with its vibrato, long first, then shorter until it fits its written length ({formatNumber(writtenBeats)}{" "}
        {writtenBeats === 1 ? "beat" : "beats"} at ♩ = {fmt(tempo, 0)}). Breathe normally in every rest.
      </p>
      <ol className="grid gap-1" aria-label="Hold ladder steps">
        {ladder.map((s, i) => {
          const current = run?.step === i;
          return (
            <li key={i}>
              <button
                type="button"
                onClick={() => start(i)}
                aria-current={current ? "step" : undefined}
                className="grid min-h-11 w-full grid-cols-[4.5rem_1fr_1fr_1fr] items-center gap-2 whitespace-nowrap max-sm:grid-cols-[3.5rem_auto_auto_1fr] max-sm:gap-3 rounded-card border border-transparent px-3 text-left text-sm hover:bg-paper-deep aria-[current=step]:border-accent aria-[current=step]:bg-paper-deep aria-[current=step]:font-semibold"
              >
                {/* The name is what the row shows, so a voice command can say it (WCAG 2.5.3). */}
                <span className="text-graphite">
                  <span className="sr-only">Start at </span>Hold {i + 1}
                </span>
                <span className="tabular-nums">
                  {formatNumber(s.beats)} {s.beats === 1 ? "beat" : "beats"}
                </span>
                <span className="tabular-nums">{fmt(s.seconds)} s</span>
                <span className="text-right tabular-nums text-graphite sm:text-left">{s.pulses ? `≈ ${fmt(s.pulses, 0)} pulses` : "no vibrato"}</span>
              </button>
              {s.restSeconds > 0 ? <p className="pl-[5.25rem] text-xs text-graphite max-sm:pl-[4.25rem]">then breathe {fmt(s.restSeconds, 0)} s</p> : null}
            </li>
          );
        })}
      </ol>
      <div className="mt-3 flex flex-wrap items-center gap-3">
        {run ? (
          <Button kind="primary" onClick={() => setRun(null)}>
            Stop
          </Button>
        ) : (
          <Button kind="primary" onClick={() => start(0)} disabled={ladder.length === 0}>
            Start the ladder
          </Button>
        )}
        <div className="min-w-48 flex-1" aria-live="polite" data-testid="hold-status">
          {run && active ? (
            <>
              <p className="text-sm font-semibold">
                {run.phase === "hold" ? `Hold ${run.step + 1}: play` : "Rest: breathe normally"} · {fmt(Math.max(0, total - elapsed))} s left
              </p>
              <div
                role="progressbar"
                aria-label={run.phase === "hold" ? "Hold" : "Rest"}
                aria-valuemin={0}
                aria-valuemax={Math.round(total * 10) / 10}
                aria-valuenow={Math.round(elapsed * 10) / 10}
                className="mt-1 h-3 w-full overflow-hidden rounded-full border border-rule bg-paper"
              >
                <div className={`h-full ${run.phase === "hold" ? "bg-accent" : "bg-sky"}`} style={{ width: `${total ? (elapsed / total) * 100 : 0}%` }} />
              </div>
            </>
          ) : (
            <p className="text-sm text-graphite">Choose a hold to start there, or start from the top.</p>
          )}
        </div>
      </div>
    </Section>
  );
}
