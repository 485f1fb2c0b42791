"use client";

import { useEffect, useMemo, useRef, useState } from "react";
import { pulseLadder, MAX_BPM, MIN_BPM, type PulseStep } from "@/lib/practice/pulse-trainer";
import { startMetronome, type MetronomeHandle } from "@/lib/practice/metronome";
import { AudioCaution, VolumeControl } from "./audio-caution";
import { audioContext } from "./audio";
import { Button, fmt, Section } from "./ui";

const STEP_NAMES: Record<PulseStep["kind"], string> = {
  settle: "Settle",
  regroup: "Regroup",
  climb: "Climb",
  target: "Target",
};

/** What each kind of step asks of the player, shown where the steps are set. */
const STEP_EXPLAINED: Record<PulseStep["kind"], string> = {
  settle: "an easy number of pulses per beat at your tempo, slower than the marked speed, to find an even pulse.",
  regroup: "about the same speed, felt in the number of pulses per beat the marked speed needs.",
  climb: "the metronome a notch faster each time, the pulses per beat unchanged.",
  target: "the note's marked speed.",
};

/** Metronome subdivisions that climb to the note's marked speed, one step at a time. */
export function PulseTrainer({ tempo, markedHz, volume, onVolume }: { tempo: number; markedHz: number | null; volume: number; onVolume: (v: number) => void }) {
  const [startBpm, setStartBpm] = useState(Math.round(tempo));
  const [targetHz, setTargetHz] = useState(markedHz && markedHz > 0 ? markedHz : 5.5);
  const [current, setCurrent] = useState(0);
  const [playing, setPlaying] = useState(false);
  const handle = useRef<MetronomeHandle | null>(null);

  const ladder = useMemo(() => {
    try {
      return pulseLadder({ targetHz, bpm: startBpm });
    } catch {
      return [];
    }
  }, [targetHz, startBpm]);
  const step = ladder[Math.min(current, ladder.length - 1)];

  const stop = () => {
    handle.current?.stop();
    handle.current = null;
    setPlaying(false);
  };
  const play = async (s: PulseStep) => {
    handle.current?.stop();
    const ctx = await audioContext();
    handle.current = startMetronome(ctx, { bpm: s.bpm, pulses: s.pulses, volume });
    setPlaying(true);
  };
  const choose = (i: number) => {
    setCurrent(i);
    if (playing) void play(ladder[i]);
  };
  useEffect(() => () => handle.current?.stop(), []);
  useEffect(() => handle.current?.setVolume(volume), [volume]);

  return (
    <Section title="Pulse trainer" id="pulse-trainer" aside={<AudioCaution />}>
      <p className="mb-3 text-sm text-graphite">
        Play one vibrato pulse on every click. The accented click is the beat. Move to the next step when the pulses feel even.
      </p>
      <div className="mb-3 flex flex-wrap items-end gap-4">
        <label className="text-sm font-medium">
          Start tempo (♩ =)
          <input
            type="number"
            min={MIN_BPM}
            max={MAX_BPM}
            step={1}
            value={startBpm}
            onChange={(e) => {
              if (!e.target.value) return;
              // A new ladder stops the clicks rather than playing a stale step.
              stop();
              setCurrent(0);
              setStartBpm(Math.min(MAX_BPM, Math.max(MIN_BPM, Number(e.target.value))));
            }}
            className="mt-1 block h-11 w-24 rounded-card border border-graphite/60 bg-paper-card px-2 tabular-nums"
          />
        </label>
        <label className="text-sm font-medium">
          Target speed (Hz)
          <input
            type="number"
            min={1}
            max={12}
            step={0.1}
            value={targetHz}
            onChange={(e) => {
              if (!e.target.value) return;
              stop();
              setCurrent(0);
              setTargetHz(Math.min(12, Math.max(1, Number(e.target.value))));
            }}
            className="mt-1 block h-11 w-24 rounded-card border border-graphite/60 bg-paper-card px-2 tabular-nums"
          />
        </label>
        <VolumeControl id="pulse-volume" value={volume} onChange={onVolume} />
      </div>
      {ladder.length === 0 ? (
        <p className="text-sm">No metronome setting reaches that speed.</p>
      ) : (
        <>
          <dl className="mb-3 grid gap-0.5 text-sm text-graphite" data-testid="pulse-steps-explained">
            {(Object.keys(STEP_NAMES) as PulseStep["kind"][])
              .filter((kind) => ladder.some((s) => s.kind === kind))
              .map((kind) => (
                <div key={kind}>
                  <dt className="inline font-semibold text-ink">{STEP_NAMES[kind]}:</dt> <dd className="inline">{STEP_EXPLAINED[kind]}</dd>
                </div>
              ))}
          </dl>
          <ol className="grid gap-1" aria-label="Pulse trainer steps">
            {ladder.map((s, i) => (
              <li key={`${s.kind}-${i}`}>
                <button
                  type="button"
                  onClick={() => choose(i)}
                  aria-current={i === current ? "step" : undefined}
                  data-testid="pulse-step"
                  className="grid min-h-11 w-full grid-cols-[5.5rem_1fr_1fr_1fr] items-center gap-2 whitespace-nowrap max-sm:grid-cols-[4.75rem_1fr_auto_auto] max-sm:gap-3 rounded-card border border-transparent px-3 text-left text-sm hover:bg-paper-deep aria-[current=step]:border-accent aria-[current=step]:bg-paper-deep aria-[current=step]:font-semibold"
                >
                  <span className="text-graphite">
                    {i + 1}. {STEP_NAMES[s.kind]}
                  </span>
                  <span className="tabular-nums">♩ = {fmt(s.bpm, s.bpm % 1 ? 1 : 0)}</span>
                  <span className="tabular-nums">
                    {s.pulses} <span className="max-sm:hidden">per beat</span>
                    <span className="sm:hidden">/ beat</span>
                  </span>
                  <span className="tabular-nums">{fmt(s.hz, 2)} Hz</span>
                </button>
              </li>
            ))}
          </ol>
          <div className="mt-3 flex flex-wrap items-center gap-2">
            {playing ? (
              <Button kind="primary" onClick={stop}>
                Stop clicks
              </Button>
            ) : (
              <Button kind="primary" onClick={() => step && void play(step)}>
                Start clicks
              </Button>
            )}
            <Button onClick={() => choose(Math.min(ladder.length - 1, current + 1))} disabled={current >= ladder.length - 1}>
              Next step
            </Button>
            <span className="text-sm text-graphite" aria-live="polite" data-testid="pulse-status">
              {playing && step ? `Clicking ${step.pulses} per beat at ♩ = ${fmt(step.bpm, step.bpm % 1 ? 1 : 0)} (${fmt(step.hz, 2)} Hz)` : "Stopped"}
            </span>
          </div>
        </>
      )}
    </Section>
  );
}
