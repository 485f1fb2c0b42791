import { readFileSync, readdirSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { readScoreFile } from "@/lib/musicxml";
import { analyzeScore } from "./index";
import { barNameOfNoteKey, writtenBars } from "@/lib/musicxml/bar-names";

const dir = path.resolve(import.meta.dirname, "../../samples");
const files = readdirSync(dir).filter((f) => /\.(musicxml|mxl)$/.test(f));
const answersOf = (file: string) => {
  const p = path.join(dir, file.replace(/\.(musicxml|mxl)$/, ".answers.json"));
  return JSON.parse(readFileSync(p, "utf8")) as { part: string; key: { tonic: string; mode: string } };
};
const read = (file: string) => readScoreFile(readFileSync(path.join(dir, file)), file).score;

describe("the analysis of every sample", () => {
  it("has samples with answer keys to check", () => {
    expect(files.length).toBeGreaterThanOrEqual(12);
  });

  for (const file of files) {
    it(`${file}: finds the key of the answer key, from the signature and again with every mode removed`, () => {
      // source: the hand-written answer key beside the sample (samples/README.md); K–S correlation per check-values §1.
      const answers = answersOf(file);
      const score = read(file);
      const part = analyzeScore(score, file).parts.find((p) => p.id === answers.part);
      expect(part?.key).toMatchObject({ tonic: answers.key.tonic, mode: answers.key.mode });
      for (const p of score.parts) for (const m of p.measures) m.key = { ...m.key, mode: null };
      const inferred = analyzeScore(score, file).parts.find((p) => p.id === answers.part);
      expect(inferred?.key).toMatchObject({ tonic: answers.key.tonic, mode: answers.key.mode, source: "inferred" });
    });

    it(`${file}: gives well-formed results — notes in time order, phrases covering the melody, reasons naming key and bar`, () => {
      const score = read(file);
      const analysis = analyzeScore(score, file);
      for (const part of analysis.parts) {
        const bars = writtenBars(score.parts.find((p) => p.id === part.id)!.measures);
        const keys = new Set(part.notes.map((n) => n.key));
        expect(keys.size).toBe(part.notes.length);
        expect(part.noteCount).toBe(part.notes.length);
        for (const n of part.notes) expect(n.degree).toSatisfy((d: number) => d >= 1 && d <= 7);
        for (const s of part.suggestions) {
          expect(keys.has(s.note)).toBe(true);
          if (s.resolvesTo !== null) expect(keys.has(s.resolvesTo)).toBe(true);
          expect(s.confidence).toBeGreaterThanOrEqual(0);
          expect(s.confidence).toBeLessThanOrEqual(1);
          expect(s.reason).toMatch(/ (major|minor)\b/);
          // The reason names a bar as the part writes it ("bar 12", "the pickup"), never by position.
          expect(s.reason).toMatch(/\b(bar \S+|the pickup)/);
          if (s.role === "phrase-start") expect(s.reason).toContain(` in ${barNameOfNoteKey(bars, s.note)},`);
          expect(s.reason.trim().endsWith(".")).toBe(true);
        }
        const index = new Map(part.notes.map((n, i) => [n.key, i]));
        let last = -1;
        for (const ph of part.phrases) {
          const [a, pk, z] = [index.get(ph.start) as number, index.get(ph.peak) as number, index.get(ph.end) as number];
          expect(a).toBeGreaterThan(last);
          expect(pk).toBeGreaterThanOrEqual(a);
          expect(z).toBeGreaterThanOrEqual(pk);
          last = z;
        }
      }
    });
  }
});
