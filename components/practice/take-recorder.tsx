"use client";

import { useEffect, useRef, useState } from "react";
import { midiToHz } from "@/lib/analysis/vibrato";
import { analyseTake, type TakeAnalysis } from "@/lib/practice/take-analysis";
import type { TakeDto } from "@/lib/practice/schema";
import { ApiError } from "@/components/client/fetch-json";
import { useSaveTake, useTakes } from "./api";
import { ContourPlot } from "./contour-plot";
import { startRecording, type Recording } from "./recorder";
import { Button, Figure, fmt, Section } from "./ui";

const MAX_TAKE_SECONDS = 20;

type State =
  | { kind: "idle" }
  | { kind: "recording"; recording: Recording }
  | { kind: "analysing" }
  | { kind: "done"; result: TakeAnalysis; saved: boolean }
  | { kind: "error"; message: string };

interface Props {
  partId: string;
  noteKey: string;
  noteLabel: string;
  midi: number;
  marked: { speedHz: number; depthCents: number } | null;
  canWrite: boolean;
}

/** Record a take of the chosen note, see its speed and depth against the marking, and save the numbers. */
export function TakeRecorder({ partId, noteKey, noteLabel, midi, marked, canWrite }: Props) {
  const [state, setState] = useState<State>({ kind: "idle" });
  const [level, setLevel] = useState(0);
  const [elapsed, setElapsed] = useState(0);
  const save = useSaveTake(partId);
  const takes = useTakes(partId);
  const recordingRef = useRef<Recording | null>(null);

  const finish = async () => {
    const rec = recordingRef.current;
    if (!rec) return;
    recordingRef.current = null;
    setState({ kind: "analysing" });
    const { samples, sampleRate } = await rec.stop();
    // Let the "Measuring…" state paint before the analysis holds the main thread (≈0.1 s).
    await new Promise((r) => setTimeout(r, 20));
    setState({ kind: "done", result: analyseTake(samples, sampleRate, midi), saved: false });
  };

  useEffect(() => {
    if (state.kind !== "recording") return;
    const timer = setInterval(() => {
      setLevel(state.recording.level());
      const s = state.recording.seconds();
      setElapsed(s);
      if (s >= MAX_TAKE_SECONDS) void finish();
    }, 100);
    return () => clearInterval(timer);
    // finish reads the ref, so the timer does not need to restart when it changes.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [state]);
  useEffect(() => () => void recordingRef.current?.stop(), []);

  const record = async () => {
    setElapsed(0);
    try {
      const recording = await startRecording(MAX_TAKE_SECONDS);
      recordingRef.current = recording;
      setState({ kind: "recording", recording });
    } catch (e) {
      const denied = e instanceof DOMException && (e.name === "NotAllowedError" || e.name === "SecurityError");
      setState({
        kind: "error",
        message: denied ? "The browser did not allow the microphone. Allow it for this site and try again." : e instanceof Error ? e.message : "Recording could not start.",
      });
    }
  };

  const result = state.kind === "done" ? state.result : null;
  const saveTake = () => {
    if (!result || result.status !== "measured") return;
    save.mutate(
      {
        noteKey,
        speedHz: result.speedHz,
        depthCents: result.depthCents,
        offsetCents: result.offsetCents,
        voicedFraction: result.voicedFraction,
        toneSeconds: result.toneSeconds,
        loudnessSpeedHz: result.loudnessSpeedHz,
        loudnessDepthDb: result.loudnessDepthDb,
      },
      { onSuccess: () => setState({ kind: "done", result, saved: true }) },
    );
  };
  const earlier = (takes.data?.takes ?? []).filter((t) => t.noteKey === noteKey).slice(0, 5);

  return (
    <Section title="Take" id="take">
      <p className="mb-3 text-sm text-graphite">
        Record yourself playing {noteLabel} ({fmt(midiToHz(midi), 1)} Hz) for a few seconds. The sound is measured in this browser and
        never uploaded; only the numbers are saved.
      </p>
      <div className="flex flex-wrap items-center gap-3">
        {state.kind === "recording" ? (
          <Button kind="primary" onClick={() => void finish()}>
            Stop and measure
          </Button>
        ) : (
          <Button kind="primary" onClick={() => void record()} disabled={state.kind === "analysing"}>
            {result ? "Record again" : "Record a take"}
          </Button>
        )}
        {state.kind === "recording" ? (
          <div className="flex items-center gap-2 text-sm" aria-live="polite" data-testid="take-recording">
            <span className="tabular-nums">Recording {fmt(elapsed)} s</span>
            <span className="sr-only">input level</span>
            <span className="h-3 w-32 overflow-hidden rounded-full border border-rule bg-paper" aria-hidden="true">
              <span className="block h-full bg-role-start" style={{ width: `${Math.min(100, level * 400)}%` }} />
            </span>
          </div>
        ) : null}
        {state.kind === "analysing" ? <span className="text-sm" aria-live="polite">Measuring…</span> : null}
      </div>
      {state.kind === "error" ? (
        <p role="alert" className="mt-3 text-sm font-semibold text-danger">
          {state.message}
        </p>
      ) : null}

      {result ? (
        <div className="mt-4" data-testid="take-result" data-status={result.status}>
          <p className="text-sm font-semibold" aria-live="polite">
            {result.message}
          </p>
          {result.status === "measured" ? (
            <>
              <dl className="mt-3 grid grid-cols-2 gap-x-6 gap-y-3 sm:grid-cols-3 lg:grid-cols-6">
                <Figure label="Measured speed" value={fmt(result.speedHz, 2)} unit="Hz" testId="measured-speed" />
                <Figure label="Marked speed" value={fmt(marked?.speedHz ?? null, 1)} unit="Hz" />
                <Figure label="Measured depth" value={`±${fmt(result.depthCents, 1)}`} unit="c" testId="measured-depth" />
                <Figure label="Marked depth" value={marked ? `±${fmt(marked.depthCents, 0)}` : "–"} unit="c" />
                <Figure label="Pitch vs written" value={`${(result.offsetCents ?? 0) >= 0 ? "+" : ""}${fmt(result.offsetCents, 1)}`} unit="c" />
                <Figure label="Tone found" value={fmt(result.voicedFraction * 100, 0)} unit="% of take" testId="voiced" />
              </dl>
              <p className="mt-2 text-xs text-graphite">
                Depth is half the pitch swing (peak to peak ÷ 2), the median over {result.cycles} cycles.{" "}
                {result.loudnessSpeedHz !== null
                  ? `Loudness also pulses at ${fmt(result.loudnessSpeedHz, 1)} Hz, ±${fmt(result.loudnessDepthDb, 1)} dB — on the flute much of the vibrato is in loudness.`
                  : "No regular loudness pulse."}
              </p>
              <ContourPlot contour={result.contour} markedDepth={marked?.depthCents ?? null} />
              {canWrite ? (
                <div className="mt-3 flex items-center gap-3">
                  <Button onClick={saveTake} disabled={save.isPending || state.kind !== "done" || state.saved}>
                    {state.kind === "done" && state.saved ? "Take saved" : "Save this take"}
                  </Button>
                  {save.error ? (
                    <span role="alert" className="text-sm text-danger">
                      {save.error instanceof ApiError ? save.error.message : "The take could not be saved."}
                    </span>
                  ) : null}
                </div>
              ) : null}
            </>
          ) : null}
        </div>
      ) : null}

      {earlier.length > 0 ? <EarlierTakes takes={earlier} /> : null}
    </Section>
  );
}

function EarlierTakes({ takes }: { takes: TakeDto[] }) {
  return (
    <div className="mt-5">
      <h3 className="text-sm font-semibold">Saved takes of this note</h3>
      <table className="mt-1 w-full text-sm tabular-nums" data-testid="saved-takes">
        <thead className="text-left text-xs text-graphite">
          <tr>
            <th className="py-1 font-normal">When</th>
            <th className="font-normal">Speed</th>
            <th className="font-normal">Depth</th>
            <th className="font-normal">Pitch vs written</th>
            <th className="font-normal">Marked then</th>
          </tr>
        </thead>
        <tbody>
          {takes.map((t) => (
            <tr key={t.id} className="border-t border-rule">
              <td className="py-1">{new Date(t.createdAt).toLocaleString()}</td>
              <td>{fmt(t.speedHz, 2)} Hz</td>
              <td>±{fmt(t.depthCents, 1)} c</td>
              <td>{fmt(t.offsetCents, 1)} c</td>
              <td>{t.marked ? `${fmt(t.marked.speedHz, 1)} Hz, ±${fmt(t.marked.depthCents, 0)} c` : "not marked"}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
