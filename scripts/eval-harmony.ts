/**
 * The harmony section of `npm run eval:analysis`: local keys and leading tones against experts'
 * Roman-numeral analyses (tests/fixtures/harmony, from When-in-Rome; see its SOURCES.md).
 *
 * - Local key per bar: the expert's key of a bar is the key in force for the longest time in it
 *   (lib/analysis/romantext.ts `keyOfBar`); a method is right when tonic (pitch class) and mode
 *   agree. "Away from home" counts only bars whose expert key differs from the analysis's first key.
 * - Leading tones: the melody is the top line of the first part (the soprano of the textbook
 *   chorales, the right hand of the keyboard pieces) — the line a flutist would play — read the
 *   way the analysis reads it (`extractMelody`). A melody note is a leading tone when the expert's
 *   chord at its onset has it as its leading tone (the third of V or the root of vii°, of the key
 *   or of the chord an applied V/x or vii°/x points to) and the next melody note rises a half step.
 * - Three methods in one run: "never modulates" (the expert's first key held throughout), a plain
 *   windowed Krumhansl–Kessler baseline (K–S correlation over the bar and its two neighbours, every
 *   part, duration-weighted), and Ondula (lib/analysis on the first part, the others as context).
 * - Two halves, by piece: the pieces in name order, alternately "tuning" (1st, 3rd, …) and
 *   "held out" (2nd, 4th, …), so that every source (the preludes, each textbook) falls in both.
 *   Ondula's constants are set on the tuning half only (`scripts/tune-harmony.ts`); the held-out
 *   figures say how far they carry to music they were not set on.
 */
import { readFileSync, readdirSync } from "node:fs";
import path from "node:path";
import { type AnalyzeOptions, analyzePart } from "@/lib/analysis";
import { findKey } from "@/lib/analysis/key-finding";
import { buildTimeline, extractMelody, type MelodyNote } from "@/lib/analysis/melody";
import { KRUMHANSL_KESSLER } from "@/lib/analysis/profiles";
import { type RomanText, chordAt, keyOfBar, parseRomanText, timeSignatureAt } from "@/lib/analysis/romantext";
import { lofOfName, mod, pcOfLof } from "@/lib/analysis/spelling";
import { readScoreFile } from "@/lib/musicxml";
import type { ScoreModel } from "@/lib/musicxml/model";

export const HARMONY_GOALS = { localKey: 0.85, awayFromHome: 0.7, aboveNeverModulates: 0.15, ltPrecision: 0.8, ltRecall: 0.8 } as const;

/** A key as pitch class and mode: spelling aside (F♯ = G♭), as the check compares keys. */
export interface PcKey {
  pc: number;
  mode: "major" | "minor";
}
const same = (a: PcKey | null, b: PcKey | null) => !!a && !!b && a.pc === b.pc && a.mode === b.mode;

export interface PieceInput {
  name: string;
  score: ScoreModel;
  rt: RomanText;
}

export interface MethodCounts {
  bars: number;
  barsRight: number;
  away: number;
  awayRight: number;
  ltTp: number;
  ltPredicted: number;
  ltGold: number;
}

export type Method = "never modulates" | "windowed K–K" | "Ondula";
export const METHODS: readonly Method[] = ["never modulates", "windowed K–K", "Ondula"];

const empty = (): MethodCounts => ({ bars: 0, barsRight: 0, away: 0, awayRight: 0, ltTp: 0, ltPredicted: 0, ltGold: 0 });

/** Where a melody note falls in the expert's beats: 1 + onset / beat length. */
function beatOf(rt: RomanText, measure: number, onsetWhole: number): number {
  const ts = timeSignatureAt(rt, measure);
  const compound = ts.beats % 3 === 0 && ts.beats > 3 && ts.beatType >= 8;
  return 1 + onsetWhole / (compound ? 3 / ts.beatType : 1 / ts.beatType);
}

const measureNo = (n: MelodyNote) => Number.parseInt(n.note.measureNumber, 10);

/** Leading tones of a melody by the expert's chords: note keys. */
export function goldLeadingTones(rt: RomanText, melody: readonly MelodyNote[]): Set<string> {
  const out = new Set<string>();
  for (let i = 0; i + 1 < melody.length; i++) {
    const n = melody[i];
    const next = melody[i + 1];
    if (next.midi - n.midi !== 1) continue;
    const m = measureNo(n);
    if (!Number.isFinite(m)) continue;
    const chord = chordAt(rt, m, beatOf(rt, m, n.onset));
    if (chord?.leadingToneLof == null) continue;
    if (pcOfLof(chord.leadingToneLof) === mod(n.midi, 12)) out.add(n.note.key);
  }
  return out;
}

/** Leading tones a key per bar implies: the note a half step below the bar's tonic, rising to it. */
function keyLeadingTones(melody: readonly MelodyNote[], keyOfMeasure: (index: number) => PcKey | null): Set<string> {
  const out = new Set<string>();
  for (let i = 0; i + 1 < melody.length; i++) {
    const n = melody[i];
    const k = keyOfMeasure(n.measureIndex);
    if (!k || melody[i + 1].midi - n.midi !== 1) continue;
    if (mod(n.midi + 1, 12) === k.pc) out.add(n.note.key);
  }
  return out;
}

/** K–S with the Krumhansl–Kessler profile over the bar and its neighbours, every part counted. */
function windowedKk(score: ScoreModel, measureCount: number): PcKey[] {
  const perBar = Array.from({ length: measureCount }, () => new Array<number>(12).fill(0));
  for (const p of score.parts) {
    for (const n of p.notes) {
      if (n.isRest || n.isGrace || n.isCue || !n.pitch || n.measureIndex >= measureCount) continue;
      perBar[n.measureIndex][mod(n.pitch.midi, 12)] += n.duration.num / n.duration.den;
    }
  }
  return perBar.map((_, i) => {
    const h = new Array<number>(12).fill(0);
    for (let j = Math.max(0, i - 1); j <= Math.min(measureCount - 1, i + 1); j++) for (let pc = 0; pc < 12; pc++) h[pc] += perBar[j][pc];
    const best = findKey(h, KRUMHANSL_KESSLER)[0];
    return { pc: best.tonicPc, mode: best.mode };
  });
}

/** Ondula's key of every measure of the analysed part: the part's key, overridden by local keys. */
function ondulaKeys(score: ScoreModel, options: AnalyzeOptions = {}): { keys: Array<PcKey | null>; leadingTones: Set<string> } {
  const part = score.parts[0];
  const a = analyzePart(score, part, options);
  const home: PcKey = { pc: pcOfLof(lofOfName(a.key.tonic)), mode: a.key.mode };
  const indexOf = new Map(part.measures.map((m) => [m.number, m.index]));
  const keys: Array<PcKey | null> = part.measures.map(() => home);
  for (const lk of a.localKeys) {
    const from = indexOf.get(lk.fromMeasure);
    const to = indexOf.get(lk.toMeasure);
    if (from === undefined || to === undefined) continue;
    for (let i = from; i <= to; i++) keys[i] = { pc: pcOfLof(lofOfName(lk.tonic)), mode: lk.mode };
  }
  const leadingTones = new Set<string>();
  for (const s of a.suggestions) {
    if (s.role === "tension" && s.confidence >= 0.5 && s.resolvesTo !== null && (s.kind === "leading-tone" || s.kind === "raised" || s.kind === "applied-leading-tone")) leadingTones.add(s.note);
  }
  return { keys, leadingTones };
}

const KEY_NAMES = ["C", "C#", "D", "Eb", "E", "F", "F#", "G", "Ab", "A", "Bb", "B"];
const show = (k: PcKey | null) => (k ? (k.mode === "major" ? KEY_NAMES[k.pc] : KEY_NAMES[k.pc].toLowerCase()) : "-");

export function evaluatePiece(piece: PieceInput, trace?: (line: string) => void, options: AnalyzeOptions = {}): Record<Method, MethodCounts> {
  const { score, rt } = piece;
  const part = score.parts[0];
  const melody = extractMelody(part, buildTimeline(score, part)).filter((n) => !n.grace);
  const first = rt.chords[0]?.key;
  const home: PcKey | null = first ? { pc: pcOfLof(first.tonicLof), mode: first.mode } : null;
  const gold: Array<PcKey | null> = part.measures.map((m) => {
    const no = Number.parseInt(m.number, 10);
    const k = Number.isFinite(no) ? keyOfBar(rt, no) : null;
    return k ? { pc: pcOfLof(k.tonicLof), mode: k.mode } : null;
  });
  const goldLt = goldLeadingTones(rt, melody);
  const kk = windowedKk(score, part.measures.length);
  const ondula = ondulaKeys(score, options);
  const predicted: Record<Method, { keyAt: (i: number) => PcKey | null; lt: Set<string> }> = {
    "never modulates": { keyAt: () => home, lt: keyLeadingTones(melody, () => home) },
    "windowed K–K": { keyAt: (i) => kk[i], lt: keyLeadingTones(melody, (i) => kk[i]) },
    Ondula: { keyAt: (i) => ondula.keys[i], lt: ondula.leadingTones },
  };
  if (trace) {
    trace(`${piece.name}  expert: ${gold.map(show).join(" ")}`);
    trace(`${" ".repeat(piece.name.length)}  Ondula: ${gold.map((_, i) => show(ondula.keys[i])).join(" ")}`);
    // Every leading tone the two disagree on, with its bar and the expert's beat and chord.
    for (const n of melody) {
      const said = ondula.leadingTones.has(n.note.key);
      if (said === goldLt.has(n.note.key)) continue;
      const m = measureNo(n);
      const beat = beatOf(rt, m, n.onset);
      trace(`  ${said ? "extra" : "missed"} leading tone ${n.note.pitch?.name ?? "?"} bar ${m} beat ${Number(beat.toFixed(3))} (expert ${chordAt(rt, m, beat)?.figure ?? "-"}, Ondula ${show(ondula.keys[n.measureIndex])})`);
    }
  }
  const out = {} as Record<Method, MethodCounts>;
  for (const method of METHODS) {
    const c = empty();
    const p = predicted[method];
    gold.forEach((g, i) => {
      if (!g) return;
      const right = same(p.keyAt(i), g);
      c.bars++;
      if (right) c.barsRight++;
      if (!same(g, home)) {
        c.away++;
        if (right) c.awayRight++;
      }
    });
    c.ltGold = goldLt.size;
    c.ltPredicted = p.lt.size;
    for (const k of p.lt) if (goldLt.has(k)) c.ltTp++;
    out[method] = c;
  }
  return out;
}

export function loadHarmonyCorpus(dir: string): PieceInput[] {
  const files = readdirSync(dir);
  return files
    .filter((f) => f.endsWith(".rntxt"))
    .sort()
    .flatMap((f) => {
      const base = f.replace(/\.rntxt$/, "");
      const scoreFile = [".mxl", ".musicxml", ".xml"].map((e) => base + e).find((c) => files.includes(c));
      if (!scoreFile) return [];
      const { score } = readScoreFile(readFileSync(path.join(dir, scoreFile)), scoreFile);
      return [{ name: base, score, rt: parseRomanText(readFileSync(path.join(dir, f), "utf8")) }];
    });
}

/** The corpus split by piece: name order, alternately tuning and held out (deterministic). */
export function splitCorpus<T extends { name: string }>(pieces: readonly T[]): { tuning: T[]; heldOut: T[] } {
  const sorted = [...pieces].sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0));
  return { tuning: sorted.filter((_, i) => i % 2 === 0), heldOut: sorted.filter((_, i) => i % 2 === 1) };
}

export interface HarmonyTotals {
  method: Method;
  counts: MethodCounts;
  localKey: number;
  awayFromHome: number;
  ltPrecision: number;
  ltRecall: number;
}

const ratio = (a: number, b: number) => (b === 0 ? 1 : a / b);

export function evaluateHarmony(pieces: readonly PieceInput[], trace?: (line: string) => void): { totals: HarmonyTotals[]; perPiece: Array<{ name: string; result: Record<Method, MethodCounts> }> } {
  const perPiece = pieces.map((p) => ({ name: p.name, result: evaluatePiece(p, trace) }));
  return { totals: totalsOf(perPiece), perPiece };
}

/** Sums of the counts over pieces, and the four figures, per method. */
export function totalsOf(perPiece: ReadonlyArray<{ result: Record<Method, MethodCounts> }>): HarmonyTotals[] {
  return METHODS.map((method) => {
    const c = empty();
    for (const p of perPiece) for (const k of Object.keys(c) as Array<keyof MethodCounts>) c[k] += p.result[method][k];
    return {
      method,
      counts: c,
      localKey: ratio(c.barsRight, c.bars),
      awayFromHome: ratio(c.awayRight, c.away),
      ltPrecision: ratio(c.ltTp, c.ltPredicted),
      ltRecall: ratio(c.ltTp, c.ltGold),
    };
  });
}

const pct = (v: number) => `${(v * 100).toFixed(1)} %`;

function printRows(totals: readonly HarmonyTotals[], label?: string): void {
  const rows = totals.map((t) => ({
    method: label ? `${t.method} (${label})` : t.method,
    "local key": pct(t.localKey),
    "away from home": pct(t.awayFromHome),
    "LT precision": t.ltPrecision.toFixed(2),
    "LT recall": t.ltRecall.toFixed(2),
    "LT tp/pred/gold": `${t.counts.ltTp}/${t.counts.ltPredicted}/${t.counts.ltGold}`,
  }));
  const cols = Object.keys(rows[0]) as Array<keyof (typeof rows)[0]>;
  const width = cols.map((c) => Math.max(c.length, ...rows.map((r) => String(r[c]).length)));
  const line = (r: Record<string, string>) => cols.map((c, i) => String(r[c]).padEnd(width[i])).join("  ");
  console.log(line(Object.fromEntries(cols.map((c) => [c, c]))));
  console.log(width.map((w) => "-".repeat(w)).join("  "));
  for (const r of rows) console.log(line(r));
}

/** Prints the harmony section: one row per method, then the goals for Ondula. */
export function printHarmony(dir: string, verbose: boolean): void {
  const pieces = loadHarmonyCorpus(dir);
  const traced: string[] = [];
  const { totals, perPiece } = evaluateHarmony(pieces, verbose ? (l) => traced.push(l) : undefined);
  const bars = totals[0].counts.bars;
  const away = totals[0].counts.away;
  console.log(`\nHarmony: ${pieces.length} pieces of tests/fixtures/harmony, ${bars} bars (${away} away from the home key), ${totals[0].counts.ltGold} leading tones in the melody`);
  printRows(totals);
  const o = totals[2];
  const never = totals[0];
  const G = HARMONY_GOALS;
  const above = o.localKey - never.localKey;
  const goals = [
    `local key ${pct(o.localKey)} ${o.localKey >= G.localKey ? "≥" : "<"} ${pct(G.localKey)}`,
    `away from home ${pct(o.awayFromHome)} ${o.awayFromHome >= G.awayFromHome ? "≥" : "<"} ${pct(G.awayFromHome)}`,
    `above never-modulates ${(above * 100).toFixed(1)} points ${above >= G.aboveNeverModulates ? "≥" : "<"} ${G.aboveNeverModulates * 100}`,
    `LT precision ${o.ltPrecision.toFixed(2)} ${o.ltPrecision >= G.ltPrecision ? "≥" : "<"} ${G.ltPrecision}`,
    `LT recall ${o.ltRecall.toFixed(2)} ${o.ltRecall >= G.ltRecall ? "≥" : "<"} ${G.ltRecall}`,
  ];
  console.log(`\nHarmony goals (Ondula): ${goals.join("; ")}`);
  const halves = splitCorpus(perPiece);
  for (const [label, half] of [["tuning", halves.tuning], ["held out", halves.heldOut]] as const) {
    const t = totalsOf(half);
    console.log(`\n${label === "tuning" ? "Tuning half" : "Held-out half"}: ${half.length} pieces, ${t[0].counts.bars} bars (${t[0].counts.away} away from home), ${t[0].counts.ltGold} leading tones`);
    printRows(t, label);
  }
  if (verbose) {
    for (const l of traced) console.log(l);
    for (const p of perPiece) {
      const r = p.result.Ondula;
      console.log(`${p.name}: bars ${r.barsRight}/${r.bars}, away ${r.awayRight}/${r.away}, LT ${r.ltTp}/${r.ltPredicted}/${r.ltGold}`);
    }
  }
}
