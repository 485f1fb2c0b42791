/**
 * Suggestions a player can accept, each with a one-sentence reason naming the key, the degree
 * and the bar. Confidence 0.5 and above reads "we suggest", below it "possible".
 */
import type { Suggestion } from "./types";
import { describeDegree, displayKey } from "./degree";
import type { Key } from "./key";
import type { MelodyNote } from "./melody";
import type { BoundaryCue, Phrase } from "./phrases";
import { orderByKey } from "./order";
import { displayName } from "./spelling";
import type { TensionFinding, TensionKind } from "./tension";

const round = (v: number) => Math.round(Math.max(0, Math.min(1, v)) * 100) / 100;

const CUE_TEXT: Record<BoundaryCue, string> = {
  start: "at the opening",
  rest: "after a rest",
  breath: "after a breath mark",
  caesura: "after a caesura",
  fermata: "after a fermata",
  barline: "after a double barline",
  key: "where the key signature changes",
  slur: "where a new slur begins",
  contour: "where the melody changes its pattern of intervals and note lengths",
};

const KIND_TEXT: Record<TensionKind, string> = {
  "leading-tone": "leading tone",
  "fourth-to-third": "fourth degree",
  "lowered-sixth": "lowered sixth",
  "fourth-to-minor-third": "fourth degree",
  raised: "raised note",
  "applied-leading-tone": "leading tone",
  lowered: "lowered note",
  appoggiatura: "accented dissonance",
};

export interface SuggestionContext {
  seq: readonly MelodyNote[];
  keyAt: (n: MelodyNote) => Key;
  bar: (n: MelodyNote) => string;
}

function make(n: MelodyNote, ctx: SuggestionContext, role: Suggestion["role"], confidence: number, resolvesTo: string | null, reason: string): Suggestion {
  return { note: n.note.key, measure: n.note.measureNumber, pitch: n.note.pitch?.name ?? "", role, confidence, resolvesTo, reason, strength: round(confidence * accentOf(n)), rank: 0 };
}

/** A note's weight in its bar: strong beat or a quarter note or longer 1, another beat 0.85, off the beat 0.7. */
export function accentOf(n: MelodyNote): number {
  if (n.metric >= 2 || n.dur >= 1 / 4 - 1e-9) return 1;
  return n.metric === 1 ? 0.85 : 0.7;
}

/** Ranks suggestions inside each phrase by strength (1 = strongest; ties go to the earlier). */
export function rankByPhrase(placed: ReadonlyArray<readonly [number, Suggestion]>, phrases: readonly Phrase[]): void {
  const groups = new Map<number, Array<readonly [number, Suggestion]>>();
  let p = 0;
  const sorted = orderByKey(placed, (item) => item[0], placed.reduce((most, item) => Math.max(most, item[0] + 1), 0));
  for (const item of sorted) {
    while (p + 1 < phrases.length && item[0] > phrases[p].end) p++;
    const list = groups.get(p) ?? [];
    list.push(item);
    groups.set(p, list);
  }
  for (const list of groups.values()) {
    list.sort((a, b) => (b[1].strength ?? 0) - (a[1].strength ?? 0) || a[0] - b[0]);
    list.forEach(([, s], i) => (s.rank = i + 1));
  }
}

/** A suggestion with the position of its note in the melody, for ordering. */
export type Placed = [index: number, suggestion: Suggestion];

export function phraseSuggestions(phrases: readonly Phrase[], ctx: SuggestionContext): Placed[] {
  const out: Placed[] = [];
  for (const [i, p] of phrases.entries()) {
    const s = ctx.seq[p.start];
    const key = ctx.keyAt(s);
    const confidence = i === 0 ? 0.95 : round(Math.min(0.95, 0.5 + 0.45 * p.strength));
    const startReason = `A phrase begins on ${displayName(s.lof)} in ${ctx.bar(s)}, ${describeDegree(s.lof, key)} of ${displayKey(key)}, ${CUE_TEXT[p.cue]}.`;
    out.push([p.start, make(s, ctx, "phrase-start", confidence, null, startReason)]);
    const pk = ctx.seq[p.peak];
    let ties = 0;
    const distinct = new Set<number>();
    for (let j = p.start; j <= p.end; j++) {
      if (j !== p.peak && ctx.seq[j].midi === pk.midi) ties++;
      distinct.add(ctx.seq[j].midi);
    }
    const pkKey = ctx.keyAt(pk);
    const octave = pk.note.pitch?.octave ?? "";
    const peakReason =
      `${displayName(pk.lof)}${octave} in ${ctx.bar(pk)}, ${describeDegree(pk.lof, pkKey)} of ${displayKey(pkKey)}, is the highest note of the phrase that begins in ${ctx.bar(s)}` +
      (ties > 0 ? "; of its repetitions it is the longest or on the strongest beat." : ".");
    out.push([p.peak, make(pk, ctx, "peak", distinct.size < 2 ? 0.3 : ties === 0 ? 0.75 : 0.6, null, peakReason)]);
  }
  return out;
}

export function tensionSuggestions(tensions: readonly TensionFinding[], ctx: SuggestionContext): Placed[] {
  const out: Placed[] = [];
  const resolutions = new Map<number, { t: TensionFinding; confidence: number }>();
  for (const t of tensions) {
    const n = ctx.seq[t.index];
    out.push([t.index, { ...make(n, ctx, "tension", round(t.confidence), t.resolvesTo === null ? null : ctx.seq[t.resolvesTo].note.key, t.reason), kind: t.kind }]);
    if (t.resolvesTo !== null) {
      const prev = resolutions.get(t.resolvesTo);
      if (!prev || prev.confidence < t.confidence) resolutions.set(t.resolvesTo, { t, confidence: t.confidence });
    }
  }
  for (const [idx, { t, confidence }] of resolutions) {
    const r = ctx.seq[idx];
    const from = ctx.seq[t.index];
    const reason = `${displayName(r.lof)} in ${ctx.bar(r)} is ${describeDegree(r.lof, t.key)} of ${displayKey(t.key)}; it resolves the ${KIND_TEXT[t.kind]} ${displayName(from.lof)} from ${ctx.bar(from)}.`;
    out.push([idx, make(r, ctx, "resolution", round(confidence), null, reason)]);
  }
  return out;
}
