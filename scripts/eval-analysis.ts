/**
 * `npm run eval:analysis`: scores the analysis against the hand-written answer keys in samples/.
 * Tension tones: precision and recall of suggestions with confidence ≥ 0.5; resolutions: share of
 * correctly matched tension tones whose `resolvesTo` is also right; phrase boundaries: F1 of
 * phrase starts with a tolerance of one note (one-to-one matching). Peaks and the key are shown too.
 */
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { analyzeScore } from "@/lib/analysis";
import type { AnalyzedNote, PartAnalysis } from "@/lib/analysis/types";
import { readScoreFile } from "@/lib/musicxml";
import { printHarmony } from "./eval-harmony";

interface NoteRef {
  measure: string;
  onset: string;
  pitch: string;
}
interface Answers {
  part: string;
  key: { tonic: string; mode: string };
  tensions: Array<NoteRef & { resolvesTo: NoteRef | null }>;
  phraseStarts: NoteRef[];
  peaks: NoteRef[];
}

export const GOALS = { precision: 0.9, recall: 0.9, resolutions: 0.9, boundaryF1: 0.8 } as const;

function onsetValue(text: string): number {
  const [n, d] = text.split("/").map(Number);
  return d === undefined ? n : n / d;
}

const idOf = (r: NoteRef) => `${r.measure}|${onsetValue(r.onset).toFixed(6)}|${r.pitch}`;

export interface SampleScore {
  name: string;
  keyRight: boolean;
  tp: number;
  predicted: number;
  gold: number;
  resolutionsRight: number;
  boundaryTp: number;
  boundaryPredicted: number;
  boundaryGold: number;
  peaksRight: number;
  peaksGold: number;
  misses: string[];
}

export function scoreSample(name: string, part: PartAnalysis, answers: Answers): SampleScore {
  const byKey = new Map<string, AnalyzedNote>(part.notes.map((n) => [n.key, n]));
  const ref = (key: string | null): string | null => {
    if (key === null) return null;
    const n = byKey.get(key);
    return n ? idOf({ measure: n.measure, onset: n.onset, pitch: n.pitch }) : `?${key}`;
  };
  const misses: string[] = [];

  const predicted = new Map<string, string | null>();
  for (const s of part.suggestions) if (s.role === "tension" && s.confidence >= 0.5) predicted.set(ref(s.note) as string, ref(s.resolvesTo));
  let tp = 0;
  let resolutionsRight = 0;
  const goldIds = new Set<string>();
  for (const t of answers.tensions) {
    const id = idOf(t);
    goldIds.add(id);
    if (!predicted.has(id)) {
      misses.push(`missed tension ${id}`);
      continue;
    }
    tp++;
    const want = t.resolvesTo ? idOf(t.resolvesTo) : null;
    if (predicted.get(id) === want) resolutionsRight++;
    else misses.push(`resolution of ${id}: got ${predicted.get(id)}, want ${want}`);
  }
  for (const id of predicted.keys()) if (!goldIds.has(id)) misses.push(`extra tension ${id}`);

  // Phrase starts as positions in the sequence of main (non-grace) notes.
  const main = part.notes.filter((n) => n.duration !== "0/1");
  const pos = new Map(main.map((n, i) => [idOf({ measure: n.measure, onset: n.onset, pitch: n.pitch }), i]));
  const keyPos = new Map(main.map((n, i) => [n.key, i]));
  const predStarts = part.phrases.map((p) => keyPos.get(p.start) ?? -99);
  const goldStarts = answers.phraseStarts.map((r) => {
    const i = pos.get(idOf(r));
    if (i === undefined) misses.push(`phrase start not among the notes: ${idOf(r)}`);
    return i ?? -999;
  });
  const used = new Set<number>();
  let boundaryTp = 0;
  for (const tolerance of [0, 1]) {
    for (const p of predStarts) {
      if (used.has(-p - 1000)) continue;
      const j = goldStarts.findIndex((g, gi) => !used.has(gi) && Math.abs(g - p) === tolerance);
      if (j >= 0) {
        used.add(j);
        used.add(-p - 1000);
        boundaryTp++;
      }
    }
  }
  goldStarts.forEach((g, gi) => {
    if (!used.has(gi)) misses.push(`missed phrase start ${answers.phraseStarts[gi] ? idOf(answers.phraseStarts[gi]) : g}`);
  });
  predStarts.forEach((p) => {
    if (!used.has(-p - 1000)) misses.push(`extra phrase start ${main[p] ? idOf({ measure: main[p].measure, onset: main[p].onset, pitch: main[p].pitch }) : p}`);
  });

  const predPeaks = new Set(part.phrases.map((p) => ref(p.peak)));
  let peaksRight = 0;
  for (const r of answers.peaks) {
    if (predPeaks.has(idOf(r))) peaksRight++;
    else misses.push(`peak not found ${idOf(r)}`);
  }
  const keyRight = part.key.tonic === answers.key.tonic && part.key.mode === answers.key.mode;
  if (!keyRight) misses.push(`key: got ${part.key.tonic} ${part.key.mode}, want ${answers.key.tonic} ${answers.key.mode}`);
  return {
    name,
    keyRight,
    tp,
    predicted: predicted.size,
    gold: answers.tensions.length,
    resolutionsRight,
    boundaryTp,
    boundaryPredicted: predStarts.length,
    boundaryGold: goldStarts.length,
    peaksRight,
    peaksGold: answers.peaks.length,
    misses,
  };
}

const ratio = (a: number, b: number) => (b === 0 ? 1 : a / b);
const f1 = (tp: number, p: number, g: number) => {
  const prec = ratio(tp, p);
  const rec = ratio(tp, g);
  return prec + rec === 0 ? 0 : (2 * prec * rec) / (prec + rec);
};

function main(): void {
  const dir = path.resolve(process.cwd(), "samples");
  const verbose = process.argv.includes("--verbose");
  const answerFiles = readdirSync(dir)
    .filter((f) => f.endsWith(".answers.json"))
    .sort();
  if (answerFiles.length === 0) {
    console.error("no answer keys in samples/");
    process.exit(2);
  }
  const scores: SampleScore[] = [];
  for (const f of answerFiles) {
    const base = f.replace(/\.answers\.json$/, "");
    const file = [".musicxml", ".mxl", ".xml"].map((e) => base + e).find((c) => readdirSync(dir).includes(c));
    if (!file) {
      console.error(`no sample file for ${f}`);
      continue;
    }
    const answers = JSON.parse(readFileSync(path.join(dir, f), "utf8")) as Answers;
    const { score } = readScoreFile(readFileSync(path.join(dir, file)), file);
    const analysis = analyzeScore(score, file);
    const part = analysis.parts.find((p) => p.id === answers.part);
    if (!part) {
      console.error(`${file}: no part ${answers.part}`);
      continue;
    }
    scores.push(scoreSample(base, part, answers));
  }
  const fmt = (v: number) => v.toFixed(2);
  const rows = scores.map((s) => ({
    sample: s.name,
    key: s.keyRight ? "ok" : "WRONG",
    "tension P": fmt(ratio(s.tp, s.predicted)),
    "tension R": fmt(ratio(s.tp, s.gold)),
    "resolutions": fmt(ratio(s.resolutionsRight, s.tp)),
    "boundary F1": fmt(f1(s.boundaryTp, s.boundaryPredicted, s.boundaryGold)),
    peaks: `${s.peaksRight}/${s.peaksGold}`,
    "tp/pred/gold": `${s.tp}/${s.predicted}/${s.gold}`,
  }));
  const sum = (k: keyof SampleScore) => scores.reduce((a, s) => a + (s[k] as number), 0);
  const total = {
    precision: ratio(sum("tp"), sum("predicted")),
    recall: ratio(sum("tp"), sum("gold")),
    resolutions: ratio(sum("resolutionsRight"), sum("tp")),
    boundaryF1: f1(sum("boundaryTp"), sum("boundaryPredicted"), sum("boundaryGold")),
  };
  rows.push({
    sample: "TOTAL (micro)",
    key: `${scores.filter((s) => s.keyRight).length}/${scores.length}`,
    "tension P": fmt(total.precision),
    "tension R": fmt(total.recall),
    resolutions: fmt(total.resolutions),
    "boundary F1": fmt(total.boundaryF1),
    peaks: `${sum("peaksRight")}/${sum("peaksGold")}`,
    "tp/pred/gold": `${sum("tp")}/${sum("predicted")}/${sum("gold")}`,
  });
  const cols = Object.keys(rows[0]) as Array<keyof (typeof rows)[0]>;
  const width = cols.map((c) => Math.max(c.length, ...rows.map((r) => String(r[c]).length)));
  const line = (r: Record<string, string>) => cols.map((c, i) => String(r[c]).padEnd(width[i])).join("  ");
  console.log(line(Object.fromEntries(cols.map((c) => [c, c]))));
  console.log(width.map((w) => "-".repeat(w)).join("  "));
  for (const [i, r] of rows.entries()) {
    if (i === rows.length - 1) console.log(width.map((w) => "-".repeat(w)).join("  "));
    console.log(line(r));
  }
  const met = (Object.keys(GOALS) as Array<keyof typeof GOALS>).map((k) => `${k} ${fmt(total[k])} ${total[k] >= GOALS[k] ? "≥" : "<"} ${GOALS[k]}`);
  console.log(`\nGoals: ${met.join("; ")}`);
  if (verbose) for (const s of scores) for (const m of s.misses) console.log(`${s.name}: ${m}`);
  printHarmony(path.resolve(process.cwd(), "tests/fixtures/harmony"), verbose);
}

main();
