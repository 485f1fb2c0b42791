import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { readScoreFile } from "@/lib/musicxml";
import { DEFAULT_LIMITS } from "@/lib/musicxml/errors";
import { keepMusicXml } from "@/lib/musicxml/keep-musicxml";
import { readMusicXmlText } from "@/lib/musicxml/reader";
import { validateMusicXml } from "../helpers/musicxml-xsd";
import { musicFiles, REAL_DIR } from "../helpers/real-corpus";
import { SAMPLES_DIR } from "../helpers/parts";

// Every file of the real corpus (tests/fixtures/real, sources in its SOURCES.md) and of samples/:
// what upload stores after keeping only MusicXML reads to the same model, and brings no error of
// the MusicXML 4.0 schema (W3C Music Notation Community Group, tests/fixtures/standards) that
// the reader's normalized text did not already have.
const files = [...musicFiles(REAL_DIR), ...musicFiles(SAMPLES_DIR)];
const limits = { ...DEFAULT_LIMITS, maxNotes: 1_000_000 };
// libxml2 names lines; the kept text has fewer of them, so errors are compared without positions.
const withoutLines = (errors: string[]) => new Set(errors.map((e) => e.replace(/^[^:]*:\d+:\s*/, "").replace(/line \d+/g, "line ?")));

describe("keeping only MusicXML on the real corpus and the samples", () => {
  it("leaves every file's model unchanged", () => {
    let rewritten = 0;
    let dropped = 0;
    for (const file of files) {
      const { score, partwiseXml } = readScoreFile(new Uint8Array(fs.readFileSync(file)), path.basename(file), limits);
      const kept = keepMusicXml(partwiseXml);
      // Rewritten: quotes, character references and the like written afresh; dropped: markup left out.
      if (kept.xml !== partwiseXml) rewritten++;
      if (Object.values(kept.dropped).some((n) => n > 0)) dropped++;
      expect({ file, score: readMusicXmlText(kept.xml, limits).score }).toEqual({ file, score });
    }
    console.log(`[keep-musicxml] ${files.length} files: ${rewritten} written afresh, ${dropped} with markup dropped`);
    expect(files.length).toBeGreaterThan(100);
  }, 300_000);

  it("adds no schema error to any file", async () => {
    let valid = 0;
    for (const file of files) {
      const { partwiseXml } = readScoreFile(new Uint8Array(fs.readFileSync(file)), path.basename(file), limits);
      const kept = keepMusicXml(partwiseXml).xml;
      const after = await validateMusicXml(kept, path.basename(file));
      if (after.valid) {
        valid++;
        continue;
      }
      const before = withoutLines((await validateMusicXml(partwiseXml, path.basename(file))).errors);
      const added = [...withoutLines(after.errors)].filter((e) => !before.has(e));
      expect({ file, added }).toEqual({ file, added: [] });
    }
    console.log(`[keep-musicxml] ${valid} of ${files.length} kept texts are valid MusicXML 4.0`);
  }, 600_000);
});
