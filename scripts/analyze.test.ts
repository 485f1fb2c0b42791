import { spawnSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import type { ScoreAnalysis } from "@/lib/analysis/types";
import { generatePart } from "./bench/analysis";

const root = path.resolve(import.meta.dirname, "..");
const analyze = (...args: string[]) =>
  spawnSync("npm", ["run", "--silent", "analyze", "--", ...args], { cwd: root, encoding: "utf8", timeout: 60_000 });

const dirs: string[] = [];
const tempDir = () => {
  const d = mkdtempSync(path.join(tmpdir(), "analyze-"));
  dirs.push(d);
  return d;
};
afterAll(() => {
  for (const d of dirs) rmSync(d, { recursive: true, force: true });
});

describe("npm run --silent analyze", () => {
  it("prints the analysis of a sample as JSON and nothing else", () => {
    // source: issue contract for the command line (JSON on stdout, shape of lib/analysis/types.ts).
    const r = analyze("samples/harbour-song.musicxml");
    expect(r.status).toBe(0);
    expect(r.stderr).toBe("");
    const out = JSON.parse(r.stdout) as ScoreAnalysis;
    expect(out.file).toBe("harbour-song.musicxml");
    const part = out.parts[0];
    expect(part.key).toMatchObject({ tonic: "G", mode: "major", fifths: 1, source: "signature" });
    expect(part.notes.length).toBe(part.noteCount);
    expect(part.suggestions.some((s) => s.role === "tension" && s.confidence >= 0.5)).toBe(true);
    expect(part.phrases.length).toBeGreaterThan(1);
  }, 60_000);

  it("selects one part with --part", () => {
    const r = analyze("samples/evening-duet.musicxml", "--part", "P2");
    expect(r.status).toBe(0);
    expect((JSON.parse(r.stdout) as ScoreAnalysis).parts.map((p) => p.id)).toEqual(["P2"]);
  }, 60_000);

  const oneLine = (s: string) => {
    expect(s.endsWith("\n")).toBe(true);
    expect(s.trimEnd().split("\n")).toHaveLength(1);
    expect(s).not.toMatch(/\n\s+at /);
  };

  it("refuses a file that is not MusicXML: one line on stderr, exit 2", () => {
    const dir = tempDir();
    const file = path.join(dir, "notes.musicxml");
    writeFileSync(file, "these are not notes");
    const r = analyze(file);
    expect(r.status).toBe(2);
    expect(r.stdout).toBe("");
    oneLine(r.stderr);
    expect(r.stderr).toContain("notes.musicxml");
  }, 60_000);

  it("names a missing file and an unknown part", () => {
    const missing = analyze("samples/no-such-file.musicxml");
    expect(missing.status).toBe(2);
    oneLine(missing.stderr);
    expect(missing.stderr).toContain("no such file");
    const dir = tempDir();
    const file = path.join(dir, "study.musicxml");
    writeFileSync(file, generatePart(40));
    const part = analyze(file, "--part", "P9");
    expect(part.status).toBe(2);
    oneLine(part.stderr);
    expect(part.stderr).toContain('"P9"');
  }, 60_000);
});
