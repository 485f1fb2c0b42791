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
import { createHash } from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { analyzePart } from "../lib/analysis";
import { readScoreFile } from "../lib/musicxml";
import { twoPlayersOf } from "../lib/musicxml/lines";
import { generatePart } from "./bench/analysis";

const root = path.resolve(__dirname, "..");
const SCORE = /\.(xml|musicxml|mxl)$/;

function files(dir: string): string[] {
  const out: string[] = [];
  for (const e of fs.readdirSync(dir, { withFileTypes: true }).sort((a, b) => (a.name < b.name ? -1 : 1))) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) out.push(...files(p));
    else if (SCORE.test(e.name)) out.push(p);
  }
  return out;
}

/** JSON with object keys sorted, so the same result always prints the same text. */
function canonical(v: unknown): string {
  return JSON.stringify(v, (_k, x: unknown) => {
    if (x && typeof x === "object" && !Array.isArray(x)) {
      const o = x as Record<string, unknown>;
      return Object.fromEntries(Object.keys(o).sort().map((k) => [k, o[k]]));
    }
    return x;
  });
}

function inputs(): Array<{ name: string; load: () => Uint8Array }> {
  const inputs: Array<{ name: string; load: () => Uint8Array }> = [];
  for (const dir of ["tests/fixtures", "samples"]) {
    for (const f of files(path.join(root, dir))) inputs.push({ name: path.relative(root, f), load: () => fs.readFileSync(f) });
  }
  for (const n of [1_000, 20_000]) inputs.push({ name: `generated-${n}`, load: () => new TextEncoder().encode(generatePart(n)) });
  return inputs;
}

/** Every part analysed as `analyzeScore` does, then again with every key's mode removed (so the
 * key and its changes are inferred from the notes). */
function* analyzeAll(): Generator<{ name: string; json: string }> {
  for (const { name, load } of inputs()) {
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
        const e = err as Error & { code?: string };
        result = { refused: e.code ?? e.name, message: e.message };
      }
      yield { name: modes === "as written" ? name : `${name} (${modes})`, json: canonical(result) };
    }
  }
}

/** One file per score in the snapshot folder, named after the score. */
const fileOf = (dir: string, name: string) => path.join(dir, name.replace(/[^A-Za-z0-9.-]+/g, "_") + ".json");

const [cmd, dir] = process.argv.slice(2);
if ((cmd !== "write" && cmd !== "compare") || !dir) {
  console.error("usage: analysis-snapshot.ts write|compare <folder>");
  process.exit(2);
}
const hash = createHash("sha256");
let count = 0;
let differ = 0;
if (cmd === "write") fs.mkdirSync(dir, { recursive: true });
for (const r of analyzeAll()) {
  count++;
  hash.update(r.json);
  const f = fileOf(dir, r.name);
  if (cmd === "write") {
    fs.writeFileSync(f, r.json);
    continue;
  }
  const b = fs.existsSync(f) ? fs.readFileSync(f, "utf8") : undefined;
  if (b === r.json) continue;
  differ++;
  if (b === undefined) {
    console.log(`new analysis: ${r.name}`);
    continue;
  }
  let i = 0;
  while (i < b.length && b[i] === r.json[i]) i++;
  console.log(`${r.name} differs at ${i}:\n  before …${b.slice(Math.max(0, i - 160), i + 160)}\n  after  …${r.json.slice(Math.max(0, i - 160), i + 160)}`);
}
const digest = hash.digest("hex").slice(0, 16);
if (cmd === "write") console.log(`${count} analyses written (${digest})`);
else console.log(differ ? `${differ} of ${count} analyses differ (${digest})` : `all ${count} analyses identical (${digest})`);
process.exit(differ ? 1 : 0);
