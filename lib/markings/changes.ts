/**
 * Edits are data. A gesture (apply to the selection, clear, paste, accept a suggestion) produces a
 * list of typed changes; `applyChanges` folds them into the markings of a part and returns the
 * commit as a diff `{ added, updated: [from, to], removed }`, which drives the optimistic cache
 * write, the requests sent to the server and, inverted, a local rollback.
 */
import { DEFAULT_MARKING, type MarkingDto, type MarkingValues, type PutMarkingBody } from "./schema";
import type { Role } from "@/lib/analysis/types";

export type MarkingChange =
  | { type: "set"; noteKey: string; values: MarkingValues }
  | { type: "remove"; noteKey: string };

export type MarkingState = Readonly<Record<string, MarkingDto>>;

export interface MarkingDiff {
  added: MarkingDto[];
  updated: [from: MarkingDto, to: MarkingDto][];
  removed: MarkingDto[];
}

const VALUE_FIELDS = ["depthCents", "speedHz", "placement", "onset", "shape", "role", "comment"] as const;

export function valuesOf(marking: MarkingValues): MarkingValues {
  return {
    depthCents: marking.depthCents,
    speedHz: marking.speedHz,
    placement: marking.placement,
    onset: marking.onset,
    shape: marking.shape,
    role: marking.role,
    comment: marking.comment,
  };
}

export function sameValues(a: MarkingValues, b: MarkingValues): boolean {
  return VALUE_FIELDS.every((field) => a[field] === b[field]);
}

export function toState(markings: readonly MarkingDto[]): MarkingState {
  const state: Record<string, MarkingDto> = {};
  for (const marking of markings) state[marking.noteKey] = marking;
  return state;
}

export function isEmptyDiff(diff: MarkingDiff): boolean {
  return diff.added.length === 0 && diff.updated.length === 0 && diff.removed.length === 0;
}

/**
 * Folds changes into the state. Several changes to one note inside a commit collapse into one
 * entry of the diff (set then remove of a new note leaves nothing); setting the values a note
 * already has is no change at all. An optimistic marking keeps the version it was edited from,
 * so the request can still send it.
 */
export function applyChanges(
  state: MarkingState,
  changes: readonly MarkingChange[],
  stamp: { now: string; authorId?: string } = { now: new Date().toISOString() },
): { next: MarkingState; diff: MarkingDiff } {
  const next: Record<string, MarkingDto> = { ...state };
  const touched: string[] = [];
  for (const change of changes) {
    if (!touched.includes(change.noteKey)) touched.push(change.noteKey);
    if (change.type === "remove") {
      delete next[change.noteKey];
      continue;
    }
    const previous = next[change.noteKey];
    if (previous && sameValues(previous, change.values)) continue;
    next[change.noteKey] = {
      ...valuesOf(change.values),
      noteKey: change.noteKey,
      version: previous?.version ?? 0,
      authorId: previous?.authorId ?? stamp.authorId ?? "",
      updatedAt: stamp.now,
    };
  }
  const diff: MarkingDiff = { added: [], updated: [], removed: [] };
  for (const key of touched) {
    const from = state[key];
    const to = next[key];
    if (!from && to) diff.added.push(to);
    else if (from && !to) diff.removed.push(from);
    else if (from && to && !sameValues(from, to)) diff.updated.push([from, to]);
    else if (from && to) next[key] = from; // unchanged after all: keep the original object
  }
  return { next, diff };
}

/** The diff that undoes `diff` (used to roll a failed optimistic commit back locally). */
export function invertDiff(diff: MarkingDiff): MarkingDiff {
  return {
    added: [...diff.removed],
    updated: diff.updated.map(([from, to]) => [to, from] as [MarkingDto, MarkingDto]),
    removed: [...diff.added],
  };
}

/** Applies a diff as-is (from/to objects included), e.g. an inverted one. */
export function applyDiff(state: MarkingState, diff: MarkingDiff): MarkingState {
  const next: Record<string, MarkingDto> = { ...state };
  for (const marking of diff.removed) delete next[marking.noteKey];
  for (const marking of diff.added) next[marking.noteKey] = marking;
  for (const [, to] of diff.updated) next[to.noteKey] = to;
  return next;
}

export type MarkingRequest =
  | { method: "PUT"; noteKey: string; body: Omit<PutMarkingBody, "version" | "group"> }
  | { method: "DELETE"; noteKey: string };

/** The requests that carry a commit to the server, one per note, in a stable order. */
export function diffToRequests(diff: MarkingDiff): MarkingRequest[] {
  return [
    ...diff.added.map((m) => ({ method: "PUT" as const, noteKey: m.noteKey, body: valuesOf(m) })),
    ...diff.updated.map(([, to]) => ({ method: "PUT" as const, noteKey: to.noteKey, body: valuesOf(to) })),
    ...diff.removed.map((m) => ({ method: "DELETE" as const, noteKey: m.noteKey })),
  ];
}

/** Changes returned by the server (undo, redo): each note's marking as it now stands. */
export function applyServerChanges(
  state: MarkingState,
  changes: readonly { noteKey: string; marking: MarkingDto | null }[],
): MarkingState {
  const next: Record<string, MarkingDto> = { ...state };
  for (const change of changes) {
    if (change.marking) next[change.noteKey] = change.marking;
    else delete next[change.noteKey];
  }
  return next;
}

// ——— gestures ———

/** Changes some fields on every selected note; an unmarked note starts from the default marking. */
export function patchSelection(
  state: MarkingState,
  keys: readonly string[],
  patch: Partial<MarkingValues>,
): MarkingChange[] {
  return keys.map((noteKey) => ({
    type: "set",
    noteKey,
    values: { ...valuesOf(state[noteKey] ?? DEFAULT_MARKING), ...patch },
  }));
}

/** Writes the same whole marking on every selected note (paste). */
export function setSelection(keys: readonly string[], values: MarkingValues): MarkingChange[] {
  return keys.map((noteKey) => ({ type: "set", noteKey, values: valuesOf(values) }));
}

/** Removes the markings of the selected notes that have one. */
export function clearSelection(state: MarkingState, keys: readonly string[]): MarkingChange[] {
  return keys.filter((key) => state[key]).map((noteKey) => ({ type: "remove", noteKey }));
}

/** Accepting a suggestion gives the note that role, keeping whatever else it is marked with. */
export function acceptSuggestions(state: MarkingState, items: readonly { noteKey: string; role: Role }[]): MarkingChange[] {
  return items.map(({ noteKey, role }) => ({
    type: "set",
    noteKey,
    values: { ...valuesOf(state[noteKey] ?? DEFAULT_MARKING), role },
  }));
}
