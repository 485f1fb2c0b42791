import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { Midi } from "@tonejs/midi";
import { describe, expect, it } from "vitest";
import { validateMusicXml } from "@/tests/helpers/musicxml-xsd";
import { readScoreFile } from "@/lib/musicxml";
import type { Note, PartModel } from "@/lib/musicxml/model";
import type { MarkingValues } from "@/lib/markings/schema";
import { renderMidi } from "./midi";
import { embedMarkingsWithReport, extractMarkingsWithReport } from "./musicxml-markings";
import { scanNoteSites } from "./note-sites";
import { readBendToCents } from "./pitch-bend";

const SAMPLES = path.resolve(import.meta.dirname, "../../samples");
const files = readdirSync(SAMPLES).filter((f) => /\.(musicxml|mxl)$/.test(f)).sort();

const looks: Array<Omit<MarkingValues, "comment" | "role">> = [
  { depthCents: 20, speedHz: 5.5, placement: "centered", onset: "immediate", shape: "steady" },
  { depthCents: 32.5, speedHz: 6.25, placement: "top-on-pitch", onset: "delayed", shape: "growing" },
  { depthCents: 12, speedHz: 4.75, placement: "centered", onset: "delayed", shape: "fading" },
  { depthCents: 0, speedHz: 0, placement: "centered", onset: "immediate", shape: "steady" },
];
const roles: MarkingValues["role"][] = ["phrase-start", "peak", "tension", "resolution", null];

/** Several markings per part, always including a tied, a grace and a chord note when the part has them. */
function markingsFor(part: PartModel): Map<string, MarkingValues> {
  const sounding = part.notes.filter((n) => n.key !== "");
  const picks = new Set<Note>();
  const first = (pred: (n: Note) => boolean) => sounding.find(pred);
  for (const n of [
    sounding[0],
    first((n) => n.tied),
    first((n) => n.isGrace),
    first((n) => n.isChord),
    sounding[Math.floor(sounding.length / 2)],
    sounding[sounding.length - 1],
  ]) {
    if (n) picks.add(n);
  }
  const out = new Map<string, MarkingValues>();
  [...picks].forEach((n, i) => {
    out.set(n.key, {
      ...looks[i % looks.length],
      role: roles[i % roles.length],
      comment: i % 2 ? `note ${i}: breathe & listen — “${n.pitch?.name}”` : "",
    });
  });
  return out;
}

const read = (name: string) => readScoreFile(new Uint8Array(readFileSync(path.join(SAMPLES, name))), name);

describe("every sample, marked", () => {
  it("has samples to check", () => {
    expect(files.length).toBeGreaterThanOrEqual(8);
  });

  it("finds the same note keys as the reader", () => {
    for (const file of files) {
      const { score, partwiseXml } = read(file);
      const scanned = scanNoteSites(partwiseXml).sites.filter((s) => !s.isContinuation).map((s) => s.key);
      const model = score.parts.flatMap((p) => p.notes.filter((n) => n.key !== "").map((n) => n.key));
      expect([...scanned].sort(), file).toEqual([...model].sort());
    }
  });

  it.each(files)("%s: exports valid MusicXML 4.0 whose markings come back exactly, also through the reader", async (file) => {
    const { score, partwiseXml } = read(file);
    const markings = new Map(score.parts.flatMap((p) => [...markingsFor(p)]));
    const kinds = score.parts.flatMap((p) => p.notes.filter((n) => markings.has(n.key)));
    expect(markings.size).toBeGreaterThanOrEqual(3);
    if (score.parts.some((p) => p.notes.some((n) => n.tied))) expect(kinds.some((n) => n.tied)).toBe(true);
    if (score.parts.some((p) => p.notes.some((n) => n.isGrace))) expect(kinds.some((n) => n.isGrace)).toBe(true);
    if (score.parts.some((p) => p.notes.some((n) => n.isChord))) expect(kinds.some((n) => n.isChord)).toBe(true);

    const { xml, unplaced } = embedMarkingsWithReport(partwiseXml, markings);
    expect(unplaced).toEqual([]);
    // MusicXML 4.0 XSD (tests/fixtures/standards/musicxml-4.0/musicxml.xsd) through libxml2.
    const valid = await validateMusicXml(xml, file);
    expect(valid.errors).toEqual([]);

    const direct = extractMarkingsWithReport(xml);
    expect(direct.problems).toEqual([]);
    expect(direct.markings).toEqual(markings);

    // Importing the export into Ondula: the reader accepts it, keys stay, markings come back.
    const again = readScoreFile(new TextEncoder().encode(xml), `${file}.exported.musicxml`);
    expect(again.score.parts.map((p) => p.notes.map((n) => n.key))).toEqual(score.parts.map((p) => p.notes.map((n) => n.key)));
    expect(extractMarkingsWithReport(again.partwiseXml).markings).toEqual(markings);
  });

  it.each(files)("%s: renders marked vibrato into MIDI at the marked speed and depth", (file) => {
    const { score } = read(file);
    for (const part of score.parts) {
      const markings = markingsFor(part);
      const bytes = renderMidi(part, markings);
      const track = new Midi(bytes).tracks.find((t) => t.notes.length > 0)!;
      expect(track.notes.length).toBe(part.notes.filter((n) => n.key !== "" && (n.durationSeconds > 0 || n.isGrace)).length);
      const marked = part.notes.filter((n) => markings.has(n.key));
      const overlapsMarked = (note: Note) =>
        marked.some(
          (o) =>
            o !== note &&
            o.onsetSeconds < note.onsetSeconds + note.durationSeconds - 1e-6 &&
            note.onsetSeconds < o.onsetSeconds + o.durationSeconds - 1e-6,
        );
      // A grace note sounds just before its principal, inside the previous note's time.
      const graceSpans = marked
        .filter((n) => n.isGrace)
        .map((g) => track.notes.find((t) => t.midi === g.pitch!.midi && Math.abs(t.time + t.duration - g.onsetSeconds) < 0.002)!)
        .map((t) => [t.time - 1e-6, t.time + t.duration + 1e-6]);
      const inGrace = (time: number) => graceSpans.some(([a, b]) => time >= a && time <= b);
      for (const note of part.notes) {
        const m = markings.get(note.key);
        const end = note.onsetSeconds + note.durationSeconds;
        // One channel carries one bend: in polyphony (a chord) the bends belong to the earlier note.
        if (overlapsMarked(note)) continue;
        const points = track.pitchBends
          .filter((b) => b.time > note.onsetSeconds - 1e-6 && b.time < end - 1e-6 && (m !== undefined || !inGrace(b.time)))
          .map((b) => readBendToCents(b.value, 2));
        if (!m || m.depthCents === 0 || note.isGrace) {
          if (!m || m.depthCents === 0) expect(points.every((c) => c === 0), `${file} ${note.key}`).toBe(true);
          continue;
        }
        // Any single moment stays within the marked swing (top-on-pitch: 0 … −2·depth).
        const hi = Math.max(...points);
        const lo = Math.min(...points);
        const tolerance = 0.02 * m.depthCents + 0.05;
        if (m.placement === "centered") {
          expect(hi).toBeLessThanOrEqual(m.depthCents + tolerance);
          expect(lo).toBeGreaterThanOrEqual(-m.depthCents - tolerance);
        } else {
          expect(hi).toBeLessThanOrEqual(tolerance);
          expect(lo).toBeGreaterThanOrEqual(-2 * m.depthCents - tolerance);
        }
        // A steady note long enough for two full cycles reaches the full depth.
        if (m.shape === "steady" && (note.durationSeconds * m.speedHz) >= 2) {
          expect(Math.abs((hi - lo) / 2 - m.depthCents) / m.depthCents, `${file} ${note.key}`).toBeLessThan(0.02);
        }
      }
    }
  });
});
