"use client";

import { useQueryClient } from "@tanstack/react-query";
import Link from "next/link";
import { useCallback, useEffect, useMemo, useRef, useState, type KeyboardEvent } from "react";
import type { PhraseResult, Role } from "@/lib/analysis/types";
import {
  acceptSuggestions, clearSelection, patchSelection, setSelection, toState, valuesOf, sameValues,
} from "@/lib/markings/changes";
import { noteDurations, resolutionsOf } from "@/lib/markings/durations";
import { noteLabel, selectionLabel } from "@/lib/markings/note-labels";
import { writtenBarsFromText } from "@/lib/musicxml/bar-names";
import { formatNumber } from "@/lib/markings/pulses";
import { ROLE_INFO } from "@/lib/markings/roles";
import type { MarkingValues } from "@/lib/markings/schema";
import type { Move } from "@/lib/markings/selection";
import { pendingSuggestions } from "@/lib/markings/suggestions";
import { useAnalysis } from "@/components/score/api/get-analysis";
import { useSetLine } from "@/components/score/api/set-line";
import { LineChoice } from "@/components/score/line-choice";
import { useHistory } from "@/components/score/api/get-history";
import { useMarkings } from "@/components/score/api/get-markings";
import { useMusicXml } from "@/components/score/api/get-musicxml";
import { useNoteKeys } from "@/components/score/api/get-note-keys";
import type { ServerNoteKeys } from "@/components/score/osmd-note-keys";
import { OPENING_BARS } from "@/lib/engraving/opening";
import { usePart } from "@/components/score/api/get-part";
import { useCommitMarkings } from "@/components/score/api/save-marking";
import { useSaveStatus } from "@/components/score/api/save-state";
import { resolveConflict, useConflicts, useSaveError, type Conflict } from "@/components/score/api/write-state";
import { useDecide, useDecisions } from "@/components/score/api/suggestion-decisions";
import { useHistoryStep } from "@/components/score/api/undo-redo";
import { AuditionControl } from "@/components/score/audition-control";
import { ConflictPrompt } from "@/components/score/conflict-prompt";
import { ExportMenu } from "@/components/score/export-menu";
import { WorkspaceHint } from "@/components/score/workspace-hint";
import { WorkingTempo } from "@/components/score/working-tempo";
import { EditorStoreProvider, useEditorActions, useEditorStore, useEditorStoreApi } from "@/components/score/editor-store";
import { Legend } from "@/components/score/legend";
import { MarkingOverlay } from "@/components/score/marking-overlay";
import { MarkingPanel } from "@/components/score/marking-panel";
import { PhraseMap } from "@/components/score/phrase-map";
import { partNameOf, soundingSentence, transpositionOf } from "@/lib/parts/transposition";
import { SaveIndicator } from "@/components/score/save-indicator";
import { useLeaveWarning } from "@/components/score/use-leave-warning";
import { ScoreView, type ScoreLayout } from "@/components/score/score-view";
import { SuggestionsPanel } from "@/components/score/suggestions-panel";
import { fitZoom } from "@/components/score/zoom";
import { useNotifications } from "@/components/client/notifications";
import { useCommentCounts } from "@/components/sharing/api";
import { AssignOnNote } from "@/components/assignments/assign-on-note";
import { DiscussionPanel } from "@/components/sharing/discussion-panel";
import { ShareButton } from "@/components/sharing/share-dialog";
import { UnreadBadge } from "@/components/ui/unread-badge";
import { CountBadge } from "@/components/ui/count-badge";

/**
 * The marking workspace of one part: the engraved score with our overlay, and its panels.
 * `viewerId`: the signed-in person, so the discussion knows which comments are theirs.
 * `opening`: a long part's first bars as the page sent them (its whole text is fetched), and
 * `openingKeys` the server's note keys of those bars (the whole list is fetched with the text).
 */
export function Workspace({ partId, viewerId = "", opening = null, openingKeys = null }: { partId: string; viewerId?: string; opening?: string | null; openingKeys?: string[] | null }) {
  return (
    <EditorStoreProvider partId={partId}>
      <WorkspaceScreen partId={partId} viewerId={viewerId} opening={opening} openingKeys={openingKeys} />
    </EditorStoreProvider>
  );
}

/** A stable empty list: the suggestions panel ranks again only when the analysis changes. */
const NO_PHRASES: PhraseResult[] = [];

const ARROWS: Record<string, Move> = {
  ArrowRight: "next",
  ArrowLeft: "previous",
  ArrowDown: "next-bar",
  ArrowUp: "previous-bar",
  Home: "first",
  End: "last",
};

function isTyping(target: EventTarget | null): boolean {
  const el = target as HTMLElement | null;
  if (!el) return false;
  return el.isContentEditable || ["INPUT", "TEXTAREA", "SELECT"].includes(el.tagName);
}

function prefersReducedMotion(): boolean {
  return typeof window !== "undefined" && window.matchMedia?.("(prefers-reduced-motion: reduce)").matches === true;
}

function WorkspaceScreen({ partId, viewerId, opening, openingKeys }: { partId: string; viewerId: string; opening: string | null; openingKeys: string[] | null }) {
  const part = usePart(partId);
  // What the first drawing does not need is asked for once the score is on the screen (or could
  // not be engraved): on a small machine the requests and the server's answers would otherwise
  // compete with the engraving and delay its first paint. That includes a long part's whole text:
  // its opening came with the page, and the whole is drawn only when the page is idle.
  const [scoreSettled, setScoreSettled] = useState(false);
  const xml = useMusicXml(partId, { enabled: opening === null || scoreSettled });
  // The server's keys of the drawn notes: a short part's came with the page, a long part's
  // opening's too, and its whole list comes with its whole text.
  const wholeKeys = useNoteKeys(partId, { enabled: opening === null || scoreSettled });
  const noteKeys = useMemo<ServerNoteKeys | null>(
    () => (wholeKeys.data ? { keys: wholeKeys.data.keys } : openingKeys ? { keys: openingKeys, measures: OPENING_BARS } : null),
    [wholeKeys.data, openingKeys],
  );
  // What is known of the text so far: the whole, else the opening (the same header and first bars).
  const text = xml.data ?? opening ?? undefined;
  const afterScore = { enabled: scoreSettled || xml.isError };
  // The player's line of a two-player staff is part of the analysis' key: a change asks again.
  const analysis = useAnalysis(partId, { ...afterScore, line: part.data?.line });
  const setLine = useSetLine(partId);
  const markingsQuery = useMarkings(partId);
  const decisionsQuery = useDecisions(partId);
  const history = useHistory(partId, afterScore);
  const queryClient = useQueryClient();
  const saveStatus = useSaveStatus(partId);
  const saveState = saveStatus.state;
  // Edits still on their way, or waiting for the player's choice, live only in this page.
  useLeaveWarning(saveStatus.waiting > 0 || saveState === "conflict");
  const saveError = useSaveError(queryClient, partId);
  const conflicts = useConflicts(queryClient, partId);
  const commit = useCommitMarkings(partId);
  const undo = useHistoryStep(partId, "undo");
  const redo = useHistoryStep(partId, "redo");
  const decide = useDecide(partId);

  const store = useEditorStoreApi();
  const actions = useEditorActions();
  const selection = useEditorStore((s) => s.selection);
  const boxes = useEditorStore((s) => s.boxes);
  const zoom = useEditorStore((s) => s.zoom);
  const panelOpen = useEditorStore((s) => s.panelOpen);
  const sideView = useEditorStore((s) => s.sideView);
  const legendOpen = useEditorStore((s) => s.legendOpen);
  const clipboard = useEditorStore((s) => s.clipboard);
  const reveal = useEditorStore((s) => s.reveal);

  const scrollerRef = useRef<HTMLDivElement>(null);
  const scoreRef = useRef<HTMLDivElement>(null);
  const railRef = useRef<HTMLElement>(null);
  const [size, setSize] = useState<{ width: number; height: number; systems?: ScoreLayout["systems"] }>({ width: 0, height: 0 });

  const canEdit = part.data?.permission === "owner";
  const commentCounts = useCommentCounts(partId, afterScore);
  const unread = useNotifications(partId, afterScore).data?.unread ?? 0;
  const tempo = part.data?.tempo ?? null;
  const markings = useMemo(() => toState(markingsQuery.data?.markings ?? []), [markingsQuery.data]);

  const noteOrder = useMemo(() => (analysis.data?.notes ?? []).map((n) => n.key), [analysis.data]);
  // A transposing part is shown as written; the player is told how it sounds.
  const sounding = useMemo(() => {
    const t = text ? transpositionOf(text) : null;
    return t ? soundingSentence(partNameOf(text!), t, analysis.data?.key ?? null) : null;
  }, [text, analysis.data]);
  const noteMeasures = useMemo(() => (analysis.data?.notes ?? []).map((n) => n.measure), [analysis.data]);
  const notesByKey = useMemo(() => new Map((analysis.data?.notes ?? []).map((n) => [n.key, n])), [analysis.data]);
  const chosenPartId = part.data?.chosenPartId;
  const bars = useMemo(() => (text && chosenPartId ? writtenBarsFromText(text, chosenPartId) : []), [text, chosenPartId]);
  const labelOf = useCallback((key: string) => noteLabel(key, bars, notesByKey.get(key)), [bars, notesByKey]);
  const durations = useMemo(() => noteDurations(analysis.data?.notes ?? [], tempo), [analysis.data, tempo]);
  const resolutions = useMemo(() => resolutionsOf(analysis.data?.suggestions ?? []), [analysis.data]);
  const decisions = useMemo(() => decisionsQuery.data?.decisions ?? [], [decisionsQuery.data]);
  const pending = useMemo(
    () => pendingSuggestions(analysis.data?.suggestions ?? [], decisions, markings),
    [analysis.data, decisions, markings],
  );
  const overlaySuggestions = useMemo(
    () => pending.map((s) => ({ noteKey: s.note, role: s.role, confidence: s.confidence, resolvesTo: s.resolvesTo })),
    [pending],
  );

  // A link from a notification (`?note=<key>` or `?thread=part`) opens that discussion once the
  // notes are laid out; people the part is shared with start on the discussion.
  const deepLinked = useRef(false);
  const permission = part.data?.permission;
  useEffect(() => {
    if (deepLinked.current || boxes.length === 0 || !permission) return;
    deepLinked.current = true;
    const params = new URLSearchParams(window.location.search);
    const note = params.get("note");
    if (note && boxes.some((b) => b.key === note)) {
      actions.select(note);
      actions.reveal(note);
      actions.setSideView("discussion");
    } else if (params.get("thread") || permission !== "owner") {
      actions.setSideView("discussion");
    }
  }, [boxes, permission, actions]);

  const settleScore = useCallback(() => setScoreSettled(true), []);
  const onLayout = useCallback(
    (layout: ScoreLayout) => {
      actions.setLayout(layout.boxes);
      setSize({ width: layout.width, height: layout.height, systems: layout.systems });
    },
    [actions],
  );

  // ——— gestures ———
  const keys = selection.keys;
  const focusMarking = selection.focus ? markings[selection.focus] : undefined;
  const patch = useCallback(
    (p: Partial<MarkingValues>) => {
      if (!canEdit || keys.length === 0) return;
      commit(patchSelection(markings, keys, p));
    },
    [canEdit, keys, commit, markings],
  );
  const clear = useCallback(() => {
    if (canEdit && keys.length) commit(clearSelection(markings, keys));
  }, [canEdit, keys, commit, markings]);
  const copy = useCallback(() => {
    if (focusMarking) actions.copy(valuesOf(focusMarking));
  }, [focusMarking, actions]);
  const paste = useCallback(() => {
    if (canEdit && clipboard && keys.length) commit(setSelection(keys, clipboard));
  }, [canEdit, clipboard, keys, commit]);
  const accept = useCallback(
    (items: { noteKey: string; role: Role }[]) => {
      if (!canEdit) return;
      commit(acceptSuggestions(markings, items));
      for (const item of items) decide.mutate({ ...item, decision: "accepted" });
    },
    [canEdit, commit, markings, decide],
  );
  const dismiss = useCallback((item: { noteKey: string; role: Role }) => decide.mutate({ ...item, decision: "dismissed" }), [decide]);
  const show = useCallback(
    (key: string) => {
      actions.select(key);
      actions.reveal(key);
    },
    [actions],
  );
  const keepMine = useCallback(
    (c: Conflict) => {
      resolveConflict(queryClient, partId, c.noteKey);
      // The cache now holds the current marking (and its version): writing mine over it is a
      // deliberate choice, sent with that version.
      commit(c.mine ? setSelection([c.noteKey], c.mine) : [{ type: "remove", noteKey: c.noteKey }]);
    },
    [queryClient, partId, commit],
  );
  const takeTheirs = useCallback((c: Conflict) => resolveConflict(queryClient, partId, c.noteKey), [queryClient, partId]);

  const canUndo = history.data?.canUndo ?? false;
  const canRedo = history.data?.canRedo ?? false;
  const doUndo = useCallback(() => canEdit && undo.mutate(), [canEdit, undo]);
  const doRedo = useCallback(() => canEdit && redo.mutate(), [canEdit, redo]);

  // Undo/redo anywhere on the page, except while typing (the field's own undo wins there).
  useEffect(() => {
    const onKey = (e: globalThis.KeyboardEvent) => {
      if (!(e.ctrlKey || e.metaKey) || isTyping(e.target)) return;
      const k = e.key.toLowerCase();
      if (k === "z" && !e.shiftKey) {
        e.preventDefault();
        doUndo();
      } else if ((k === "z" && e.shiftKey) || k === "y") {
        e.preventDefault();
        doRedo();
      }
    };
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  }, [doUndo, doRedo]);

  const openPanel = useCallback(() => {
    actions.setPanelOpen(true);
    requestAnimationFrame(() => railRef.current?.querySelector<HTMLElement>("input:not([type=range]):not([disabled])")?.focus());
  }, [actions]);
  // "Accept and edit": the suggestion becomes a marking, and its note opens in the marking panel
  // (depth and speed to set, or the role to change).
  const acceptAndEdit = useCallback(
    (item: { noteKey: string; role: Role }) => {
      accept([item]);
      actions.select(item.noteKey);
      actions.reveal(item.noteKey);
      openPanel();
    },
    [accept, actions, openPanel],
  );

  const onScoreKey = (e: KeyboardEvent<HTMLDivElement>) => {
    const move = ARROWS[e.key];
    if (move) {
      e.preventDefault();
      actions.move(move, e.shiftKey);
      return;
    }
    if (e.key === "Escape") {
      actions.clearSelection();
    } else if (e.key === "Enter" && keys.length) {
      e.preventDefault();
      openPanel();
    } else if ((e.key === "Delete" || e.key === "Backspace") && keys.length) {
      e.preventDefault();
      clear();
    } else if ((e.ctrlKey || e.metaKey) && e.key.toLowerCase() === "c") {
      copy();
    } else if ((e.ctrlKey || e.metaKey) && e.key.toLowerCase() === "v") {
      e.preventDefault();
      paste();
    } else if ((e.ctrlKey || e.metaKey) && e.key.toLowerCase() === "a") {
      e.preventDefault();
      actions.selectKeys(store.getState().order.map((n) => n.key));
    }
  };

  const onNoteClick = useCallback(
    (key: string, mode: "only" | "toggle" | "extend") => {
      actions.select(key, mode);
      // While reading the discussion, another note opens its discussion rather than the marking.
      if (store.getState().sideView === "discussion") actions.setSideView("discussion");
      else actions.setPanelOpen(true);
      scoreRef.current?.focus({ preventScroll: true });
    },
    [actions, store],
  );

  // Keep the focused note in view when the keyboard moves it.
  useEffect(() => {
    const box = selection.focus ? store.getState().boxByKey.get(selection.focus) : undefined;
    const scroller = scrollerRef.current;
    if (!box || !scroller) return;
    const top = box.staffTop - 90 * zoom;
    const bottom = box.y + box.height + 40;
    if (top < scroller.scrollTop || bottom > scroller.scrollTop + scroller.clientHeight) {
      scroller.scrollTo?.({ top: Math.max(0, top - 20) });
    }
  }, [selection.focus, store, zoom]);

  // "Show me", the phrase map, undo: bring the note to the upper third of the view.
  useEffect(() => {
    if (!reveal) return;
    const box = store.getState().boxByKey.get(reveal.key);
    const scroller = scrollerRef.current;
    if (!box || !scroller) return;
    scroller.scrollTo?.({ top: Math.max(0, box.staffTop - scroller.clientHeight / 3), behavior: prefersReducedMotion() ? "auto" : "smooth" });
    scoreRef.current?.focus({ preventScroll: true });
  }, [reveal, store]);

  const announce = useMemo(() => {
    if (!selection.focus) return "No note selected.";
    const m = markings[selection.focus];
    const what = m
      ? m.depthCents === 0
        ? "marked no vibrato"
        : `marked ${formatNumber(m.depthCents, 1)}¢, ${formatNumber(m.speedHz, 2)} Hz${m.role ? `, ${ROLE_INFO[m.role].label}` : ""}`
      : "not marked";
    return `${labelOf(selection.focus)}, ${what}.${keys.length > 1 ? ` ${keys.length} notes selected.` : ""}`;
  }, [selection.focus, markings, labelOf, keys.length]);

  const mixed = useMemo(() => {
    const first = keys[0] ? markings[keys[0]] : undefined;
    return keys.some((k) => {
      const m = markings[k];
      return Boolean(m) !== Boolean(first) || (m && first && !sameValues(m, first));
    });
  }, [keys, markings]);

  if (part.isError) {
    return <p className="p-gutter text-danger" role="alert">This part could not be opened: {part.error.message}</p>;
  }

  const rail =
    sideView === "discussion" && part.data ? (
      <DiscussionPanel
        key={selection.focus ?? "part"}
        partId={partId}
        permission={part.data.permission}
        viewerId={viewerId}
        noteKey={selection.focus}
        currentMarking={focusMarking ?? null}
        labelOf={labelOf}
        onShowNote={show}
        renderNotePractice={(noteKey, label) => <AssignOnNote partId={partId} noteKey={noteKey} label={label} />}
      />
    ) : sideView === "suggestions" || keys.length === 0 ? (
      <SuggestionsPanel
        pending={pending}
        decidedCount={decisions.length}
        labelOf={labelOf}
        canEdit={canEdit}
        onAccept={accept}
        onDismiss={dismiss}
        onEdit={acceptAndEdit}
        onShow={show}
        phrases={analysis.data?.phrases ?? NO_PHRASES}
        noteOrder={noteOrder}
        status={analysis.data ? "ready" : analysis.isError ? "error" : "loading"}
        errorMessage={analysis.error?.message}
        onRetry={() => void analysis.refetch()}
      />
    ) : (
      <MarkingPanel
        key={selection.focus ?? "none"}
        count={keys.length}
        label={selectionLabel(keys, labelOf, bars)}
        values={focusMarking ? valuesOf(focusMarking) : null}
        mixed={mixed}
        tempo={tempo}
        canEdit={canEdit}
        clipboard={clipboard}
        onPatch={patch}
        onClear={clear}
        onCopy={copy}
        onPaste={paste}
      />
    );

  return (
    // A frame the height of the screen, the score scrolling inside it, where the screen is wide
    // and tall enough to leave the music room under the toolbar (the site header is one line
    // there); on a phone the page scrolls as a whole instead, so the toolbar moves away with
    // the music.
    <div className="flex flex-col bg-paper sm:[@media(min-height:40rem)]:h-[calc(100dvh-3.6rem)]" data-testid="workspace">
      <div className="no-print flex flex-wrap items-center gap-x-4 gap-y-1 border-b border-rule px-gutter py-2">
        <div className="w-full min-w-0 2xl:w-auto 2xl:flex-1">
          <h1 className="truncate text-xl font-semibold leading-tight">{part.data?.title ?? "…"}</h1>
          <p className="text-sm text-graphite">
            {[part.data?.composer, part.data?.keyLabel, part.data ? `${part.data.measureCount} bars` : null].filter(Boolean).join(" · ")}
            {part.data ? (
              <>
                {" · "}
                <WorkingTempo partId={partId} tempo={tempo} writtenTempo={part.data.writtenTempo} canEdit={canEdit} />
              </>
            ) : null}
          </p>
          {sounding ? (
            <p className="text-sm text-graphite" data-testid="sounding-key">
              {sounding}
            </p>
          ) : null}
        </div>
        <SaveIndicator state={saveState} error={saveError} waiting={saveStatus.waiting} online={saveStatus.online} />
        <div className="flex items-center gap-1" role="group" aria-label="History">
          <ToolButton onClick={doUndo} disabled={!canEdit || !canUndo} label="Undo (Ctrl+Z)">
            ↶ Undo
          </ToolButton>
          <ToolButton onClick={doRedo} disabled={!canEdit || !canRedo} label="Redo (Ctrl+Shift+Z)">
            ↷ Redo
          </ToolButton>
        </div>
        <div className="flex items-center gap-1" role="group" aria-label="Zoom">
          <ToolButton onClick={() => actions.zoomBy(-0.1)} label="Zoom out">
            −
          </ToolButton>
          <span className="w-12 text-center text-sm tabular-nums" aria-live="polite" data-testid="zoom">
            {Math.round(zoom * 100)}%
          </span>
          <ToolButton onClick={() => actions.zoomBy(0.1)} label="Zoom in">
            +
          </ToolButton>
          <ToolButton onClick={() => actions.setZoom(fitZoom(scrollerRef.current?.clientWidth ?? 1000))} label="Fit width">
            Fit width
          </ToolButton>
        </div>
        <div className="flex flex-wrap items-center gap-1">
          {canEdit && part.data ? <ShareButton partId={partId} partTitle={part.data.title} /> : null}
          <ToolButton
            onClick={() => actions.setSideView("suggestions")}
            // Named by what it shows, "Suggestions" and the count badge's "N to decide" (WCAG 2.5.3).
            pressed={panelOpen && (sideView === "suggestions" || keys.length === 0)}
          >
            Suggestions{" "}
            <CountBadge count={pending.length} noun="to decide" className="ml-1" />
          </ToolButton>
          <ToolButton onClick={() => actions.setLegendOpen(!legendOpen)} label="Legend" pressed={legendOpen}>
            Legend
          </ToolButton>
          <Link href={`/parts/${partId}/practice`} className="flex h-11 items-center rounded px-2.5 text-sm font-medium text-ink underline-offset-4 hover:bg-paper-deep hover:underline">
            Practise
          </Link>
          <Link href={`/parts/${partId}/stand`} className="flex h-11 items-center rounded px-2.5 text-sm font-medium text-ink underline-offset-4 hover:bg-paper-deep hover:underline">
            Stand view
          </Link>
          <ExportMenu partId={partId} />
        </div>
      </div>

      {analysis.data?.lines && part.data ? (
        // A staff carrying two players: whose line the analysis, practice and Listen follow.
        <div className="no-print border-b border-rule px-gutter py-1">
          <LineChoice
            writtenAs={analysis.data.lines.writtenAs}
            line={part.data.line}
            canEdit={canEdit}
            saving={setLine.isPending}
            error={setLine.error?.message ?? null}
            onChange={(line) => setLine.mutate(line)}
          />
        </div>
      ) : null}

      <div className="no-print border-b border-rule px-gutter">
        <AuditionControl keys={keys} notes={analysis.data?.notes ?? []} phrases={analysis.data?.phrases ?? []} markings={markings} tempo={tempo} />
      </div>

      {analysis.data && analysis.data.phrases.length > 0 ? (
        <div className="no-print border-b border-rule px-gutter pb-1 pt-1">
          <PhraseMap
            noteOrder={noteOrder}
            phrases={analysis.data.phrases}
            noteMeasures={noteMeasures}
            bars={bars}
            localKeys={analysis.data.localKeys}
            markings={markings}
            labelOf={labelOf}
            onJump={show}
          />
        </div>
      ) : null}

      {legendOpen ? (
        <div className="border-b border-rule bg-paper-card px-gutter py-4">
          <Legend />
        </div>
      ) : null}

      <WorkspaceHint showHint={canEdit && text !== undefined && Object.keys(markings).length === 0} />

      <div className="relative flex min-h-0 flex-1">
        <div ref={scrollerRef} className="min-w-0 flex-1 overflow-auto" data-testid="score-scroller" data-scroll-x>
          <div
            ref={scoreRef}
            tabIndex={0}
            role="group"
            aria-roledescription="score"
            aria-label={`Score of ${part.data?.title ?? "the part"}`}
            aria-describedby="score-help"
            onKeyDown={onScoreKey}
            className={`mx-auto max-w-[1400px] px-2 outline-none focus-visible:ring-2 focus-visible:ring-inset focus-visible:ring-accent ${panelOpen ? "pb-[46dvh] lg:pb-24" : "pb-24"}`}
          >
            <p id="score-help" className="sr-only">
              Arrow keys move from note to note, up and down move by bar, Shift extends the selection, Enter opens the marking
              panel, Escape clears the selection, Delete clears the marking, Ctrl+C and Ctrl+V copy and paste a marking.
            </p>
            {xml.isError && opening ? (
              <p className="p-gutter text-danger" role="alert">The rest of the music could not be loaded: {xml.error.message}</p>
            ) : null}
            {text ? (
              <ScoreView xml={xml.data} opening={opening} zoom={zoom} onLayout={onLayout} onSettled={settleScore} noteKeys={noteKeys}>
                <MarkingOverlay
                  boxes={boxes}
                  width={size.width}
                  height={size.height}
                  scale={zoom}
                  markings={markings}
                  suggestions={overlaySuggestions}
                  resolutions={resolutions}
                  durations={durations}
                  commentCounts={commentCounts}
                  systems={size.systems}
                  selection={selection}
                  onNoteClick={onNoteClick}
                />
              </ScoreView>
            ) : xml.isError ? (
              <p className="p-gutter text-danger" role="alert">The music could not be loaded: {xml.error.message}</p>
            ) : (
              <p className="p-gutter text-graphite" role="status">Loading the part…</p>
            )}
          </div>
          <p className="sr-only" aria-live="polite" data-testid="note-announcer">
            {announce}
          </p>
        </div>

        <aside
          ref={railRef}
          aria-label="Marking and suggestions"
          data-open={panelOpen ? "true" : "false"}
          className="no-print fixed inset-x-0 bottom-0 z-20 max-h-[45dvh] overflow-y-auto border-t border-ink/20 bg-paper p-4 shadow-[0_-4px_16px_rgba(27,26,23,0.12)] data-[open=false]:hidden lg:relative lg:z-auto lg:block lg:max-h-none lg:w-rail lg:shrink-0 lg:border-l lg:border-t-0 lg:border-rule lg:shadow-none lg:data-[open=false]:block"
        >
          {/* Edge to edge, with content-sized tabs sharing what is left, so the three labels and
              their counts stay on one line in the 20rem rail (1024 px tablets and up). */}
          <div className="-mx-4 mb-3 flex gap-1 border-b border-rule px-2 lg:gap-0 lg:px-1" role="tablist" aria-label="Side panel">
            <Tab selected={sideView === "marking" && keys.length > 0} onClick={() => actions.setSideView("marking")} disabled={keys.length === 0}>
              Marking
            </Tab>
            <Tab selected={sideView === "discussion"} onClick={() => actions.setSideView("discussion")}>
              Discussion{" "}
              <UnreadBadge count={unread} className="ml-1" />
            </Tab>
            <Tab selected={sideView === "suggestions" || (keys.length === 0 && sideView !== "discussion")} onClick={() => actions.setSideView("suggestions")}>
              Suggestions{" "}
              <CountBadge count={pending.length} noun="to decide" className="ml-1" />
            </Tab>
            <button
              type="button"
              className="ml-auto h-11 px-2 text-graphite lg:hidden"
              aria-label="Close the side panel"
              onClick={() => actions.setPanelOpen(false)}
            >
              ✕
            </button>
          </div>
          {rail}
        </aside>
      </div>

      <ConflictPrompt conflicts={conflicts} labelOf={labelOf} onKeepMine={keepMine} onTakeTheirs={takeTheirs} />
    </div>
  );
}

function ToolButton({
  children, label, onClick, disabled, pressed,
}: { children: React.ReactNode; label?: string; onClick: () => void; disabled?: boolean; pressed?: boolean }) {
  return (
    <button
      type="button"
      onClick={onClick}
      disabled={disabled}
      aria-label={label}
      title={label}
      aria-pressed={pressed}
      className="inline-flex h-11 min-w-11 items-center justify-center whitespace-nowrap rounded px-2.5 text-sm font-medium text-ink hover:bg-paper-deep disabled:cursor-not-allowed disabled:text-graphite/60 aria-pressed:bg-paper-deep aria-pressed:underline aria-pressed:underline-offset-4"
    >
      {children}
    </button>
  );
}

function Tab({ children, selected, onClick, disabled }: { children: React.ReactNode; selected: boolean; onClick: () => void; disabled?: boolean }) {
  return (
    <button
      type="button"
      role="tab"
      aria-selected={selected}
      disabled={disabled}
      onClick={onClick}
      className="-mb-px inline-flex h-11 items-center justify-center whitespace-nowrap border-b-[3px] border-transparent px-2 lg:flex-auto lg:px-1.5 text-sm font-medium text-graphite aria-selected:border-ink aria-selected:text-ink disabled:opacity-50"
    >
      {children}
    </button>
  );
}
