/**
 * Guards speed work on the reader: the model it builds must not change. Reads every score under
 * tests/fixtures/ and samples/ plus generated parts (scripts/bench/reader.ts), twice (plainly, and
 * with note sites and own elements dropped, as the export and the upload's marking import ask),
 * and writes one canonical JSON file per read: score, normalized text, sites, or the refusal.
 *
 *   npx tsx scripts/reader-snapshot.ts write test-results/reader-before
 *   npx tsx scripts/reader-snapshot.ts compare test-results/reader-before
 *
 * `compare` prints the first differing read and exits 1 when any read differs.
 */
import { createHash } from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { OWN_SITES } from "../lib/export/note-sites";
import { readScoreFile } from "../lib/musicxml";
import { generatePart } from "./bench/reader";

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

/** JSON with object keys sorted, so the same model always prints the same text. */
function canonical(v: unknown): string {
  return JSON.stringify(v, (_k, x: unknown) => {
    if (x instanceof Set) return [...x];
    if (x instanceof Map) return Object.fromEntries(x);
    if (x && typeof x === "object" && !Array.isArray(x)) {
      const o = x as Record<string, unknown>;
      return Object.fromEntries(Object.keys(o).sort().map((k) => [k, o[k]]));
    }
    return x;
  });
}

function* readAll(): Generator<{ name: string; json: string }> {
  const inputs: Array<{ name: string; load: () => Uint8Array }> = [];
  for (const dir of ["tests/fixtures", "samples"]) {
    for (const f of files(path.join(root, dir))) inputs.push({ name: path.relative(root, f), load: () => fs.readFileSync(f) });
  }
  for (const n of [1_000, 20_000]) inputs.push({ name: `generated-${n}`, load: () => new TextEncoder().encode(generatePart(n)) });
  for (const { name, load } of inputs) {
    const bytes = load();
    for (const mode of ["plain", "sites"] as const) {
      let result: unknown;
      try {
        result = readScoreFile(bytes, name, { maxFileBytes: Infinity }, mode === "sites" ? { sites: OWN_SITES, dropOwn: true } : undefined);
      } catch (err) {
        const e = err as Error & { code?: string };
        result = { refused: e.code ?? e.name, message: e.message };
      }
      yield { name: `${name} (${mode})`, json: canonical(result) };
    }
  }
}

/** One file per read in the snapshot folder, named after the read. */
const fileOf = (dir: string, name: string) => path.join(dir, name.replace(/[^A-Za-z0-9.-]+/g, "_") + ".json");

const [cmd, dir] = process.argv.slice(2);
if ((cmd !== "write" && cmd !== "compare") || !dir) {
  console.error("usage: reader-snapshot.ts write|compare <folder>");
  process.exit(2);
}
const hash = createHash("sha256");
let count = 0;
let differ = 0;
if (cmd === "write") fs.mkdirSync(dir, { recursive: true });
for (const r of readAll()) {
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
    console.log(`new read: ${r.name}`);
    continue;
  }
  let i = 0;
  while (i < b.length && b[i] === r.json[i]) i++;
  console.log(`${r.name} differs at ${i}:\n  before …${b.slice(Math.max(0, i - 160), i + 160)}\n  after  …${r.json.slice(Math.max(0, i - 160), i + 160)}`);
}
const digest = hash.digest("hex").slice(0, 16);
if (cmd === "write") console.log(`${count} reads written (${digest})`);
else console.log(differ ? `${differ} of ${count} reads differ (${digest})` : `all ${count} reads identical (${digest})`);
process.exit(differ ? 1 : 0);
