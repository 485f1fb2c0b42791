import { describe, expect, it } from "vitest";
import type { Note } from "@/lib/musicxml/model";
import { ANALYSIS_VERSION, analyzeScore } from "./index";
import { buildPart, buildScore, fr } from "./test-part";

describe("analyzeScore", () => {
  it("has an integer version", () => {
    expect(Number.isInteger(ANALYSIS_VERSION)).toBe(true);
    expect(ANALYSIS_VERSION).toBeGreaterThanOrEqual(1);
  });

  it("lists sounding notes in time order: no rests, chords reduced to the top note, grace notes kept", () => {
    // source: issue contract — "rests and chord members other than the top note of the melody voice left out".
    const part = buildPart("C5:q r:q [E4,G4,C5]:q D5:g E5:q | F5:h r:h |]", { fifths: 0 });
    const a = analyzeScore(buildScore(part), "x.musicxml");
    expect(a.file).toBe("x.musicxml");
    const p = a.parts[0];
    expect(p.notes.map((n) => n.pitch)).toEqual(["C5", "C5", "D5", "E5", "F5"]);
    expect(p.noteCount).toBe(5);
    expect(p.measureCount).toBe(2);
    expect(p.notes[1]).toMatchObject({ measure: "1", onset: "1/2", duration: "1/4", midi: 72, degree: 1 });
    expect(p.notes[2]).toMatchObject({ onset: "3/4", duration: "0/1", degree: 2 });
    expect(p.notes[2].key.endsWith(":g1")).toBe(true);
  });

  it("takes one voice as the melody and leaves the others out of the notes", () => {
    // source: MusicXML 4.0 <backup> — "required to coordinate multiple voices in one part".
    const v1 = buildPart("E5:q F5:q G5:q A5:q | G5:w |]", { fifths: 0 });
    const v2 = buildPart("C5:h D5:h | E5:w |]", { fifths: 0, voice: "2" });
    const merged = { ...v1, notes: [...v1.notes, ...v2.notes].sort((a: Note, b: Note) => a.measureIndex - b.measureIndex || a.onset.num / a.onset.den - b.onset.num / b.onset.den) };
    const p = analyzeScore(buildScore(merged), "x").parts[0];
    expect(p.notes.map((n) => n.pitch)).toEqual(["E5", "F5", "G5", "A5", "G5"]);
  });

  it("merges a tie chain into its first note and measures the pickup bar by its notes", () => {
    // source: MusicXML 4.0 <tie> — a tie chain is one sounding note (check-values §3).
    const part = buildPart("G4:q | C5:h. D5:q | E5:w |]", { fifths: 0 });
    // A tie from bar 2 into bar 3 as the reader gives it: one note whose duration spans both.
    const d5 = part.notes.find((n) => n.pitch?.name === "D5") as Note;
    d5.duration = fr(5, 4);
    d5.tied = true;
    part.notes = part.notes.filter((n) => n.pitch?.name !== "E5");
    part.notes.push({ ...d5, key: "", isRest: true, pitch: null, measureIndex: 2, measureNumber: "3", onset: fr(1, 2), duration: fr(1, 2), tied: false });
    const p = analyzeScore(buildScore(part), "x").parts[0];
    expect(p.notes.map((n) => `${n.pitch}:${n.duration}`)).toEqual(["G4:1/4", "C5:3/4", "D5:5/4"]);
    // The pickup lasts a quarter, so the downbeat C5 follows G4 directly: no rest gap, one phrase.
    expect(p.phrases).toHaveLength(1);
  });

  it("analyses every part of a score, each with its own key", () => {
    const flute = buildPart("A4:q B4:q C5:q D5:q | E5:w |]", { fifths: 0, mode: "minor" });
    const piano = buildPart("[A2,C3,E3]:w | [E2,G#2,B2]:w |]", { id: "P2", name: "Piano", fifths: 0, mode: "minor" });
    const a = analyzeScore(buildScore(flute, piano), "duet.musicxml");
    expect(a.parts.map((p) => [p.id, p.name, p.key.tonic, p.key.mode])).toEqual([
      ["P1", "Flute", "A", "minor"],
      ["P2", "Piano", "A", "minor"],
    ]);
    expect(a.parts[1].notes.map((n) => n.pitch)).toEqual(["E3", "B2"]);
  });

  it("survives an empty part", () => {
    const part = buildPart("r:w | r:w |]", { fifths: 3, mode: null });
    const p = analyzeScore(buildScore(part), "x").parts[0];
    expect(p.notes).toEqual([]);
    expect(p.phrases).toEqual([]);
    expect(p.key).toMatchObject({ tonic: "A", mode: "major", source: "inferred" });
  });
});
