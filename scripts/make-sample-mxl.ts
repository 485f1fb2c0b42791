/**
 * Builds the compressed samples: every `samples/source/<name>.musicxml` becomes
 * `samples/<name>.mxl`, a ZIP laid out as the MusicXML 4.0 specification describes (a `mimetype`
 * entry first and stored, `META-INF/container.xml` naming the root file, the score deflated).
 * The output is byte-for-byte reproducible, so the committed `.mxl` can be checked against its
 * source. Usage: npx tsx scripts/make-sample-mxl.ts
 */
import fs from "node:fs";
import path from "node:path";
import { strToU8, zipSync, type Zippable } from "fflate";

const root = path.resolve(import.meta.dirname, "..");
const sourceDir = path.join(root, "samples", "source");

export const MXL_MIMETYPE = "application/vnd.recordare.musicxml";

/**
 * A fixed modification time. ZIP stores local wall-clock fields, so the date is built from local
 * components: the bytes are the same in every time zone.
 */
const FIXED_MTIME = new Date(2026, 0, 1, 12, 0, 0);

export function containerXml(rootPath: string): string {
  return [
    '<?xml version="1.0" encoding="UTF-8"?>',
    "<container>",
    "  <rootfiles>",
    `    <rootfile full-path="${rootPath}" media-type="application/vnd.recordare.musicxml+xml"/>`,
    "  </rootfiles>",
    "</container>",
    "",
  ].join("\n");
}

export function buildMxl(fileName: string, scoreXml: string): Uint8Array {
  const files: Zippable = {
    mimetype: [strToU8(MXL_MIMETYPE), { level: 0, mtime: FIXED_MTIME }],
    "META-INF/container.xml": [strToU8(containerXml(fileName)), { level: 9, mtime: FIXED_MTIME }],
    [fileName]: [strToU8(scoreXml), { level: 9, mtime: FIXED_MTIME }],
  };
  return zipSync(files);
}

function main() {
  const sources = fs.readdirSync(sourceDir).filter((f) => f.endsWith(".musicxml")).sort();
  for (const file of sources) {
    const xml = fs.readFileSync(path.join(sourceDir, file), "utf8");
    const out = path.join(root, "samples", file.replace(/\.musicxml$/, ".mxl"));
    fs.writeFileSync(out, buildMxl(file, xml));
    console.log(`wrote ${path.relative(root, out)}`);
  }
}

if (process.argv[1] && path.resolve(process.argv[1]) === path.resolve(import.meta.filename)) main();
