import fs from "node:fs";
import path from "node:path";

/** The real corpus (sources and licences in its SOURCES.md) and our own files in `ours/`. */
export const REAL_DIR = path.resolve(import.meta.dirname, "../fixtures/real");

/** Every MusicXML file below `dir`, as full paths, in a stable order. */
export function musicFiles(dir: string): string[] {
  return fs
    .readdirSync(dir, { withFileTypes: true, recursive: true })
    .filter((e) => e.isFile() && /\.(musicxml|xml|mxl)$/.test(e.name))
    .map((e) => path.join(e.parentPath, e.name))
    .sort();
}
