/**
 * What the reader and analysis snapshots share (scripts/reader-snapshot.ts,
 * scripts/analysis-snapshot.ts): the scores they run on, one canonical JSON text per result, and
 * the write / compare command that guards speed work against any change in results.
 */
import { createHash } from "node:crypto";
import fs from "node:fs";
import path from "node:path";

const root = path.resolve(__dirname, "..");
const SCORE = /\.(xml|musicxml|mxl)$/;

export interface SnapshotInput {
  name: string;
  load: () => Uint8Array;
}

function files(dir: string): string[] {
  const out: string[] = [];
  for (const e of fs.readdirSync(dir, { withFileTypes: true }).sort((a, b) => (a.name < b.name ? -1 : 1))) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) out.push(...files(p));
    else if (SCORE.test(e.name)) out.push(p);
  }
  return out;
}

/** Every score under tests/fixtures/ and samples/, then generated parts of 1,000 and 20,000 notes. */
export function snapshotInputs(generatePart: (notes: number) => string): SnapshotInput[] {
  const inputs: SnapshotInput[] = [];
  for (const dir of ["tests/fixtures", "samples"]) {
    for (const f of files(path.join(root, dir))) inputs.push({ name: path.relative(root, f), load: () => fs.readFileSync(f) });
  }
  for (const n of [1_000, 20_000]) inputs.push({ name: `generated-${n}`, load: () => new TextEncoder().encode(generatePart(n)) });
  return inputs;
}

/** JSON with object keys sorted (sets as lists, maps as objects), so the same result always prints the same text. */
export function canonical(v: unknown): string {
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

/** A refusal in place of a result: the error's code (or name) and message. */
export function refusal(err: unknown): { refused: string; message: string } {
  const e = err as Error & { code?: string };
  return { refused: e.code ?? e.name, message: e.message };
}

/** One file per result in the snapshot folder, named after the result. */
const fileOf = (dir: string, name: string) => path.join(dir, name.replace(/[^A-Za-z0-9.-]+/g, "_") + ".json");

/**
 * `write <folder>` keeps every result; `compare <folder>` prints the first difference of each
 * result that changed and exits 1 when any did. `noun` names a result in the messages, one and many.
 */
export function runSnapshot(script: string, noun: { one: string; many: string }, results: Iterable<{ name: string; json: string }>): never {
  const [cmd, dir] = process.argv.slice(2);
  if ((cmd !== "write" && cmd !== "compare") || !dir) {
    console.error(`usage: ${script} write|compare <folder>`);
    process.exit(2);
  }
  const hash = createHash("sha256");
  let count = 0;
  let differ = 0;
  if (cmd === "write") fs.mkdirSync(dir, { recursive: true });
  for (const r of results) {
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
      console.log(`new ${noun.one}: ${r.name}`);
      continue;
    }
    let i = 0;
    while (i < b.length && b[i] === r.json[i]) i++;
    console.log(`${r.name} differs at ${i}:\n  before …${b.slice(Math.max(0, i - 160), i + 160)}\n  after  …${r.json.slice(Math.max(0, i - 160), i + 160)}`);
  }
  const digest = hash.digest("hex").slice(0, 16);
  if (cmd === "write") console.log(`${count} ${noun.many} written (${digest})`);
  else console.log(differ ? `${differ} of ${count} ${noun.many} differ (${digest})` : `all ${count} ${noun.many} identical (${digest})`);
  process.exit(differ ? 1 : 0);
}
