import { barNameOfNoteKey, type WrittenBar } from "@/lib/musicxml/bar-names";
import { PART_THREAD } from "./schemas";

/**
 * A person's name for a thread: "the whole part", or the bar of the note as written on the part
 * ("bar 12", "the pickup"); a key we cannot read is named "a note".
 */
export function threadLabel(threadKey: string, bars: readonly WrittenBar[]): string {
  if (threadKey === PART_THREAD) return "the whole part";
  return barNameOfNoteKey(bars, threadKey) ?? "a note";
}

/** Notifications about practice set on a part, which the practice page lists. */
export const ASSIGNMENT_NOTIFICATION = "assignment";

/** Where a notification leads: the practice page for practice, else the thread it is about. */
export function notificationPath(partId: string, kind: string, threadKey: string | null): string {
  if (kind === ASSIGNMENT_NOTIFICATION) return `/parts/${partId}/practice#assignments`;
  return threadPath(partId, threadKey);
}

/** The workspace address that opens a note's thread (or the part's). */
export function threadPath(partId: string, threadKey: string | null): string {
  const base = `/parts/${partId}`;
  if (!threadKey) return base;
  if (threadKey === PART_THREAD) return `${base}?thread=${PART_THREAD}`;
  return `${base}?note=${encodeURIComponent(threadKey)}`;
}
