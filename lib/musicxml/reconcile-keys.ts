/**
 * The page's note keys (read from the engraver's model) mapped onto the server's (read from our
 * MusicXML reader). Both build keys with the same `noteKey`, and on almost every file they agree;
 * where the engraver places a note at another time than the one written (it shortens a rest that
 * is longer than its bar, so the notes after it move), the page's key names no note of the
 * server's. The written time is right, so the server's key stays, and the page's note is paired
 * with the server's note it stands for: the same part, bar, staff, voice, pitch and grace position,
 * taken in time order, and only where that leaves no choice (as many notes unknown to the server as
 * server notes the page did not produce). Anything else is left unmapped and reported, never
 * guessed. Keep this module dependency-free: browser code imports it.
 */
import { parseNoteKey, type NoteKeyParts } from "./note-key";

export interface ReconcileOptions {
  /**
   * The server's list covers only the first this many measures (a long part's opening, before
   * its whole key list has arrived): page keys of later measures are left as they are and not
   * reported. Null or absent: the list covers the whole part.
   */
  measures?: number | null;
}

export interface ReconciledKeys {
  /**
   * The page's keys in the order given, each the server's key of that note: known keys as they
   * were, paired keys replaced, unmapped keys (and "" for rests) as they were.
   */
  keys: string[];
  /** Page key → the server's key it stands for, for every key that was replaced. */
  mapped: Map<string, string>;
  /** Page keys the server does not know and that could not be paired (distinct, first seen first). */
  unmapped: string[];
}

/** Everything but the onset: a page note and a server note can only be the same note within it. */
function groupOf(p: NoteKeyParts): string {
  return [p.partId, p.measureIndex, p.staff, p.voice, p.midi, p.graceIndex].join("\u0000");
}

const byOnset = (a: { parts: NoteKeyParts }, b: { parts: NoteKeyParts }) => a.parts.onset.num * b.parts.onset.den - b.parts.onset.num * a.parts.onset.den;

interface Group {
  page: { key: string; parts: NoteKeyParts }[];
  server: { key: string; parts: NoteKeyParts }[];
}

/**
 * Maps `pageKeys` (in engraving order; "" for rests, a tie chain's key repeated on its
 * continuations) onto `serverKeys` (the server's keys of the part). See the module comment.
 */
export function reconcileNoteKeys(pageKeys: readonly string[], serverKeys: readonly string[], options: ReconcileOptions = {}): ReconciledKeys {
  const limit = options.measures ?? Number.POSITIVE_INFINITY;
  const server = new Set(serverKeys);
  const unmapped: string[] = [];
  const groups = new Map<string, Group>();

  const seen = new Set<string>();
  for (const key of pageKeys) {
    if (key === "" || server.has(key) || seen.has(key)) continue;
    seen.add(key);
    const parts = parseNoteKey(key);
    if (!parts) {
      unmapped.push(key);
      continue;
    }
    if (parts.measureIndex >= limit) continue;
    const id = groupOf(parts);
    let group = groups.get(id);
    if (!group) groups.set(id, (group = { page: [], server: [] }));
    group.page.push({ key, parts });
  }

  const mapped = new Map<string, string>();
  if (groups.size > 0) {
    // Only the server's notes the page did not produce can stand for a page note.
    const page = new Set(pageKeys);
    const spare = new Set<string>();
    for (const key of serverKeys) {
      if (page.has(key) || spare.has(key)) continue;
      spare.add(key);
      const parts = parseNoteKey(key);
      if (!parts) continue;
      groups.get(groupOf(parts))?.server.push({ key, parts });
    }
    for (const group of groups.values()) {
      if (group.page.length !== group.server.length) {
        for (const p of group.page) unmapped.push(p.key);
        continue;
      }
      const pageInTime = [...group.page].sort(byOnset);
      const serverInTime = [...group.server].sort(byOnset);
      pageInTime.forEach((p, i) => mapped.set(p.key, serverInTime[i].key));
    }
    // First seen first, whatever group they fell in.
    const order = new Map([...seen].map((key, i) => [key, i]));
    unmapped.sort((a, b) => order.get(a)! - order.get(b)!);
  }

  return { keys: pageKeys.map((key) => mapped.get(key) ?? key), mapped, unmapped };
}
