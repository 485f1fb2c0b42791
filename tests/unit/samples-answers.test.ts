import fs from "node:fs";
import path from "node:path";
import { Key, Note as TonalNote } from "tonal";
import { describe, expect, it } from "vitest";
import { z } from "zod";
import { readScoreFile, type Note, type PartModel } from "@/lib/musicxml";

// The answer keys were written by hand from the music. These checks keep them honest about the
// files they describe (every named note exists, with that pitch, at that place) and about the
// rules they claim to follow; they never compare with the analysis's output.
const samplesDir = path.resolve(import.meta.dirname, "../../samples");

const noteRef = z.object({ measure: z.string(), onset: z.string().regex(/^(0|\d+\/\d+)$/), pitch: z.string() });
const answerSchema = z.object({
  part: z.string(),
  key: z.object({ tonic: z.string().regex(/^[A-G](#|b)?$/), mode: z.enum(["major", "minor"]) }),
  tensions: z.array(noteRef.extend({ resolvesTo: noteRef.nullable() })),
  phraseStarts: z.array(noteRef).min(1),
  peaks: z.array(noteRef).min(1),
});
type NoteRef = z.infer<typeof noteRef>;

const answerFiles = fs.readdirSync(samplesDir).filter((f) => f.endsWith(".answers.json")).sort();

const onsetText = (n: Note) => (n.onset.num === 0 ? "0" : `${n.onset.num}/${n.onset.den}`);
const whole = (n: Note) => n.duration.num / n.duration.den;

function sampleFor(answerFile: string): string {
  const stem = answerFile.replace(/\.answers\.json$/, "");
  const found = [".musicxml", ".mxl"].map((ext) => stem + ext).find((f) => fs.existsSync(path.join(samplesDir, f)));
  if (!found) throw new Error(`no sample for ${answerFile}`);
  return found;
}

/** Tonal's key for a signature and mode (tonal 6.5, `Key.majorKey` / `Key.minorKey`). */
function keyOf(fifths: number, mode: "major" | "minor") {
  const tonics = ["Cb", "Gb", "Db", "Ab", "Eb", "Bb", "F", "C", "G", "D", "A", "E", "B", "F#", "C#", "G#", "D#", "A#"];
  for (const t of tonics) {
    const k = mode === "major" ? Key.majorKey(t) : Key.minorKey(t);
    if (k.alteration === fifths) return { tonic: t, leadingTone: mode === "major" ? Key.majorKey(t).scale[6] : Key.minorKey(t).harmonic.scale[6] };
  }
  throw new Error(`no ${mode} key with ${fifths} fifths`);
}

describe("answer keys", () => {
  it("exist for at least twelve samples", () => {
    expect(answerFiles.length).toBeGreaterThanOrEqual(12);
  });

  for (const file of answerFiles) {
    describe(file, () => {
      const answers = answerSchema.parse(JSON.parse(fs.readFileSync(path.join(samplesDir, file), "utf8")));
      const sample = sampleFor(file);
      const { score } = readScoreFile(new Uint8Array(fs.readFileSync(path.join(samplesDir, sample))), sample);
      const part = score.parts.find((p) => p.id === answers.part) as PartModel;
      // The melody: sounding, non-grace notes of the part in time order (tie chains merged).
      const melody = part.notes.filter((n) => !n.isRest && !n.isGrace);
      const find = (ref: NoteRef) => melody.find((n) => n.measureNumber === ref.measure && onsetText(n) === ref.onset);
      const index = (ref: NoteRef) => melody.indexOf(find(ref)!);

      it("names notes that are in the part, with their written pitch", () => {
        expect(part).toBeDefined();
        const refs = [
          ...answers.tensions.flatMap((t) => (t.resolvesTo ? [t, t.resolvesTo] : [t])),
          ...answers.phraseStarts,
          ...answers.peaks,
        ];
        for (const ref of refs) expect(find(ref)?.pitch?.name, JSON.stringify(ref)).toBe(ref.pitch);
      });

      it("gives the key that the opening signature allows (checked with tonal)", () => {
        const first = part.measures[0].key;
        const expected = keyOf(first.fifths, answers.key.mode);
        expect(TonalNote.chroma(answers.key.tonic)).toBe(TonalNote.chroma(expected.tonic));
        if (first.mode === "major" || first.mode === "minor") expect(answers.key.mode).toBe(first.mode);
      });

      it("resolves tension tones by half step to the next note; unresolved ones are leading tones", () => {
        for (const t of answers.tensions) {
          const note = find(t)!;
          if (t.resolvesTo) {
            // Every rule in analysis.md §3 moves by half step (common practice).
            expect(index(t.resolvesTo), JSON.stringify(t)).toBe(index(t) + 1);
            expect(Math.abs(find(t.resolvesTo)!.pitch!.midi - note.pitch!.midi), JSON.stringify(t)).toBe(1);
          } else {
            // A tension left otherwise can only be a leading tone: the half step below the tonic,
            // the raised seventh in minor (Hutchinson, Music Theory for the 21st-Century Classroom §3.3).
            const measure = part.measures[note.measureIndex];
            const mode = measure.key.mode === "major" || measure.key.mode === "minor" ? measure.key.mode : answers.key.mode;
            const { leadingTone } = keyOf(measure.key.fifths, mode);
            expect(TonalNote.chroma(note.pitch!.name), JSON.stringify(t)).toBe(TonalNote.chroma(leadingTone));
          }
        }
      });

      it("has one peak per phrase, the highest note of its phrase", () => {
        expect(answers.peaks.length).toBe(answers.phraseStarts.length);
        const starts = answers.phraseStarts.map(index);
        expect(starts).toEqual([...starts].sort((a, b) => a - b));
        expect(starts[0]).toBe(0);
        answers.peaks.forEach((peak, i) => {
          const phrase = melody.slice(starts[i], starts[i + 1] ?? melody.length);
          const p = find(peak)!;
          expect(phrase, JSON.stringify(peak)).toContain(p);
          for (const n of phrase) {
            expect(n.pitch!.midi, `${JSON.stringify(peak)} vs bar ${n.measureNumber}`).toBeLessThanOrEqual(p.pitch!.midi);
            // Equal pitches: the longer note is the peak.
            if (n !== p && n.pitch!.midi === p.pitch!.midi) expect(whole(n)).toBeLessThanOrEqual(whole(p));
          }
        });
      });
    });
  }
});
