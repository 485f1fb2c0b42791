"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useCallback, useLayoutEffect, useMemo, useRef, useState, type CSSProperties, type RefObject } from "react";
import type { AnalyzedNote, Suggestion } from "@/lib/analysis/types";
import { toState } from "@/lib/markings/changes";
import { noteDurations, resolutionsOf } from "@/lib/markings/durations";
import { noteLabel } from "@/lib/markings/note-labels";
import type { WrittenBar } from "@/lib/musicxml/bar-names";
import { formatNumber } from "@/lib/markings/pulses";
import type { MarkingDto } from "@/lib/markings/schema";
import { PAPERS, PX_PER_MM, contentWidthPx, standCopyHref, type StandCopyOptions } from "@/lib/stand-copy/options";
import { markedNoteRows } from "@/lib/stand-copy/table";
import { Legend } from "@/components/score/legend";
import { StandCopyScore } from "@/components/score/stand-copy-score";

export interface StandCopyData {
  partId: string;
  title: string;
  composer: string;
  keyLabel: string;
  tempo: number | null;
  playerName: string;
  xml: string;
  /** The server's note keys of the part: the engraved notes are keyed by them. */
  noteKeys: string[];
  markings: MarkingDto[];
  notes: AnalyzedNote[];
  /** The part's bars as written (lib/musicxml/bar-names.ts). */
  bars: WrittenBar[];
  /** Undecided suggestions (empty when the option is off). */
  suggestions: Suggestion[];
  resolutions: Record<string, string>;
  /** null when the option is off. */
  comments: { threadKey: string; authorName: string; body: string; createdAt: string }[] | null;
  options: StandCopyOptions;
}

/** Staff size on paper: 0.8 × OSMD's 40 px staff ≈ 8.5 mm, a usual size for a part. */
const PRINT_ZOOM = 0.8;

function fileStem(title: string): string {
  return title.replace(/[^\w\- ]+/g, "").trim().replace(/\s+/g, "-").toLowerCase() || "part";
}

/** Room kept on each side of the page when it is scaled down to a narrow screen, in CSS px. */
const SIDE_ROOM = 12;

/**
 * The scale at which the paper page fits the frame's width on screen (at most 1): a phone sees
 * the whole page, smaller, as it will print. Print and the PDF always use the true size.
 */
function useViewScale(frameRef: RefObject<HTMLDivElement | null>, pagePx: number): number {
  const [scale, setScale] = useState(1);
  useLayoutEffect(() => {
    const frame = frameRef.current;
    if (!frame) return;
    const fit = (available: number) => setScale(Math.min(1, Math.max(0.2, (available - 2 * SIDE_ROOM) / pagePx)));
    fit(frame.clientWidth);
    const observer = new ResizeObserver(([entry]) => fit(entry.contentRect.width));
    observer.observe(frame);
    return () => observer.disconnect();
  }, [frameRef, pagePx]);
  return scale;
}

/** The printable annotated copy of a part, with its print and PDF buttons. */
export function StandCopy({ data }: { data: StandCopyData }) {
  const router = useRouter();
  const { options } = data;
  const paper = PAPERS[options.paper];
  const width = contentWidthPx(paper);
  const legendRef = useRef<HTMLDivElement>(null);
  const frameRef = useRef<HTMLDivElement>(null);
  const viewScale = useViewScale(frameRef, width + 2 * paper.marginMm * PX_PER_MM);
  const [systems, setSystems] = useState<SVGSVGElement[]>([]);
  const [pdfState, setPdfState] = useState<{ kind: "idle" | "working" | "done" | "error"; message?: string }>({ kind: "idle" });

  const markings = useMemo(() => toState(data.markings), [data.markings]);
  const noteKeys = useMemo(() => ({ keys: data.noteKeys }), [data.noteKeys]);
  const durations = useMemo(() => noteDurations(data.notes, data.tempo), [data.notes, data.tempo]);
  const byKey = useMemo(() => new Map(data.notes.map((n) => [n.key, n])), [data.notes]);
  const suggestions = useMemo(
    () => data.suggestions.map((s) => ({ noteKey: s.note, role: s.role, confidence: s.confidence, resolvesTo: s.resolvesTo })),
    [data.suggestions],
  );
  const resolutions = useMemo(() => ({ ...resolutionsOf(data.suggestions), ...data.resolutions }), [data.suggestions, data.resolutions]);
  const rows = useMemo(() => markedNoteRows(data.markings, data.notes, data.tempo, data.bars), [data.markings, data.notes, data.tempo, data.bars]);
  const comments = useMemo(
    () => data.comments?.map((c) => ({ where: c.threadKey === "part" ? "Whole part" : noteLabel(c.threadKey, data.bars, byKey.get(c.threadKey)), author: c.authorName, body: c.body })) ?? null,
    [data.comments, byKey, data.bars],
  );
  const commentCounts = useMemo(() => {
    const out: Record<string, number> = {};
    for (const c of data.comments ?? []) if (c.threadKey !== "part") out[c.threadKey] = (out[c.threadKey] ?? 0) + 1;
    return out;
  }, [data.comments]);

  const meta = [data.keyLabel, data.tempo ? `♩ = ${formatNumber(data.tempo, 1)}` : null, `Player: ${data.playerName}`].filter(Boolean).join(" · ");

  const setOption = (patch: Partial<StandCopyOptions>) => router.replace(standCopyHref(data.partId, { ...options, ...patch }), { scroll: false });

  const downloadPdf = useCallback(async () => {
    setPdfState({ kind: "working" });
    try {
      const { buildStandCopyPdf } = await import("@/components/stand-copy/stand-copy-pdf");
      const blob = await buildStandCopyPdf({
        paper,
        paperName: options.paper,
        title: data.title,
        subtitle: [data.composer, meta].filter(Boolean),
        systems,
        legend: legendRef.current,
        rows,
        comments,
      });
      const url = URL.createObjectURL(blob);
      const a = document.createElement("a");
      a.href = url;
      a.download = `${fileStem(data.title)}-stand-copy-${options.paper}.pdf`;
      document.body.appendChild(a);
      a.click();
      a.remove();
      setTimeout(() => URL.revokeObjectURL(url), 60_000);
      setPdfState({ kind: "done", message: "The PDF is downloaded." });
    } catch (e) {
      setPdfState({ kind: "error", message: `The PDF could not be made: ${e instanceof Error ? e.message : String(e)}` });
    }
  }, [paper, options.paper, data.title, data.composer, meta, systems, rows, comments]);

  return (
    <div ref={frameRef} className="bg-paper-deep py-6 print:bg-white print:py-0" data-testid="stand-copy" data-paper={options.paper}>
      <style>{`@page { size: ${paper.cssSize}; margin: ${paper.marginMm}mm; }`}</style>

      <form className="no-print mx-auto mb-6 flex max-w-4xl flex-wrap items-end gap-x-6 gap-y-3 px-gutter" aria-label="Stand copy options" onSubmit={(e) => e.preventDefault()}>
        <fieldset className="flex items-center gap-3">
          <legend className="mb-1 text-sm font-semibold">Paper</legend>
          {(["a4", "letter"] as const).map((p) => (
            <label key={p} className="flex h-11 items-center gap-1.5 text-sm">
              <input type="radio" name="paper" value={p} checked={options.paper === p} onChange={() => setOption({ paper: p })} />
              {PAPERS[p].label}
            </label>
          ))}
        </fieldset>
        <label className="flex h-11 items-center gap-1.5 text-sm">
          <input type="checkbox" checked={options.comments} onChange={(e) => setOption({ comments: e.target.checked })} />
          Teacher’s comments
        </label>
        <label className="flex h-11 items-center gap-1.5 text-sm">
          <input type="checkbox" checked={options.suggestions} onChange={(e) => setOption({ suggestions: e.target.checked })} />
          Undecided suggestions
        </label>
        <span className="ml-auto flex flex-wrap items-center gap-2">
          <Link href={`/parts/${data.partId}`} className="inline-flex h-11 items-center px-2 text-sm text-graphite underline-offset-4 hover:underline">
            Back to the workspace
          </Link>
          <Link href={`/parts/${data.partId}/stand`} className="inline-flex h-11 items-center px-2 text-sm text-graphite underline-offset-4 hover:underline">
            Stand view
          </Link>
          <button type="button" onClick={() => window.print()} className="h-11 rounded border border-ink/30 px-4 text-sm font-medium hover:bg-paper">
            Print
          </button>
          <button
            type="button"
            onClick={downloadPdf}
            disabled={systems.length === 0 || pdfState.kind === "working"}
            className="h-11 rounded bg-ink px-4 text-sm font-medium text-paper disabled:cursor-not-allowed disabled:opacity-60"
          >
            {pdfState.kind === "working" ? "Making the PDF…" : "Download PDF"}
          </button>
        </span>
        <p className="w-full text-sm" role="status" aria-live="polite" data-testid="pdf-status">
          {pdfState.kind === "error" ? <span className="text-danger">{pdfState.message}</span> : pdfState.message}
        </p>
      </form>

      <article
        className="stand-page mx-auto bg-white text-ink shadow-[0_1px_8px_rgba(27,26,23,0.15)] [zoom:var(--stand-zoom)] print:!p-0 print:shadow-none print:[zoom:1]"
        style={{ width, boxSizing: "content-box", padding: `${paper.marginMm}mm`, "--stand-zoom": viewScale } as CSSProperties}
        data-view-scale={viewScale}
        aria-label={`Stand copy of ${data.title}`}
      >
        <header className="mb-2 border-b border-graphite/60 pb-2">
          <h1 className="font-serif text-2xl font-semibold leading-tight">{data.title}</h1>
          {data.composer ? <p className="font-serif text-lg">{data.composer}</p> : null}
          <p className="text-sm text-graphite" data-testid="stand-meta">{meta}</p>
        </header>

        <StandCopyScore
          // A new paper width is a new engraving (and new systems).
          key={options.paper}
          xml={data.xml}
          noteKeys={noteKeys}
          width={width}
          zoom={PRINT_ZOOM}
          markings={markings}
          suggestions={suggestions}
          resolutions={resolutions}
          durations={durations}
          commentCounts={commentCounts}
          onSystems={setSystems}
        />

        <div ref={legendRef} className="mt-6 break-inside-avoid">
          <Legend />
        </div>

        <section className="mt-6" aria-labelledby="marked-notes-title">
          <h2 id="marked-notes-title" className="mb-2 text-lg font-semibold break-after-avoid">Marked notes</h2>
          {rows.length === 0 ? (
            <p className="text-sm italic text-graphite">No note is marked yet.</p>
          ) : (
            <table className="w-full border-collapse text-left text-xs" data-testid="marked-notes">
              <thead>
                <tr className="border-b-2 border-ink">
                  {["Bar", "Note", "Role", "Depth", "Speed", "Placement", "Onset, shape", "Comment"].map((h) => (
                    <th key={h} scope="col" className="px-1 py-1 font-semibold">{h}</th>
                  ))}
                </tr>
              </thead>
              <tbody>
                {rows.map((r) => (
                  <tr key={r.noteKey} className="break-inside-avoid border-b border-rule align-top" data-note-key={r.noteKey}>
                    <td className="px-1 py-0.5 tabular-nums">{r.bar}</td>
                    <td className="px-1 py-0.5">{r.note}</td>
                    <td className="px-1 py-0.5">{r.role}</td>
                    <td className="px-1 py-0.5 tabular-nums">{r.depth}</td>
                    <td className="px-1 py-0.5 tabular-nums">{r.speed}</td>
                    <td className="px-1 py-0.5">{r.placement}</td>
                    <td className="px-1 py-0.5">{r.onsetShape}</td>
                    <td className="px-1 py-0.5">{r.comment}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
        </section>

        {comments ? (
          <section className="mt-6 break-inside-avoid" aria-labelledby="comments-title">
            <h2 id="comments-title" className="mb-2 text-lg font-semibold">Comments</h2>
            {comments.length === 0 ? (
              <p className="text-sm italic text-graphite">There are no comments on this part.</p>
            ) : (
              <ul className="space-y-1 text-sm">
                {comments.map((c, i) => (
                  <li key={i} className="break-inside-avoid">
                    <span className="font-semibold">{c.where}</span> — {c.author}: {c.body}
                  </li>
                ))}
              </ul>
            )}
          </section>
        ) : null}
      </article>
    </div>
  );
}
