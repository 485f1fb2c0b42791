/**
 * Where the reader spends its time: reads a generated part (100 000 notes, 6 times by default) for
 * `node --cpu-prof` (see DEVELOPERS.md, Benchmarks).
 *
 *   npx esbuild scripts/bench/reader-profile.ts --bundle --platform=node --outfile=test-results/reader-profile.cjs
 *   node --cpu-prof --cpu-prof-dir=test-results/profile test-results/reader-profile.cjs 100000 6
 */
import { readScoreFile } from "../../lib/musicxml";
import { generatePart } from "./reader";

const bytes = new TextEncoder().encode(generatePart(Number(process.argv[2] ?? 100_000)));
for (let i = 0; i < Number(process.argv[3] ?? 6); i++) readScoreFile(bytes, "generated.musicxml", { maxFileBytes: Infinity });
