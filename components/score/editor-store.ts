"use client";

/**
 * Editor state of one open part (selection, zoom, panel, clipboard, the measured note layout,
 * pending reveals). Server state — markings, versions, conflicts, save state — stays in TanStack
 * Query (the cache and the write queue's mutations, see api/write-state.ts); this store holds none.
 */
import { createContext, createElement, useContext, useState, type ReactNode } from "react";
import { createStore, useStore, type StoreApi } from "zustand";
import type { MarkingValues } from "@/lib/markings/schema";
import type { NoteBox } from "@/lib/markings/glyph-geometry";
import {
  EMPTY_SELECTION, extendTo, moveSelection, pruneSelection, selectOnly, toggleKey,
  type Move, type NavNote, type Selection,
} from "@/lib/markings/selection";

export type SideView = "marking" | "suggestions" | "discussion";
export type SelectMode = "only" | "toggle" | "extend";

export const ZOOM = { min: 0.5, max: 2, step: 0.1 } as const;

export interface EditorState {
  partId: string;
  selection: Selection;
  /** Selectable notes in time order (rests and tie continuations excluded). */
  order: NavNote[];
  boxes: NoteBox[];
  boxByKey: ReadonlyMap<string, NoteBox>;
  /** Bumped on every layout so dependants re-measure. */
  layoutVersion: number;
  zoom: number;
  panelOpen: boolean;
  sideView: SideView;
  legendOpen: boolean;
  clipboard: MarkingValues | null;
  /** A request to scroll a note into view ("show me", the phrase map). */
  reveal: { key: string; nonce: number } | null;
  actions: EditorActions;
}

export interface EditorActions {
  setLayout(boxes: NoteBox[]): void;
  select(key: string, mode?: SelectMode): void;
  selectKeys(keys: string[]): void;
  move(move: Move, extend: boolean): void;
  clearSelection(): void;
  setZoom(zoom: number): void;
  zoomBy(delta: number): void;
  setPanelOpen(open: boolean): void;
  setSideView(view: SideView): void;
  setLegendOpen(open: boolean): void;
  copy(values: MarkingValues): void;
  reveal(key: string): void;
}

const clampZoom = (z: number) => Math.round(Math.min(ZOOM.max, Math.max(ZOOM.min, z)) * 100) / 100;

export function createEditorStore(init: { partId: string; zoom?: number }): StoreApi<EditorState> {
  return createStore<EditorState>()((set, get) => ({
    partId: init.partId,
    selection: EMPTY_SELECTION,
    order: [],
    boxes: [],
    boxByKey: new Map(),
    layoutVersion: 0,
    zoom: clampZoom(init.zoom ?? 1),
    panelOpen: false,
    sideView: "marking",
    legendOpen: false,
    clipboard: null,
    reveal: null,
    actions: {
      setLayout(boxes) {
        const order = boxes.map((b) => ({ key: b.key, measureIndex: b.measureIndex }));
        set((s) => ({
          boxes,
          order,
          boxByKey: new Map(boxes.map((b) => [b.key, b])),
          layoutVersion: s.layoutVersion + 1,
          selection: pruneSelection(order, s.selection),
        }));
      },
      select(key, mode = "only") {
        const { order, selection } = get();
        if (!order.some((n) => n.key === key)) return;
        const next = mode === "toggle" ? toggleKey(order, selection, key) : mode === "extend" ? extendTo(order, selection, key) : selectOnly(key);
        set({ selection: next });
      },
      selectKeys(keys) {
        const { order } = get();
        set({ selection: pruneSelection(order, { keys, anchor: keys[0] ?? null, focus: keys[keys.length - 1] ?? null }) });
      },
      move(move, extend) {
        const { order, selection } = get();
        set({ selection: moveSelection(order, selection, move, extend) });
      },
      clearSelection() {
        set({ selection: EMPTY_SELECTION, panelOpen: false });
      },
      setZoom(zoom) {
        set({ zoom: clampZoom(zoom) });
      },
      zoomBy(delta) {
        set((s) => ({ zoom: clampZoom(s.zoom + delta) }));
      },
      setPanelOpen(open) {
        set(open ? { panelOpen: true, sideView: "marking" } : { panelOpen: false });
      },
      setSideView(view) {
        set({ sideView: view, panelOpen: true });
      },
      setLegendOpen(open) {
        set({ legendOpen: open });
      },
      copy(values) {
        set({ clipboard: { ...values } });
      },
      reveal(key) {
        set((s) => ({ reveal: { key, nonce: (s.reveal?.nonce ?? 0) + 1 } }));
      },
    },
  }));
}

const EditorStoreContext = createContext<StoreApi<EditorState> | null>(null);

export function EditorStoreProvider({ partId, store, children }: { partId: string; store?: StoreApi<EditorState>; children: ReactNode }) {
  const [value] = useState(() => store ?? createEditorStore({ partId }));
  return createElement(EditorStoreContext.Provider, { value }, children);
}

export function useEditorStoreApi(): StoreApi<EditorState> {
  const store = useContext(EditorStoreContext);
  if (!store) throw new Error("useEditorStore must be used inside <EditorStoreProvider>.");
  return store;
}

/** Reads one slice of the editor state; the component re-renders only when that slice changes. */
export function useEditorStore<T>(selector: (state: EditorState) => T): T {
  return useStore(useEditorStoreApi(), selector);
}

export const useSelection = () => useEditorStore((s) => s.selection);
export const useEditorActions = () => useEditorStore((s) => s.actions);
