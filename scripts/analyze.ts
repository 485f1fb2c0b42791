/**
 * `npm run --silent analyze -- <file> [--part ID]`: prints the analysis of a MusicXML or .mxl file
 * as JSON on stdout and nothing else. Bad input: one line on stderr naming the problem, exit 2.
 */
import { readFileSync, statSync } from "node:fs";
import path from "node:path";
import { analyzeScore } from "@/lib/analysis";
import { MusicXmlError, readScoreFile } from "@/lib/musicxml";

const USAGE = "usage: npm run --silent analyze -- <file.musicxml|file.mxl> [--part ID]";

function refuse(message: string, status = 2): never {
  process.stderr.write(`${message.replace(/\s+/g, " ").trim()}\n`);
  process.exit(status);
}

function parseArgs(argv: string[]): { file: string; part: string | null } {
  let file: string | null = null;
  let part: string | null = null;
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === "--part") {
      part = argv[++i] ?? refuse(`--part needs a part id. ${USAGE}`);
    } else if (a.startsWith("--part=")) {
      part = a.slice("--part=".length);
    } else if (a.startsWith("-")) {
      refuse(`unknown option ${a}. ${USAGE}`);
    } else if (file === null) {
      file = a;
    } else {
      refuse(`only one file at a time (got ${file} and ${a}). ${USAGE}`);
    }
  }
  if (file === null) refuse(`no file given. ${USAGE}`);
  return { file, part };
}

function main(): void {
  const { file, part } = parseArgs(process.argv.slice(2));
  let bytes: Uint8Array;
  try {
    if (!statSync(file).isFile()) refuse(`${file} is not a file`);
    bytes = readFileSync(file);
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    refuse(code === "ENOENT" ? `no such file: ${file}` : `cannot read ${file}: ${(err as Error).message}`);
  }
  const name = path.basename(file);
  let result;
  try {
    const { score } = readScoreFile(bytes, name);
    result = analyzeScore(score, name);
  } catch (err) {
    if (err instanceof MusicXmlError) refuse(`${name}: ${err.message}`);
    refuse(`${name}: could not be analyzed (${err instanceof Error ? err.message : String(err)})`, 1);
  }
  if (part !== null) {
    const found = result.parts.filter((p) => p.id === part);
    if (found.length === 0) refuse(`${name} has no part "${part}" (parts: ${result.parts.map((p) => p.id).join(", ") || "none"})`);
    result = { ...result, parts: found };
  }
  process.stdout.write(`${JSON.stringify(result, null, 2)}\n`);
}

main();
