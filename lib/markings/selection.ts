/**
 * Note selection as pure data: an ordered list of selected note keys (in time order), the anchor
 * a range grows from and the focus the keyboard moves. `order` is the part's selectable notes in
 * time order (rests and tie continuations are never in it).
 */
export interface Selection {
  keys: string[];
  anchor: string | null;
  focus: string | null;
}

export interface NavNote {
  key: string;
  measureIndex: number;
}

export const EMPTY_SELECTION: Selection = { keys: [], anchor: null, focus: null };

export function selectOnly(key: string): Selection {
  return { keys: [key], anchor: key, focus: key };
}

function inOrder(order: readonly NavNote[], keys: Iterable<string>): string[] {
  const wanted = new Set(keys);
  return order.filter((n) => wanted.has(n.key)).map((n) => n.key);
}

/** Adds or removes one note (Ctrl/Cmd-click), keeping time order. */
export function toggleKey(order: readonly NavNote[], selection: Selection, key: string): Selection {
  const has = selection.keys.includes(key);
  const keys = has ? selection.keys.filter((k) => k !== key) : inOrder(order, [...selection.keys, key]);
  if (keys.length === 0) return EMPTY_SELECTION;
  const focus = has ? (keys.includes(selection.focus ?? "") ? selection.focus : keys[keys.length - 1]) : key;
  return { keys, anchor: has ? (selection.anchor === key ? focus : selection.anchor) : key, focus };
}

/** Selects every note from the anchor to `key` (Shift-click, Shift+arrow). */
export function extendTo(order: readonly NavNote[], selection: Selection, key: string): Selection {
  const anchor = selection.anchor ?? key;
  const a = order.findIndex((n) => n.key === anchor);
  const b = order.findIndex((n) => n.key === key);
  if (a < 0 || b < 0) return selectOnly(key);
  const [lo, hi] = a <= b ? [a, b] : [b, a];
  return { keys: order.slice(lo, hi + 1).map((n) => n.key), anchor, focus: key };
}

export type Move = "next" | "previous" | "next-bar" | "previous-bar" | "first" | "last";

/** Where the focus goes for a move; null when there is nowhere to go. */
export function targetOf(order: readonly NavNote[], focus: string | null, move: Move): string | null {
  if (order.length === 0) return null;
  const i = focus ? order.findIndex((n) => n.key === focus) : -1;
  if (move === "first") return order[0].key;
  if (move === "last") return order[order.length - 1].key;
  if (i < 0) return move === "previous" || move === "previous-bar" ? order[order.length - 1].key : order[0].key;
  if (move === "next") return order[Math.min(i + 1, order.length - 1)].key;
  if (move === "previous") return order[Math.max(i - 1, 0)].key;
  const bar = order[i].measureIndex;
  if (move === "next-bar") {
    const j = order.findIndex((n, k) => k > i && n.measureIndex > bar);
    return j < 0 ? order[order.length - 1].key : order[j].key;
  }
  // previous-bar: the first note of the previous bar that has notes (or of this bar when the
  // focus is not on its first note).
  const firstOfBar = order.findIndex((n) => n.measureIndex === bar);
  if (firstOfBar < i) return order[firstOfBar].key;
  if (firstOfBar === 0) return order[0].key;
  const prevBar = order[firstOfBar - 1].measureIndex;
  return order[order.findIndex((n) => n.measureIndex === prevBar)].key;
}

/** Arrow keys: move the focus (and the selection with it), or extend from the anchor with Shift. */
export function moveSelection(order: readonly NavNote[], selection: Selection, move: Move, extend: boolean): Selection {
  const target = targetOf(order, selection.focus, move);
  if (!target) return selection;
  return extend && selection.anchor ? extendTo(order, selection, target) : selectOnly(target);
}

/** Keeps only keys that still exist (after a re-layout or a new part). */
export function pruneSelection(order: readonly NavNote[], selection: Selection): Selection {
  const keys = inOrder(order, selection.keys);
  if (keys.length === 0) return EMPTY_SELECTION;
  const focus = selection.focus && keys.includes(selection.focus) ? selection.focus : keys[keys.length - 1];
  const anchor = selection.anchor && keys.includes(selection.anchor) ? selection.anchor : keys[0];
  return { keys, anchor, focus };
}
