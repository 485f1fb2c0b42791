/**
 * Guards speed work on the analysis: its results must not change. Analyses every score under
 * tests/fixtures/ and samples/ plus generated parts (scripts/bench/analysis.ts), every part (and
 * for a staff of two players both lines), as written and again with every key's mode removed, and
 * writes one canonical JSON file per score and way: the analysis, or the reader's refusal.
 *
 *   npx tsx scripts/analysis-snapshot.ts write test-results/analysis-before
 *   npx tsx scripts/analysis-snapshot.ts compare test-results/analysis-before
 *
 * `compare` prints the first differing analysis and exits 1 when any differs.
 */
import { analyzePart } from "../lib/analysis";
import { readScoreFile } from "../lib/musicxml";
import { twoPlayersOf } from "../lib/musicxml/lines";
import { generatePart } from "./bench/analysis";
import { canonical, refusal, runSnapshot, snapshotInputs } from "./snapshot";

function* analyzeAll(): Generator<{ name: string; json: string }> {
  for (const { name, load } of snapshotInputs(generatePart)) {
    for (const modes of ["as written", "no modes"] as const) {
      let result: unknown;
      try {
        const { score } = readScoreFile(load(), name, { maxFileBytes: Infinity, maxNotes: Infinity });
        if (modes === "no modes") for (const p of score.parts) for (const m of p.measures) m.key = { ...m.key, mode: null };
        result = score.parts.map((p) => {
          const players = twoPlayersOf(p);
          return players ? { upper: analyzePart(score, p, { line: "upper" }), lower: analyzePart(score, p, { line: "lower" }) } : analyzePart(score, p);
        });
      } catch (err) {
        result = refusal(err);
      }
      yield { name: modes === "as written" ? name : `${name} (${modes})`, json: canonical(result) };
    }
  }
}

runSnapshot("analysis-snapshot.ts", { one: "analysis", many: "analyses" }, analyzeAll());
