import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { readScoreFile } from "@/lib/musicxml";
import { lineOf, twoPlayersOf } from "@/lib/musicxml/lines";
import type { Note, PartModel } from "@/lib/musicxml/model";
import { musicFiles, REAL_DIR } from "../helpers/real-corpus";

// The upper and lower lines on the real corpus (tests/fixtures/real, sources in its SOURCES.md):
// string parts with double stops and passages in two voices, a song with a second voice, hymns.
const read = (rel: string) => readScoreFile(new Uint8Array(fs.readFileSync(path.join(REAL_DIR, rel))), path.basename(rel)).score;
const sounding = (n: Note) => !n.isRest && !n.isCue && !n.isGrace && n.pitch !== null;

/** How many notes of the staff sound at `t` (a tied note held from before counts). */
function soundingAt(part: PartModel, t: number): number {
  return part.notes.filter((n) => sounding(n) && n.onsetSeconds <= t + 1e-6 && n.onsetSeconds + n.durationSeconds > t + 1e-6).length;
}

/** The most notes of the staff that sound together at some moment while `note` sounds. */
function mostDuring(part: PartModel, note: Note): number {
  const from = note.onsetSeconds;
  const to = from + note.durationSeconds;
  const moments = [from, ...part.notes.filter((n) => sounding(n) && n.onsetSeconds > from && n.onsetSeconds < to - 1e-6).map((n) => n.onsetSeconds)];
  return Math.max(...moments.map((t) => soundingAt(part, t)));
}

/** Notes of one line that sound at the same moment as another of the same line. */
function together(line: PartModel): number {
  const notes = line.notes.filter(sounding).sort((a, b) => a.onsetSeconds - b.onsetSeconds);
  let count = 0;
  let end = -Infinity;
  for (const n of notes) {
    if (n.onsetSeconds < end - 1e-6) count++;
    end = Math.max(end, n.onsetSeconds + n.durationSeconds);
  }
  return count;
}

describe("the two lines of a staff on the real corpus", () => {
  const offered: string[] = [];
  const parts: Array<{ name: string; part: PartModel }> = [];
  for (const file of musicFiles(REAL_DIR)) {
    const rel = path.relative(REAL_DIR, file);
    for (const part of read(rel).parts) {
      if (twoPlayersOf(part)) {
        offered.push(`${rel} ${part.id}`);
        parts.push({ name: `${rel} ${part.id}`, part });
      }
    }
  }

  it("offers the choice on staves that carry two lines for a good part of the time, not for a few double stops", () => {
    console.log(`two lines offered on ${offered.length} parts of the real corpus`);
    // Haydn's Op. 1 No. 1, third movement: the lower strings in two voices much of the time.
    expect(offered).toContain("music21/haydn/opus1no1/movement3.mxl P3");
    // Mozart K. 458, first movement, first violin: a handful of double stops in 1,400 notes.
    expect(offered).not.toContain("music21/mozart/k458/movement1.mxl P1");
    // One voice renumbered or a keyboard on two staves is never offered.
    expect(offered.filter((o) => o.includes("piano_sonatas") || o.includes("keyboard"))).toEqual([]);
    expect(offered).toEqual(expect.arrayContaining(["ours/two-flutes-chords.musicxml P1", "ours/two-flutes-voices.musicxml P1"]));
  });

  it("gives each player one note at a time, and every note of the staff to a line where at most two sound", () => {
    const problems: string[] = [];
    for (const { name, part } of parts) {
      const players = twoPlayersOf(part)!;
      const upper = lineOf(part, "upper", players);
      const lower = lineOf(part, "lower", players);
      const voices = new Set(part.notes.filter(sounding).map((n) => n.voice));
      if (voices.size <= 2) {
        const t = together(upper) + together(lower);
        if (t > 0) problems.push(`${name}: ${t} notes sound together within a line`);
      }
      const inLine = new Set([...upper.notes, ...lower.notes]);
      // Three notes at once (a triple stop, a chord under a held note) are more than two players,
      // and so is a chord in one voice while another voice plays (lines.ts says so).
      const otherVoicePlays = (n: Note) =>
        part.notes.some((o) => sounding(o) && o.voice !== n.voice && o.onsetSeconds < n.onsetSeconds + n.durationSeconds - 1e-6 && o.onsetSeconds + o.durationSeconds > n.onsetSeconds + 1e-6);
      const inChord = (n: Note) => part.notes.some((o) => o !== n && sounding(o) && o.voice === n.voice && o.measureIndex === n.measureIndex && o.onset.num * n.onset.den === n.onset.num * o.onset.den);
      const lost = part.notes.filter((n) => sounding(n) && !inLine.has(n) && mostDuring(part, n) <= 2 && !(inChord(n) && otherVoicePlays(n)));
      if (lost.length > 0) problems.push(`${name}: ${lost.length} notes in no line, e.g. ${lost[0].key}`);
    }
    expect(problems).toEqual([]);
  });

  it("where a chord divides and nothing is held across it, the upper line holds its top note and the lower its bottom", () => {
    for (const { part } of parts.filter((p) => twoPlayersOf(p.part)!.writtenAs === "chords")) {
      const upper = new Set(lineOf(part, "upper").notes);
      const lower = new Set(lineOf(part, "lower").notes);
      const bySlot = new Map<string, Note[]>();
      for (const n of part.notes.filter(sounding)) {
        const k = `${n.measureIndex}|${n.voice}|${n.onset.num}/${n.onset.den}`;
        bySlot.set(k, [...(bySlot.get(k) ?? []), n]);
      }
      for (const chord of bySlot.values()) {
        if (chord.length < 2) continue;
        const from = chord[0].onsetSeconds;
        const to = from + Math.min(...chord.map((n) => n.durationSeconds));
        const held = part.notes.some((n) => sounding(n) && Math.abs(n.onsetSeconds - from) > 1e-6 && n.onsetSeconds < to - 1e-6 && n.onsetSeconds + n.durationSeconds > from + 1e-6);
        if (held) continue;
        const midis = chord.map((n) => n.pitch!.midi);
        expect(chord.filter((n) => upper.has(n)).map((n) => n.pitch!.midi)).toEqual([Math.max(...midis)]);
        expect(chord.filter((n) => lower.has(n)).map((n) => n.pitch!.midi)).toEqual([Math.min(...midis)]);
      }
    }
  });
});
