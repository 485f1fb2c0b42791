/**
 * Keys in force through a part: one section per key signature (a signature change mid-part
 * starts a new key), and inside each section the local keys that windowed K–S correlation finds
 * clearly stronger than the section's key (tonicizations and modulations).
 */
import type { Measure } from "@/lib/musicxml/model";
import { inKey } from "./degree";
import { type Key, fifthsOf, inferMode, keyFromSignature, sameKey } from "./key";
import { bestKeyMean, meanCorrelation } from "./key-finding";
import type { MelodyNote } from "./melody";
import { mod, pcOfLof } from "./spelling";

export interface KeySection {
  fromIndex: number;
  toIndex: number;
  fifths: number;
  key: Key;
  source: "signature" | "inferred";
}

export interface LocalKeySpan {
  fromIndex: number;
  toIndex: number;
  key: Key;
}

/**
 * Window and thresholds for local keys. A window of four bars (hop one bar) is long enough for a
 * cadence and short enough to catch a tonicization. A window votes for another key only when its
 * mean correlation beats the section key's by at least `margin` and reaches `minR`, and it holds a
 * note that is foreign to the section key but belongs to the new one (its leading tone, say) —
 * pitch content alone (a bar of G and D) is no modulation. A measure takes the key most of its
 * covering windows voted for; the span is then trimmed to the music (see below) and must last
 * `minMeasures`.
 */
export const LOCAL_KEY = { windowMeasures: 4, margin: 0.15, minR: 0.7, minMeasures: 2, accompanimentWeight: 0.5 } as const;

export function keySections(measures: readonly Measure[], melody: readonly MelodyNote[]): KeySection[] {
  const sections: KeySection[] = [];
  let start = 0;
  for (let i = 1; i <= measures.length; i++) {
    const cur = measures[i];
    const prev = measures[start];
    const boundary =
      i === measures.length || (cur.keyChanged && (cur.key.fifths !== prev.key.fifths || cur.key.mode !== prev.key.mode));
    if (!boundary) continue;
    const sig = prev.key;
    const notes = melody.filter((n) => n.measureIndex >= start && n.measureIndex < i);
    const fromSig = keyFromSignature(sig.fifths, sig.mode);
    sections.push({
      fromIndex: start,
      toIndex: i - 1,
      fifths: sig.fifths,
      key: fromSig ?? inferMode(sig.fifths, notes).key,
      source: fromSig ? "signature" : "inferred",
    });
    start = i;
  }
  if (sections.length === 0) sections.push({ fromIndex: 0, toIndex: -1, fifths: 0, key: { tonicLof: 0, mode: "major" }, source: "inferred" });
  return sections;
}

/** The spelling of a pitch-class tonic whose signature lies nearest the section's. */
function spellTonic(pc: number, mode: Key["mode"], nearFifths: number): Key {
  let best: Key | null = null;
  for (let lof = -15; lof <= 15; lof++) {
    if (pcOfLof(lof) !== pc) continue;
    const k: Key = { tonicLof: lof, mode };
    if (!best || Math.abs(fifthsOf(k) - nearFifths) < Math.abs(fifthsOf(best) - nearFifths)) best = k;
  }
  return best as Key;
}

/**
 * Local keys of one section. `accompaniment[measureIndex]` is the duration-weighted pitch-class
 * histogram of the other parts in that measure (empty arrays when there are none).
 */
export function localKeysOf(section: KeySection, melody: readonly MelodyNote[], accompaniment: readonly number[][]): LocalKeySpan[] {
  const { windowMeasures, margin, minR, minMeasures, accompanimentWeight } = LOCAL_KEY;
  const n = section.toIndex - section.fromIndex + 1;
  if (n < windowMeasures + 1) return [];
  const perMeasure: number[][] = [];
  const notesIn: MelodyNote[][] = [];
  for (let i = 0; i < n; i++) {
    perMeasure.push(new Array<number>(12).fill(0));
    notesIn.push([]);
    const acc = accompaniment[section.fromIndex + i];
    if (acc) for (let pc = 0; pc < 12; pc++) perMeasure[i][pc] += accompanimentWeight * (acc[pc] ?? 0);
  }
  for (const m of melody) {
    const i = m.measureIndex - section.fromIndex;
    if (i < 0 || i >= n || m.grace) continue;
    perMeasure[i][mod(m.midi, 12)] += m.dur * 4;
    notesIn[i].push(m);
  }
  const votes: Array<Key | null> = [];
  for (let s = 0; s + windowMeasures <= n; s++) {
    const h = new Array<number>(12).fill(0);
    for (let i = s; i < s + windowMeasures; i++) for (let pc = 0; pc < 12; pc++) h[pc] += perMeasure[i][pc];
    const best = bestKeyMean(h);
    const rSection = meanCorrelation(h, pcOfLof(section.key.tonicLof), section.key.mode);
    const cand = spellTonic(best.tonicPc, best.mode, section.fifths);
    let vote: Key | null = null;
    if (!sameKey(cand, section.key) && best.r >= minR && best.r - rSection >= margin) {
      const evidence = notesIn.slice(s, s + windowMeasures).some((ns) => ns.some((m) => !inKey(m.lof, section.key) && inKey(m.lof, cand)));
      if (evidence) vote = cand;
    }
    votes.push(vote);
  }
  // Each measure takes the key most windows covering it voted for …
  const assigned: Array<Key | null> = [];
  for (let i = 0; i < n; i++) {
    const tally = new Map<string, { key: Key; count: number }>();
    for (let s = Math.max(0, i - windowMeasures + 1); s <= Math.min(votes.length - 1, i); s++) {
      const v = votes[s];
      if (!v) continue;
      const id = `${v.tonicLof}:${v.mode}`;
      const t = tally.get(id) ?? { key: v, count: 0 };
      t.count++;
      tally.set(id, t);
    }
    let pick: { key: Key; count: number } | null = null;
    for (const t of tally.values()) if (!pick || t.count > pick.count) pick = t;
    assigned.push(pick ? pick.key : null);
  }
  // … but a bar holding a note of the section key that the local key lacks (a C♮ against D
  // major) breaks the local key; a local key begins at its first bar with a foreign note (its
  // evidence) and its closing bars are trimmed while they fit the section key as well or better.
  const foreign = (i: number, k: Key) => notesIn[i].some((m) => !inKey(m.lof, k) && inKey(m.lof, section.key));
  const evidence = (i: number, k: Key) => notesIn[i].some((m) => !inKey(m.lof, section.key) && inKey(m.lof, k));
  const fitsSection = (i: number, k: Key) => {
    const h = perMeasure[i];
    if (h.every((v) => v === 0) || foreign(i, k)) return true;
    return meanCorrelation(h, pcOfLof(section.key.tonicLof), section.key.mode) >= meanCorrelation(h, pcOfLof(k.tonicLof), k.mode);
  };
  for (let i = 0; i < n; i++) if (assigned[i] && foreign(i, assigned[i] as Key)) assigned[i] = null;
  for (const { i, j, k } of runsOf(assigned)) {
    let a = i;
    let z = j;
    while (a <= z && !evidence(a, k)) assigned[a++] = null;
    while (z >= a && fitsSection(z, k)) assigned[z--] = null;
  }
  const spans: LocalKeySpan[] = [];
  for (const { i, j, k } of runsOf(assigned)) {
    if (j - i + 1 >= minMeasures) spans.push({ fromIndex: section.fromIndex + i, toIndex: section.fromIndex + j, key: k });
  }
  return spans;
}

/**
 * The runs of measures assigned the same key, as first and last index, read as the loop goes: a
 * caller may clear measures of the run it is given (never of a later one) before the next run.
 */
function* runsOf(assigned: (Key | null)[]): Generator<{ i: number; j: number; k: Key }> {
  const n = assigned.length;
  for (let i = 0; i < n; ) {
    const k = assigned[i];
    if (!k) {
      i++;
      continue;
    }
    let j = i;
    while (j + 1 < n && assigned[j + 1] && sameKey(assigned[j + 1] as Key, k)) j++;
    yield { i, j, k };
    i = j + 1;
  }
}
