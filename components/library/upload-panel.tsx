"use client";

import { useRouter } from "next/navigation";
import { useId, useRef, useState } from "react";
import { useQueryClient } from "@tanstack/react-query";
import { describeMarkingImport } from "@/lib/parts/import-report";
import { partChoiceLabels, partDisplayName } from "@/lib/parts/part-names";
import { ApiError } from "@/components/client/fetch-json";
import { ErrorDetails } from "@/components/ui/error-details";
import { partKeys } from "@/components/client/keys";
import { describeNotices } from "@/lib/musicxml/read/bar-lengths";
import { uploadPart, useChoosePart, useSamples, useTrySample, type UploadResult } from "./api";

type UploadState =
  | { phase: "idle" }
  | { phase: "sending"; fileName: string; fraction: number }
  | { phase: "reading"; fileName: string }
  | { phase: "choose"; fileName: string; result: UploadResult }
  | { phase: "imported"; fileName: string; result: UploadResult }
  | { phase: "error"; fileName: string; message: string; technical: string };

const ACCEPT = ".musicxml,.xml,.mxl";

/** The message in the player's words, and the technical detail for the "Details" toggle. */
function errorText(err: unknown): { message: string; technical: string } {
  if (err instanceof ApiError) return { message: err.message, technical: err.technical };
  return { message: "The file could not be sent. Check your connection and try again; nothing was lost.", technical: String(err) };
}

export function UploadPanel() {
  const router = useRouter();
  const qc = useQueryClient();
  const inputId = useId();
  const inputRef = useRef<HTMLInputElement>(null);
  const [state, setState] = useState<UploadState>({ phase: "idle" });
  const [dragging, setDragging] = useState(false);
  const samples = useSamples();
  const trySample = useTrySample();
  const choose = useChoosePart();
  const [sample, setSample] = useState("");

  const finish = (result: UploadResult, fileName: string) => {
    qc.invalidateQueries({ queryKey: partKeys.all });
    if (result.parts.length > 1) setState({ phase: "choose", fileName, result });
    // Markings that came in with the file are worth a pause: the player reads what was imported
    // (and what could not be) before the part opens.
    else if (describeMarkingImport(result) || result.notices.length > 0) setState({ phase: "imported", fileName, result });
    else router.push(result.url);
  };

  const start = async (file: File) => {
    setState({ phase: "sending", fileName: file.name, fraction: 0 });
    try {
      const result = await uploadPart(
        file,
        (fraction) => setState({ phase: "sending", fileName: file.name, fraction }),
        () => setState({ phase: "reading", fileName: file.name }),
      );
      finish(result, file.name);
    } catch (err) {
      setState({ phase: "error", fileName: file.name, ...errorText(err) });
    }
  };

  const busy = state.phase === "sending" || state.phase === "reading" || trySample.isPending;

  return (
    <section aria-labelledby={`${inputId}-title`} className="rounded-card border border-rule bg-paper-card p-5">
      <h2 id={`${inputId}-title`} className="text-lg font-semibold">Bring a part in</h2>
      <div
        onDragOver={(e) => {
          e.preventDefault();
          setDragging(true);
        }}
        onDragLeave={() => setDragging(false)}
        onDrop={(e) => {
          e.preventDefault();
          setDragging(false);
          const file = e.dataTransfer.files[0];
          if (file && !busy) void start(file);
        }}
        className={`mt-3 flex flex-col items-center justify-center gap-2 rounded-card border-2 border-dashed px-4 py-6 text-center ${dragging ? "border-accent bg-paper-deep" : "border-rule"}`}
      >
        <p className="text-graphite">Drop a MusicXML file here (.musicxml, .xml or compressed .mxl)</p>
        <label htmlFor={inputId} className="cursor-pointer rounded-card bg-accent px-4 py-2 font-semibold text-white hover:bg-accent-strong">
          Choose a file
        </label>
        <input
          ref={inputRef}
          id={inputId}
          type="file"
          accept={ACCEPT}
          className="sr-only"
          disabled={busy}
          onChange={(e) => {
            const file = e.target.files?.[0];
            if (file) void start(file);
            e.target.value = "";
          }}
        />
      </div>

      <div aria-live="polite" className="mt-3 min-h-6">
        {state.phase === "sending" && (
          <div>
            <p className="text-sm">Sending {state.fileName}… {Math.round(state.fraction * 100)}%</p>
            <progress className="mt-1 h-2 w-full" max={1} value={state.fraction} aria-label="Upload progress" />
          </div>
        )}
        {state.phase === "reading" && <p className="text-sm">Reading and analysing {state.fileName}…</p>}
        {state.phase === "error" && (
          <div role="alert" className="rounded-card border border-danger/40 bg-paper p-3 text-sm">
            <p className="font-semibold">{state.fileName} could not be used.</p>
            <p className="mt-1">{state.message}</p>
            <ErrorDetails technical={state.technical} />
          </div>
        )}
        {(state.phase === "choose" || state.phase === "imported") && <ImportNotice fileName={state.fileName} result={state.result} />}
        {state.phase === "imported" && (
          <button type="button" autoFocus onClick={() => router.push(state.result.url)} className="mt-3 rounded-card bg-accent px-4 py-2 font-semibold text-white hover:bg-accent-strong">
            Open the part
          </button>
        )}
        {state.phase === "choose" && (
          <PartChooser
            result={state.result}
            busy={choose.isPending}
            onChoose={async (chosenPart) => {
              if (chosenPart !== state.result.chosenPart) await choose.mutateAsync({ partId: state.result.id, chosenPart });
              router.push(state.result.url);
            }}
          />
        )}
      </div>

      <div className="mt-4 flex flex-wrap items-end gap-2 border-t border-rule pt-4">
        <label className="flex flex-col text-sm">
          <span className="text-graphite">Nothing to upload yet? Try one of our sample parts</span>
          <select
            className="mt-1 rounded-card border border-rule bg-paper px-3 py-2"
            value={sample}
            onChange={(e) => setSample(e.target.value)}
            aria-label="Sample part"
          >
            <option value="">Choose a sample…</option>
            {samples.data?.samples.map((s) => (
              <option key={s} value={s}>{s.replace(/\.(musicxml|mxl)$/, "").replace(/-/g, " ")}</option>
            ))}
          </select>
        </label>
        <button
          type="button"
          disabled={!sample || busy}
          onClick={() =>
            trySample.mutate(sample, {
              onSuccess: (r) => finish(r, sample),
              onError: (e) => setState({ phase: "error", fileName: sample, ...errorText(e) }),
            })
          }
          className="rounded-card border border-ink/30 px-4 py-2 font-semibold disabled:opacity-50"
        >
          Try this sample
        </button>
      </div>
    </section>
  );
}

/** What came in with the file: the markings imported from an Ondula export, and any left out. */
function ImportNotice({ fileName, result }: { fileName: string; result: UploadResult }) {
  const report = describeMarkingImport(result);
  const bars = describeNotices(result.notices);
  if (!report && !bars) return null;
  return (
    <div role="status" className="mb-3 rounded-card border border-rule bg-paper p-3 text-sm" data-testid="import-notice">
      {report && (
        <>
          <p className="font-semibold">{report.headline}</p>
          <p className="mt-1 text-graphite">
            {fileName} carried Ondula markings; they are now the part&rsquo;s markings, and one undo in the workspace takes them all back.
          </p>
          {report.details ? <p className="mt-1">{report.details}</p> : null}
        </>
      )}
      {bars && (
        <p className={report ? "mt-2" : ""} data-testid="read-notices">
          {bars}
        </p>
      )}
    </div>
  );
}

function PartChooser({ result, busy, onChoose }: { result: UploadResult; busy: boolean; onChoose: (id: string) => void }) {
  const [chosen, setChosen] = useState(result.chosenPart);
  // A part that carries its id as its name (as stored before names were given) reads "Part 1".
  const labels = partChoiceLabels(result.parts.map((p, i) => ({ name: p.name === p.id ? partDisplayName("", i) : p.name })));
  return (
    <form
      className="rounded-card border border-rule bg-paper p-3"
      onSubmit={(e) => {
        e.preventDefault();
        onChoose(chosen);
      }}
    >
      <fieldset>
        <legend className="font-semibold">This score has several parts. Which one do you play?</legend>
        <p className="text-sm text-graphite">The others stay with the part as harmonic context for the suggestions.</p>
        {result.parts.map((p, i) => (
          <label key={p.id} className="mt-2 flex items-center gap-2">
            <input type="radio" name="chosenPart" value={p.id} checked={chosen === p.id} onChange={() => setChosen(p.id)} />
            {labels[i]}
          </label>
        ))}
      </fieldset>
      <button type="submit" disabled={busy} className="mt-3 rounded-card bg-accent px-4 py-2 font-semibold text-white">
        Open this part
      </button>
    </form>
  );
}
