/**
 * Where the analysis spends its time: analyses a generated part (100 000 notes, 6 times by
 * default) for `node --cpu-prof` (see DEVELOPERS.md, Benchmarks).
 *
 *   npx esbuild scripts/bench/analysis-profile.ts --bundle --platform=node --outfile=test-results/analysis-profile.cjs
 *   node --cpu-prof --cpu-prof-dir=test-results/profile test-results/analysis-profile.cjs 100000 6
 */
import { analyzeScore } from "../../lib/analysis";
import { readScoreFile } from "../../lib/musicxml";
import { generatePart } from "./analysis";

const n = Number(process.argv[2] ?? 100_000);
const bytes = new TextEncoder().encode(generatePart(n));
const { score } = readScoreFile(bytes, "generated.musicxml", { maxFileBytes: Infinity, maxNotes: n + 10 });
for (let i = 0; i < Number(process.argv[3] ?? 6); i++) analyzeScore(score, "generated.musicxml");
