import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { readScoreFile } from "@/lib/musicxml";
import type { Note, ScoreModel } from "@/lib/musicxml/model";
import { validateMusicXml } from "../helpers/musicxml-xsd";
import { musicFiles, REAL_DIR } from "../helpers/real-corpus";

// The real corpus (tests/fixtures/real, sources in its SOURCES.md) and our own files for what a
// flutist meets and the corpora lack (tests/fixtures/real/ours, see its README): every file reads,
// and ours say exactly what they were written to say.
const realDir = REAL_DIR;
const oursDir = path.join(realDir, "ours");

const read = (file: string) => readScoreFile(new Uint8Array(fs.readFileSync(file)), path.basename(file));
const ours = (name: string): ScoreModel => read(path.join(oursDir, name)).score;
const keys = (notes: Note[]) => notes.filter((n) => !n.isRest).map((n) => n.key);
const messages = (score: ScoreModel) => score.notices.map((n) => n.message);

describe("the real corpus", () => {
  const files = musicFiles(realDir);

  it("holds at least 60 real files besides ours, and ours", () => {
    expect(files.filter((f) => !f.startsWith(oursDir)).length).toBeGreaterThanOrEqual(60);
    expect(musicFiles(oursDir).length).toBeGreaterThanOrEqual(14);
  });

  it("reads every file: nothing real is refused", () => {
    const refused: string[] = [];
    for (const file of files) {
      try {
        const { score } = read(file);
        if (score.parts.length === 0) refused.push(`${file}: no parts`);
      } catch (err) {
        refused.push(`${path.relative(realDir, file)}: ${(err as Error).message}`);
      }
    }
    expect(refused).toEqual([]);
  }, 300_000);

  it("names the long bars of a file whose time signature is wrong (music21 demos: incorrect_time_signature_pv)", () => {
    const { score } = read(path.join(realDir, "music21/demos/incorrect_time_signature_pv.mxl"));
    expect(messages(score)[0]).toBe("bar 1 lasts 12 beats in 4/4 — read as written");
  });
});

describe("our own files (tests/fixtures/real/ours)", () => {
  it("are valid MusicXML 4.0 (the W3C Music Notation Community Group's XSD)", async () => {
    for (const file of musicFiles(oursDir)) {
      const xml = fs.readFileSync(file, "utf8").replace(/<!DOCTYPE[^>]*>/, "");
      const result = await validateMusicXml(xml, path.basename(file));
      expect({ file: path.basename(file), errors: result.errors }).toEqual({ file: path.basename(file), errors: [] });
    }
  }, 120_000);

  it("a cadenza written as one long bar is read as written and named", () => {
    const score = ours("cadenza-long-bar.musicxml");
    const bar3 = score.parts[0].notes.filter((n) => n.measureIndex === 2);
    // 8 + 8×1 + 6×2 + 4 + 8 sixteenths at divisions 4 = 40 sixteenths = 10 quarter beats.
    expect(messages(score)).toEqual(["bar 3 lasts 10 beats in 4/4 — read as written"]);
    expect(bar3).toHaveLength(17);
    expect(bar3.at(-1)!.onset).toEqual({ num: 2, den: 1 });
    // The bar after the cadenza starts 10 beats later at ♩ = 72: 10 × 60/72 s (common practice).
    const [m3, m4] = [score.parts[0].measures[2], score.parts[0].measures[3]];
    expect(m4.startSeconds - m3.startSeconds).toBeCloseTo((10 * 60) / 72, 9);
  });

  it("a cadenza under a hidden time signature that fits it raises no notice", () => {
    const score = ours("cadenza-hidden-time.musicxml");
    const [, cadenza, after] = score.parts[0].measures;
    expect(cadenza.time).toEqual({ beats: 13, beatType: 8 });
    expect(after.time).toEqual({ beats: 4, beatType: 4 });
    expect(score.notices).toEqual([]);
  });

  it("multi-bar rests are four whole-bar rests, and the flute enters in bar 5", () => {
    const notes = ours("multi-bar-rest.musicxml").parts[0].notes;
    expect(notes.slice(0, 4).every((n) => n.isRest && n.duration.num === 3 && n.duration.den === 4)).toBe(true);
    expect(keys(notes)[0]).toBe("P1:m4:s1:v1:1/4:78");
  });

  it("an alto flute in G is read at written pitch, and the remark says it sounds a fourth lower", () => {
    const score = ours("alto-flute-in-g.musicxml");
    // Alto flute in G sounds a perfect fourth (5 semitones) below written (common practice).
    expect(score.parts[0].notes[0].pitch!.name).toBe("D5");
    expect(score.remarks.join(" ")).toContain("sounds 5 semitones lower than written");
  });

  it("a piccolo (octave-change 1) is read at written pitch, and the remark says it sounds an octave higher", () => {
    const score = ours("piccolo.musicxml");
    expect(score.parts[0].notes[0].pitch!.name).toBe("G5");
    expect(score.remarks.join(" ")).toContain("sounds an octave higher than written");
  });

  it("two flutes on one staff as chords: both lines keyed in voice 1, the lower as chord tones", () => {
    const notes = ours("two-flutes-chords.musicxml").parts[0].notes;
    const first = notes.filter((n) => n.measureIndex === 0 && n.onset.num === 0);
    expect(first.map((n) => [n.pitch!.name, n.isChord])).toEqual([
      ["D5", true],
      ["F#5", false],
    ]);
    // "a2": one line in bar 3.
    expect(notes.filter((n) => n.measureIndex === 2).every((n) => !n.isChord)).toBe(true);
  });

  it("two flutes on one staff as two voices: each voice has its own keys, a2 is voice 1 alone", () => {
    const notes = ours("two-flutes-voices.musicxml").parts[0].notes;
    expect(keys(notes.filter((n) => n.measureIndex === 0 && n.voice === "2"))).toEqual(["P1:m0:s1:v2:0/1:74", "P1:m0:s1:v2:1/4:76", "P1:m0:s1:v2:1/2:78"]);
    expect(new Set(notes.filter((n) => n.measureIndex === 2).map((n) => n.voice))).toEqual(new Set(["1"]));
  });

  it("a trill's closing grace notes lead into the next note; grace notes at a bar's end are keyed at the note they follow", () => {
    const notes = ours("trill-closing-graces.musicxml").parts[0].notes;
    expect(keys(notes)).toEqual(
      expect.arrayContaining(["P1:m1:s1:v1:1/2:72:g1", "P1:m1:s1:v1:1/2:74:g2", "P1:m1:s1:v1:1/2:76", "P1:m2:s1:v1:1/2:79:g1", "P1:m2:s1:v1:1/2:81:g2", "P1:m3:s1:v1:0/1:71:g1"]),
    );
    // Their onset stays where they are written, at the barline: time order is unchanged.
    expect(notes.find((n) => n.key === "P1:m2:s1:v1:1/2:79:g1")!.onset).toEqual({ num: 1, den: 1 });
  });

  it("cue notes are read and flagged as cues", () => {
    const notes = ours("cue-notes.musicxml").parts[0].notes;
    expect(notes.filter((n) => n.isCue).map((n) => n.pitch!.name)).toEqual(["F5", "Eb5", "D5"]);
  });

  it("tremolos keep the written notes and lengths (strokes are ornaments, not notes)", () => {
    const notes = ours("tremolo.musicxml").parts[0].notes;
    expect(notes.map((n) => [n.pitch!.name, `${n.duration.num}/${n.duration.den}`])).toEqual([
      ["E5", "1/2"],
      ["G5", "1/2"],
      ["C5", "1/2"],
      ["E5", "1/2"],
      ["D5", "1/1"],
    ]);
  });

  it("repeats, endings and D.S. al Fine are kept in written order with a remark", () => {
    const score = ours("repeats-endings-ds-dc.musicxml");
    const bars = score.parts[0].measures;
    expect(bars.map((m) => m.number)).toEqual(["1", "2", "3", "4", "5", "6", "7"]);
    expect([bars[1].barlineLeft, bars[3].barlineRight]).toEqual(["repeat-start", "repeat-end"]);
    expect(score.remarks).toContain("Repeats are kept in written order; they are not unfolded.");
    expect(score.notices).toEqual([]);
  });

  it("a pickup bar is measure index 0, as long as its notes; the short Fine bar is named", () => {
    const score = ours("pickup-dc-al-fine.musicxml");
    const [pickup, bar1] = score.parts[0].measures;
    expect(pickup.number).toBe("0");
    // One quarter at ♩ = 104 before bar 1.
    expect(bar1.startSeconds).toBeCloseTo(60 / 104, 9);
    expect(messages(score)).toEqual(["bar 3 lasts 2 beats in 3/4 — read as written"]);
  });

  it("key, time and clef changes mid-piece are recorded where they happen", () => {
    const bars = ours("changes-mid-piece.musicxml").parts[0].measures;
    expect(bars.map((m) => [m.key.fifths, m.time ? `${m.time.beats}/${m.time.beatType}` : null, m.keyChanged, m.timeChanged])).toEqual([
      [0, "4/4", true, true],
      [0, "4/4", false, false],
      [3, "3/4", true, true],
      [3, "6/8", false, true],
      [-2, "6/8", true, false],
      [-2, "6/8", false, false],
    ]);
  });

  it("several movements in one file: bar numbers start again, each movement with its own tempo", () => {
    const score = ours("movements.musicxml");
    const bars = score.parts[0].measures;
    expect(bars.map((m) => m.number)).toEqual(["1", "2", "1", "2", "1", "2"]);
    expect(bars.map((m) => m.tempo)).toEqual([80, 80, 56, 56, 120, 120]);
    expect(keys(score.parts[0].notes)).toHaveLength(new Set(keys(score.parts[0].notes)).size);
  });
});
