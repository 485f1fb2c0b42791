/**
 * The analysis of a score, part by part: key, local keys, degrees, tension tones with their
 * resolutions, phrases, and the suggestions built from them. Pure and deterministic.
 */
import type { Fraction, PartModel, ScoreModel } from "@/lib/musicxml/model";
import { lineOf, twoPlayersOf, type Line } from "@/lib/musicxml/lines";
import { barName, writtenBars } from "@/lib/musicxml/bar-names";
import type { AnalyzedNote, LocalKey, PartAnalysis, ScoreAnalysis, Suggestion } from "./types";
import { degreeOf } from "./degree";
import { type Key, keyFromSignature, majorOf, toKeyResult } from "./key";
import { type KeySection, type LocalKeyParams, type LocalKeySpan, keySections, localKeysOf, settleMode } from "./local-keys";
import { barEvidence, harmonyAt } from "./bar-evidence";
import { toString as fracString } from "@/lib/musicxml/fraction";
import { Accompaniment, buildTimeline, extractMelody, type MelodyNote } from "./melody";
import { findPhrases } from "./phrases";
import { asciiName } from "./spelling";
import { phraseSuggestions, rankByPhrase, tensionSuggestions } from "./suggestions";
import { findTensions } from "./tension";
import { orderByKey } from "./order";

/** Bump whenever results change: stored analyses with another version are recomputed. */
export const ANALYSIS_VERSION = 6;

export interface AnalyzeOptions {
  /** For a staff carrying two players: whose line is analysed (the upper by default). */
  line?: Line;
  /** Other constants for the local-key path (scripts/tune-harmony.ts sets them on the tuning half). */
  localKey?: LocalKeyParams;
}

const ROLE_ORDER: Record<Suggestion["role"], number> = { "phrase-start": 0, peak: 1, tension: 2, resolution: 3 };

export function analyzePart(score: ScoreModel, part: PartModel, options: AnalyzeOptions = {}): PartAnalysis {
  const timeline = buildTimeline(score, part);
  // Two players on the staff: the chosen player's line is the melody, the other line sounds with
  // it (the accompaniment below counts this part's notes outside the melody).
  const players = twoPlayersOf(part);
  const line = players ? (options.line ?? "upper") : null;
  const melody = extractMelody(part, timeline, line ? lineOf(part, line, players) : undefined);
  const main = melody.filter((n) => !n.grace);
  const sections: KeySection[] = part.measures.length > 0 ? keySections(part.measures, melody) : [];
  const bars = barEvidence(score, part, timeline, melody);
  for (const [i, s] of sections.entries()) sections[i] = settleMode(s, bars, options.localKey);
  const spans: LocalKeySpan[] = sections.flatMap((s) => localKeysOf(s, bars, options.localKey));

  const keyAtMeasure: Key[] = part.measures.map(() => majorOf(0));
  for (const s of sections) for (let i = s.fromIndex; i <= s.toIndex; i++) keyAtMeasure[i] = s.key;
  for (const sp of spans) for (let i = sp.fromIndex; i <= sp.toIndex; i++) keyAtMeasure[i] = sp.key;
  const keyAt = (n: MelodyNote) => keyAtMeasure[n.measureIndex];
  // Reasons name bars as the part writes them ("bar 12", "the pickup").
  const written = writtenBars(part.measures);
  // One name per bar, however many reasons name it.
  const barNames = new Map<number, string>();
  const bar = (n: MelodyNote) => {
    let name = barNames.get(n.measureIndex);
    if (name === undefined) barNames.set(n.measureIndex, (name = barName(written, n.measureIndex)));
    return name;
  };

  const first = sections[0];
  const sig = part.measures[0]?.key ?? { fifths: 0, mode: null };
  const key = first
    ? toKeyResult(first.key, first.fifths, first.source)
    : toKeyResult(keyFromSignature(sig.fifths, sig.mode) ?? majorOf(sig.fifths), sig.fifths, sig.mode ? "signature" : "inferred");

  const number = (i: number) => part.measures[i].number;
  const localKeys: LocalKey[] = [
    ...sections.slice(1).map((s) => ({ i: s.fromIndex, k: { tonic: asciiName(s.key.tonicLof), mode: s.key.mode, fromMeasure: number(s.fromIndex), toMeasure: number(s.toIndex) } })),
    ...spans.map((s) => ({
      i: s.fromIndex,
      k: {
        tonic: asciiName(s.key.tonicLof),
        mode: s.key.mode,
        fromMeasure: number(s.fromIndex),
        toMeasure: number(s.toIndex),
        ...(s.pivotFrom !== null && s.pivotTo !== null ? { pivotFromMeasure: number(s.pivotFrom), pivotToMeasure: number(s.pivotTo) } : {}),
      },
    })),
  ]
    .sort((a, b) => a.i - b.i)
    .map((x) => x.k);

  const fraction = fractionTexts();
  const notes: AnalyzedNote[] = melody.map((m) => ({
    key: m.note.key,
    measure: m.note.measureNumber,
    pitch: m.note.pitch?.name ?? "",
    midi: m.midi,
    onset: fraction(m.note.onset),
    duration: fraction(m.note.duration),
    degree: degreeOf(m.lof, keyAt(m)),
  }));

  const accompaniment = new Accompaniment(score, part, timeline, melody);
  const noChord = new Set<number>();
  const tensions = findTensions({
    seq: main,
    keyAt,
    chordAt: (n) => (accompaniment.empty ? noChord : accompaniment.soundingAt(n.measureIndex, n.pos)),
    // Figuration (one note at a time under the melody) shows its chord over the beat; where the
    // beat shows none, the one note sounding still counts.
    harmonyAt: (n) => {
      const now = accompaniment.empty ? noChord : accompaniment.soundingAt(n.measureIndex, n.pos);
      if (now.size >= 2) return now;
      const beat = harmonyAt(bars, n.measureIndex, n.onset);
      return beat.size > 0 ? beat : now;
    },
    spelledAt: (n) => (accompaniment.empty ? noChord : accompaniment.spelledAt(n.measureIndex, n.pos)),
    bar,
  });
  const keyStarts = new Set(sections.slice(1).map((s) => s.fromIndex));
  const phrases = findPhrases(main, part.measures, keyStarts);
  const ctx = { seq: main, keyAt, bar };
  // Suggestions in time order, then by role, sorted on one number each.
  const placed = [...phraseSuggestions(phrases, ctx), ...tensionSuggestions(tensions, ctx)];
  rankByPhrase(placed, phrases);
  const suggestions = orderByKey(placed, ([index, s]) => index * 4 + ROLE_ORDER[s.role], main.length * 4).map(([, s]) => s);

  return {
    id: part.id,
    name: part.name,
    measureCount: part.measures.length,
    noteCount: notes.length,
    key,
    localKeys,
    notes,
    phrases: phrases.map((p) => ({ start: main[p.start].note.key, peak: main[p.peak].note.key, end: main[p.end].note.key })),
    suggestions,
    ...(players && line ? { lines: { writtenAs: players.writtenAs, line } } : {}),
  };
}

/** `fracString` keeping one string per fraction: a long part repeats a few onsets and durations. */
function fractionTexts(): (f: Fraction) => string {
  const byDen = new Map<number, Map<number, string>>();
  return (f) => {
    let byNum = byDen.get(f.den);
    if (!byNum) byDen.set(f.den, (byNum = new Map()));
    let text = byNum.get(f.num);
    if (text === undefined) byNum.set(f.num, (text = fracString(f)));
    return text;
  };
}

/** Analysis of every part of a score, as printed by `npm run analyze`. */
export function analyzeScore(score: ScoreModel, fileName: string): ScoreAnalysis {
  return { file: fileName, parts: score.parts.map((p) => analyzePart(score, p)) };
}
