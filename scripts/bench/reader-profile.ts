/**
 * Where the reader spends its time: reads a generated part of 100 000 notes a few times, for
 * `node --cpu-prof` (see DEVELOPERS.md, Benchmarks).
 *
 *   npx tsx --cpu-prof --cpu-prof-dir=test-results/profile scripts/bench/reader-profile.ts
 */
import { readScoreFile } from "../../lib/musicxml";
import { generatePart } from "./reader";

const bytes = new TextEncoder().encode(generatePart(Number(process.argv[2] ?? 100_000)));
for (let i = 0; i < Number(process.argv[3] ?? 6); i++) readScoreFile(bytes, "generated.musicxml", { maxFileBytes: Infinity });
