"use client";

import { ENGRAVING_OPTIONS, ENGRAVING_SVG } from "./engraving-options";
import { useCallback, useEffect, useLayoutEffect, useRef, useState, type ReactNode } from "react";
import { flushSync } from "react-dom";
import type { OpenSheetMusicDisplay } from "opensheetmusicdisplay";
import { glyphBandHeight, type NoteBox } from "@/lib/markings/glyph-geometry";
import { measureNoteBoxes, noteBoxesFromModel, type StageOffset } from "./measure-note-boxes";
import { measureSystems, type SystemBox } from "./measure-systems";
import { collectOsmdNotes, keyNotesAsServer, type ServerNoteKeys } from "./osmd-note-keys";
import { findUndrawableMeasures } from "./find-undrawable";
import { barNumbers, blankMeasures, firstMeasures, listBars, mendForEngraving } from "@/lib/engraving/repair";
import { isLongPart, OPENING_BARS } from "@/lib/engraving/opening";

export interface ScoreLayout {
  boxes: NoteBox[];
  width: number;
  height: number;
  /** Each line of music, top to bottom (the stand copy keeps each on one page). */
  systems: SystemBox[];
}

export interface ScoreViewProps {
  /** The part's whole text; undefined while it is on its way (only with `opening`). */
  xml: string | undefined;
  /**
   * The first bars of a long part, when the page has them before the whole text: drawn (and
   * selectable) at once, the whole when it has arrived and the page is idle.
   */
  opening?: string | null;
  zoom: number;
  /** Called after every render (load, zoom, resize) with the notes' new positions. */
  onLayout: (layout: ScoreLayout) => void;
  /** Drawn over the engraving, in the same coordinates (the marking overlay). */
  children?: ReactNode;
  /** The overlay's glyph text is at least this many px (paper): the systems make room for it. */
  minTextPx?: number;
  /**
   * "model" (the workspace): notes placed from the engraver's model at once, then refined from the
   * drawing after the first paint. "drawing" (the stand copy, which cuts the drawing into systems
   * once): measured from the drawing only, one layout per render.
   */
  layoutFrom?: "model" | "drawing";
  /**
   * Called once the first drawing is on the screen (after its paint), or when the part cannot be
   * engraved: what the page holds back until then can be asked for.
   */
  onSettled?: () => void;
  /**
   * Mend the text's known troubles before drawing (always, but on the development page that
   * checks the search for bars the engraver cannot draw).
   */
  mend?: boolean;
  /**
   * The server's keys of the part (or of its opening): the notes take the server's keys where the
   * engraver placed one at another time than written (osmd-note-keys.ts `keyNotesAsServer`).
   * Without it the engraver's own keys are used. Keep the same object while the list is the same:
   * a new one lays the notes out again.
   */
  noteKeys?: ServerNoteKeys | null;
}

const RESIZE_DEBOUNCE_MS = 200;

/** What the player reads when some bars are shown as rests. */
export function leftOutMessage(bars: readonly string[]): string {
  const one = bars.length === 1;
  return `The music of ${listBars(bars)} could not be drawn here, so ${one ? "it is" : "they are"} shown as ${one ? "a rest bar" : "rest bars"}. ${one ? "Its" : "Their"} notes are still in the part: analysis, practice and playback use them.`;
}

/** What the player reads when some notes cannot be matched to the part's notes. */
export function unmatchedMessage(bars: readonly string[]): string {
  return `Some notes of ${listBars(bars)} could not be matched to the part's notes, so they cannot be marked here. Reload the page; if they stay unmarkable, upload the file again.`;
}

/** Runs `fn` in the task after the next frame has been painted. */
function afterPaint(fn: () => void): void {
  requestAnimationFrame(() => setTimeout(fn, 0));
}

/** Runs `fn` when the browser is idle (within half a second), where it can say so. */
function whenIdle(fn: () => void): void {
  if (typeof requestIdleCallback === "function") requestIdleCallback(fn, { timeout: 500 });
  else setTimeout(fn, 0);
}

/**
 * Each note's box reaching as far as either measure does: the model has the stem of a beamed
 * note (drawn with its beam, outside the note's group), the drawing has the marks around it.
 */
function unionBoxes(model: readonly NoteBox[], drawn: readonly NoteBox[]): NoteBox[] {
  const byKey = new Map(drawn.map((b) => [b.key, b]));
  return model.map((m) => {
    const d = byKey.get(m.key);
    if (!d) return m;
    const top = Math.min(m.y, d.y);
    const bottom = Math.max(m.y + m.height, d.y + d.height);
    return { ...m, y: top, height: bottom - top };
  });
}

/** Within a pixel, note for note. */
function sameBoxes(a: readonly NoteBox[], b: readonly NoteBox[]): boolean {
  if (a.length !== b.length) return false;
  return a.every((x, i) => {
    const y = b[i];
    return x.key === y.key && Math.abs(x.x - y.x) < 1 && Math.abs(x.y - y.y) < 1 && Math.abs(x.width - y.width) < 1 && Math.abs(x.y + x.height - (y.y + y.height)) < 1;
  });
}

/** The drawing's size from the SVG's own attributes (reading the stage's size would force a layout). */
function engravedSize(stage: HTMLElement, offset: StageOffset): { width: number; height: number } {
  const svg = stage.querySelector(ENGRAVING_SVG);
  const width = Number.parseFloat(svg?.getAttribute("width") ?? "");
  const height = Number.parseFloat(svg?.getAttribute("height") ?? "");
  if (Number.isFinite(width) && Number.isFinite(height)) return { width: offset.left + width, height: offset.top + height };
  return { width: stage.scrollWidth, height: stage.scrollHeight };
}

/**
 * The engraving library, fetched as soon as this module runs in the browser, so its download
 * overlaps the page's own hydration instead of waiting for the first effect.
 */
let engraver: Promise<typeof import("opensheetmusicdisplay")> | null = null;
const loadEngraver = () => (engraver ??= import("opensheetmusicdisplay"));
if (typeof window !== "undefined") void loadEngraver();

/**
 * The engraved part. OpenSheetMusicDisplay is imported only here, and only in the browser, so it
 * is loaded on pages that show a score. Every render rebuilds its SVG; we never attach anything
 * to it and re-measure the notes instead.
 */
export function ScoreView({ xml, opening = null, zoom, onLayout, children, minTextPx = 0, layoutFrom = "model", onSettled, mend = true, noteKeys = null }: ScoreViewProps) {
  const stageRef = useRef<HTMLDivElement>(null);
  const hostRef = useRef<HTMLDivElement>(null);
  const osmdRef = useRef<OpenSheetMusicDisplay | null>(null);
  const zoomRef = useRef(zoom);
  const onLayoutRef = useRef(onLayout);
  const [status, setStatus] = useState<"loading" | "ready" | "error">("loading");
  /** Written numbers of the bars drawn as rest bars because the engraver could not draw them. */
  const [leftOut, setLeftOut] = useState<string[]>([]);
  /** Written numbers of the bars holding notes that could not be given the server's keys. */
  const [unmatched, setUnmatched] = useState<string[]>([]);
  const noteKeysRef = useRef(noteKeys);
  /** The text last drawn (opening or whole), to name its bars. */
  const drawnTextRef = useRef<string | null>(null);
  /** Counts fresh engravings asked for after a redraw failed. */
  const [attempt, setAttempt] = useState(0);

  const onSettledRef = useRef(onSettled);
  useEffect(() => {
    onLayoutRef.current = onLayout;
    onSettledRef.current = onSettled;
  }, [onLayout, onSettled]);

  // The whole text can arrive after the opening was drawn: the drawing waits for it without
  // starting again. Once the opening given is no longer the part's (a new text), it is not used.
  const wholeRef = useRef(xml);
  const wholeArrived = useRef<(() => void) | null>(null);
  const drawnWholeRef = useRef<string | null>(null);
  const [openingStale, setOpeningStale] = useState(false);
  useEffect(() => {
    wholeRef.current = xml;
    if (xml === undefined) return;
    wholeArrived.current?.();
    if (drawnWholeRef.current !== null && xml !== drawnWholeRef.current) setOpeningStale(true);
  }, [xml]);
  const firstOpening = openingStale ? null : opening;
  // What a fresh engraving starts from: the opening given, else the whole text.
  const start = firstOpening ?? xml;

  // Where the engraving's SVG sits in the stage. Assumed from the last check (the host has no
  // padding, so it starts at 0, 0) and verified once the browser has laid the page out anyway.
  const offsetRef = useRef<StageOffset>({ left: 0, top: 0 });
  const lastRef = useRef<ScoreLayout | null>(null);
  const fromModel = layoutFrom === "model";

  const publish = useCallback((layout: ScoreLayout) => {
    lastRef.current = layout;
    onLayoutRef.current(layout);
  }, []);

  /** The drawn notes, keyed as the server keys them; notes that cannot be are named to the player. */
  const notesOf = useCallback((osmd: OpenSheetMusicDisplay) => {
    const { refs, unmapped } = keyNotesAsServer(collectOsmdNotes(osmd), noteKeysRef.current);
    const text = drawnTextRef.current;
    const bars = unmapped.length > 0 && text ? barNumbers(text, [...new Set(unmapped.map((ref) => ref.measureIndex))].sort((a, b) => a - b)) : [];
    setUnmatched((before) => (before.length === bars.length && before.every((b, i) => b === bars[i]) ? before : bars));
    return refs;
  }, []);

  /** Right after engraving: positions from the engraver's model, without forcing a layout. */
  const measure = useCallback(() => {
    const osmd = osmdRef.current;
    const stage = stageRef.current;
    if (!osmd || !stage) return;
    const zoom = zoomRef.current;
    const refs = notesOf(osmd);
    if (!fromModel) {
      const origin = stage.getBoundingClientRect();
      const at = stage.querySelector(ENGRAVING_SVG)?.getBoundingClientRect() ?? origin;
      offsetRef.current = { left: at.left - origin.left, top: at.top - origin.top };
    }
    const boxes = (fromModel ? noteBoxesFromModel(refs, offsetRef.current, zoom) : null) ?? measureNoteBoxes(refs, stage, zoom);
    // "model" until the drawing has been measured after the paint ("drawn"); tests wait for it.
    stage.dataset.layout = fromModel ? "model" : "drawn";
    const offset = offsetRef.current;
    const size = engravedSize(stage, offset);
    publish({ boxes, width: size.width, height: size.height, systems: measureSystems(osmd, offset, zoom) });
  }, [publish, fromModel, notesOf]);

  /**
   * After the next paint, when the browser's boxes cost little: measure the drawing itself and
   * publish it where it differs from the model's first guess (a mark drawn above a note, or the
   * SVG not where it was assumed).
   */
  const refine = useCallback(() => {
    // When the browser is idle after the paint: the notes are selectable already, and a click
    // or a key press should not wait behind this.
    requestAnimationFrame(() =>
      whenIdle(() => {
        const osmd = osmdRef.current;
        const stage = stageRef.current;
        const svg = stage?.querySelector(ENGRAVING_SVG);
        const last = lastRef.current;
        if (!osmd || !stage || !svg || !last) return;
        const zoom = zoomRef.current;
        const origin = stage.getBoundingClientRect();
        const at = svg.getBoundingClientRect();
        const offset = { left: at.left - origin.left, top: at.top - origin.top };
        const moved = Math.abs(offset.left - offsetRef.current.left) > 0.5 || Math.abs(offset.top - offsetRef.current.top) > 0.5;
        offsetRef.current = offset;
        const drawn = measureNoteBoxes(notesOf(osmd), stage, zoom);
        const boxes = moved ? drawn : unionBoxes(last.boxes, drawn);
        stage.dataset.layout = "drawn";
        if (!moved && sameBoxes(last.boxes, boxes)) return;
        const size = engravedSize(stage, offset);
        publish({ boxes, width: size.width, height: size.height, systems: measureSystems(osmd, offset, zoom) });
      }),
    );
  }, [publish, notesOf]);

  const render = useCallback(() => {
    const osmd = osmdRef.current;
    if (!osmd) return;
    osmd.Zoom = zoomRef.current;
    // Marks let the benchmark split the time to a selectable score into its stages.
    performance.mark("ondula:render-start");
    osmd.render();
    performance.mark("ondula:rendered");
    measure();
    performance.mark("ondula:measured");
    if (fromModel) refine();
  }, [measure, refine, fromModel]);

  // A layout effect: it runs right after the first commit, before the browser paints, while a
  // passive effect after hydration can wait a frame or more — engraving is the slow part.
  useLayoutEffect(() => {
    let cancelled = false;
    const host = hostRef.current;
    const stage = stageRef.current;
    if (!host || !stage) return;
    setStatus("loading");
    setLeftOut([]);
    let OSMD: typeof OpenSheetMusicDisplay | null = null;

    /** A fresh engraver in `into`, with our room above every system and the current zoom. */
    const make = (into: HTMLElement) => {
      const osmd = new OSMD!(into, { ...ENGRAVING_OPTIONS });
      // Room above every system for our glyph band (OSMD units: 10 px at zoom 1, scaled by the zoom).
      const band = glyphBandHeight(zoomRef.current, minTextPx) / (10 * zoomRef.current);
      osmd.EngravingRules.MinSkyBottomDistBetweenSystems = Math.max(osmd.EngravingRules.MinSkyBottomDistBetweenSystems, band + 1);
      osmd.EngravingRules.PageTopMargin = Math.max(osmd.EngravingRules.PageTopMargin, band);
      osmd.Zoom = zoomRef.current;
      return osmd;
    };

    /** Loads `text` into the stage and draws it; throws what the engraver throws. */
    const draw = async (text: string, engraved: "opening" | "whole") => {
      const osmd = make(host);
      await osmd.load(text);
      performance.mark("ondula:loaded");
      if (cancelled) return;
      host.replaceChildren();
      osmdRef.current = osmd;
      drawnTextRef.current = text;
      let failure: unknown = null;
      // The notes' positions, the overlay and the ready state reach the DOM in this same task, so
      // the browser lays out and paints the engraving once, with everything on it. Left to
      // React's scheduler, the engraving alone is laid out and painted first, then again with
      // the overlay.
      flushSync(() => {
        try {
          stage.dataset.engraved = engraved;
          render();
          setStatus("ready");
        } catch (e) {
          failure = e;
        }
      });
      if (failure) {
        osmdRef.current = null;
        throw failure;
      }
    };

    /** The whole part; bars the engraver cannot draw are found and drawn as rest bars. */
    const drawWhole = async (text: string) => {
      try {
        await draw(text, "whole");
        return;
      } catch (e) {
        if (cancelled) return;
        console.error("Engraving the whole part failed; looking for the bars that cause it.", e);
      }
      const width = stage.clientWidth || 1000;
      const bad = await findUndrawableMeasures(make, text, width, () => cancelled);
      if (cancelled) return;
      await draw(blankMeasures(text, bad), "whole");
      setLeftOut(barNumbers(text, [...bad].sort((a, b) => a - b)));
    };

    /** Once per engraving: what the page holds back until then can be asked for. */
    let settled = false;
    const settle = () => {
      if (settled || cancelled) return;
      settled = true;
      onSettledRef.current?.();
    };

    /** The whole text, mended, once it is there (the page may hold it back until settled). */
    const whole = async () => {
      if (wholeRef.current === undefined) {
        settle();
        await new Promise<void>((resolve) => (wholeArrived.current = resolve));
      }
      const text = wholeRef.current!;
      drawnWholeRef.current = text;
      return mend ? mendForEngraving(text) : text;
    };

    (async () => {
      performance.mark("ondula:engraver-import");
      ({ OpenSheetMusicDisplay: OSMD } = await loadEngraver());
      performance.mark("ondula:engraver-loaded");
      if (cancelled) return;
      host.replaceChildren();
      // A long part: its opening is drawn (and selectable) first, the whole when the page is idle.
      // The page may have sent only the opening; otherwise it is cut from the whole text here.
      let text: string | null = null;
      let opening: string | null = null;
      if (firstOpening !== null && fromModel) opening = mend ? mendForEngraving(firstOpening) : firstOpening;
      else {
        text = await whole();
        // Mended again: the cut can leave a trill line that starts without its stop.
        opening = fromModel && isLongPart(text) ? mendForEngraving(firstMeasures(text, OPENING_BARS)) : null;
      }
      let drewOpening = false;
      if (opening) {
        try {
          await draw(opening, "opening");
          drewOpening = !cancelled;
        } catch (e) {
          console.error("Engraving the opening failed; drawing the whole part instead.", e);
        }
      }
      if (cancelled) return;
      if (drewOpening) {
        afterPaint(settle);
        await new Promise<void>((resolve) => afterPaint(() => whenIdle(() => resolve())));
        text ??= await whole();
        if (cancelled) return;
        await drawWhole(text);
      } else {
        await drawWhole(text ?? (await whole()));
        afterPaint(settle);
      }
    })().catch((e: unknown) => {
      if (cancelled) return;
      // The engraver's own words mean nothing to a player: they go to the console only.
      console.error("The part could not be engraved.", e);
      osmdRef.current = null;
      host.replaceChildren();
      setStatus("error");
      onSettledRef.current?.();
    });
    return () => {
      cancelled = true;
      wholeArrived.current = null;
      osmdRef.current = null;
      host.replaceChildren();
    };
    // `xml` is read through wholeRef: its arrival after the opening does not start again.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [start, render, minTextPx, fromModel, attempt, mend]);

  /**
   * Drawing again at a new zoom or width can fail where the first drawing did not (a line of music
   * breaks elsewhere): then the part is engraved afresh, which finds the bars at fault.
   */
  const redraw = useCallback(() => {
    try {
      render();
    } catch (e) {
      console.error("Drawing the part again failed; engraving it afresh.", e);
      setAttempt((a) => a + 1);
    }
  }, [render]);

  // A new key list (a long part's whole list after its opening's): the same drawing, keyed anew.
  useEffect(() => {
    if (noteKeysRef.current === noteKeys) return;
    noteKeysRef.current = noteKeys;
    if (!osmdRef.current) return;
    measure();
    if (fromModel) refine();
  }, [noteKeys, measure, refine, fromModel]);

  useEffect(() => {
    if (zoomRef.current === zoom) return;
    zoomRef.current = zoom;
    redraw();
  }, [zoom, redraw]);

  // Re-lay out when the available width changes (debounced: a drag of the window is one render).
  useEffect(() => {
    const stage = stageRef.current;
    if (!stage || typeof ResizeObserver === "undefined") return;
    // The width from the observer's entry: reading the stage's own size would force a layout.
    let width: number | null = null;
    let timer: ReturnType<typeof setTimeout> | undefined;
    const observer = new ResizeObserver((entries) => {
      const next = entries[entries.length - 1].contentRect.width;
      if (width === null) width = next; // the first report is the size it starts at
      if (Math.abs(next - width) < 4) return;
      width = next;
      clearTimeout(timer);
      // As on load: the new positions in the same task as the new engraving (one layout, one paint).
      timer = setTimeout(() => flushSync(redraw), RESIZE_DEBOUNCE_MS);
    });
    observer.observe(stage);
    return () => {
      observer.disconnect();
      clearTimeout(timer);
    };
  }, [redraw]);

  return (
    <div ref={stageRef} className="relative w-full" data-score-status={status}>
      {leftOut.length > 0 ? (
        <p className="mx-gutter mb-2 rounded-card border border-rule bg-paper-card px-3 py-2 text-sm" role="status" data-testid="bars-left-out">
          {leftOutMessage(leftOut)}
        </p>
      ) : null}
      {unmatched.length > 0 && status === "ready" ? (
        <p className="mx-gutter mb-2 rounded-card border border-rule bg-paper-card px-3 py-2 text-sm" role="status" data-testid="notes-unmatched">
          {unmatchedMessage(unmatched)}
        </p>
      ) : null}
      <div ref={hostRef} aria-hidden="true" data-engraving="" />
      {status === "ready" ? children : null}
      {status === "loading" ? <p className="px-gutter py-12 text-graphite" role="status">Engraving the part…</p> : null}
      {status === "error" ? (
        <p className="px-gutter py-12 text-danger" role="alert">
          This part could not be drawn on screen. The file and your markings are kept; try a wider window or reload the page.
        </p>
      ) : null}
    </div>
  );
}
