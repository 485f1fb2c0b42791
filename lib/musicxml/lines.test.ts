import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { readScoreFile } from "./index";
import { lineOf, otherLineOnly, twoPlayersOf, type Line } from "./lines";
import type { PartModel } from "./model";
import { attrs, note, partwise, read, rest } from "./test-scores";

// Our own two-flute samples (tests/fixtures/real/ours/README.md): the same music written as chords
// and as two voices, joining in "a2" in bar 3. Their lines are written out here by hand from the
// score (the answer key of the sample).
const OURS = path.resolve(import.meta.dirname, "../../tests/fixtures/real/ours");
const ours = (name: string) => readScoreFile(new Uint8Array(fs.readFileSync(path.join(OURS, name))), name).score.parts[0];

/** The line as "bar:pitch" (rests as "bar:rest"), in time order. */
function names(part: PartModel, line: Line): string[] {
  return lineOf(part, line).notes.map((n) => `${n.measureNumber}:${n.isRest ? "rest" : n.pitch!.name}${n.isGrace ? "(g)" : ""}`);
}

const FLUTE_1 = ["1:F#5", "1:G5", "1:A5", "2:B5", "2:A5", "2:G5", "3:A5", "3:B5", "3:C#6", "3:D6", "4:D6"];

describe("the upper and lower line of a staff with two players", () => {
  it("written as chords: the top and the bottom note of each chord; the a2 bar is both lines' (our sample)", () => {
    const part = ours("two-flutes-chords.musicxml");
    const players = twoPlayersOf(part)!;
    expect(players).toMatchObject({ writtenAs: "chords", staff: 1, voices: null });
    // Apart in bars 1, 2 and 4 (12 of the upper line's 16 beats).
    expect(players.apart).toBeCloseTo(0.75, 9);
    expect(names(part, "upper")).toEqual(FLUTE_1);
    expect(names(part, "lower")).toEqual(["1:D5", "1:E5", "1:F#5", "2:G5", "2:F#5", "2:E5", "3:A5", "3:B5", "3:C#6", "3:D6", "4:A5"]);
  });

  it("written as two voices: voice 1 and voice 2; the bars written once are both lines' (our sample)", () => {
    const part = ours("two-flutes-voices.musicxml");
    const players = twoPlayersOf(part)!;
    expect(players).toMatchObject({ writtenAs: "voices", staff: 1, voices: ["1", "2"] });
    // Apart in bars 1 and 2 (8 of 16 beats): bar 4 is written once.
    expect(players.apart).toBeCloseTo(0.5, 9);
    expect(names(part, "upper")).toEqual(["1:F#5", "1:G5", "1:A5", "2:B5", "2:A5", "3:A5", "3:B5", "3:C#6", "3:D6", "4:D6"]);
    expect(names(part, "lower")).toEqual(["1:D5", "1:E5", "1:F#5", "2:G5", "2:F#5", "2:E5", "3:A5", "3:B5", "3:C#6", "3:D6", "4:D6"]);
  });

  it("keeps the model's own notes, so each line's notes carry the keys the page marks", () => {
    const part = ours("two-flutes-voices.musicxml");
    const all = new Set(part.notes);
    for (const line of ["upper", "lower"] as const) for (const n of lineOf(part, line).notes) expect(all.has(n)).toBe(true);
    const lowerKeys = lineOf(part, "lower").notes.map((n) => n.key);
    expect(lowerKeys).toContain("P1:m0:s1:v2:0/1:74");
    // The a2 bar is written in voice 1 and shared: the lower line holds voice 1's keys there.
    expect(lowerKeys).toContain("P1:m2:s1:v1:0/1:81");
  });

  it("the other line without the shared notes is what a second, quieter track plays", () => {
    const part = ours("two-flutes-chords.musicxml");
    const other = otherLineOnly(part, "upper").map((n) => `${n.measureNumber}:${n.pitch!.name}`);
    expect(other).toEqual(["1:D5", "1:E5", "1:F#5", "2:G5", "2:F#5", "2:E5", "4:A5"]);
  });

  it("follows each voice where the voices cross: a player reads their own stems (common practice)", () => {
    // Voice 2 rises above voice 1 on beat 2.
    const xml = partwise([
      attrs(1) + note("E", 5, 1) + note("D", 5, 1) + note("C", 5, 2) + "<backup><duration>4</duration></backup>" + note("C", 5, 1, { voice: "2" }) + note("F", 5, 1, { voice: "2" }) + note("A", 4, 2, { voice: "2" }),
    ]);
    const part = read(xml).score.parts[0];
    expect(names(part, "upper")).toEqual(["1:E5", "1:D5", "1:C5"]);
    expect(names(part, "lower")).toEqual(["1:C5", "1:F5", "1:A4"]);
  });

  it("a voice's rests are its line's silence; a bar where one voice rests and the other plays is the other's alone", () => {
    const xml = partwise([
      attrs(1) + note("A", 5, 2) + note("G", 5, 2) + "<backup><duration>4</duration></backup>" + rest(2, "2") + note("E", 5, 2, { voice: "2" }),
      attrs(1) + rest(4) + "<backup><duration>4</duration></backup>" + note("D", 5, 4, { voice: "2" }),
    ]);
    const part = read(xml).score.parts[0];
    expect(names(part, "upper")).toEqual(["1:A5", "1:G5", "2:rest"]);
    expect(names(part, "lower")).toEqual(["1:rest", "1:E5", "2:D5"]);
  });

  it("rests of a chord-written staff are both lines'", () => {
    const xml = partwise([attrs(1) + note("A", 5, 2) + note("F", 5, 2, { chord: true }) + rest(2)]);
    const part = read(xml).score.parts[0];
    expect(names(part, "upper")).toEqual(["1:A5", "1:rest"]);
    expect(names(part, "lower")).toEqual(["1:F5", "1:rest"]);
  });

  it("grace notes go with their voice, and a grace chord gives its top and bottom", () => {
    const xml = partwise([
      attrs(2) +
        note("B", 5, 0, { grace: true }) + note("G", 5, 0, { grace: true, chord: true }) +
        note("A", 5, 4) + note("F", 5, 4, { chord: true }) + note("G", 5, 4) + note("E", 5, 4, { chord: true }),
      attrs(2) +
        note("C", 6, 0, { grace: true }) + note("B", 5, 8) + "<backup><duration>8</duration></backup>" + note("G", 5, 8, { voice: "2" }),
    ]);
    const part = read(xml).score.parts[0];
    expect(names(part, "upper")).toEqual(["1:B5(g)", "1:A5", "1:G5", "2:C6(g)", "2:B5"]);
    expect(names(part, "lower")).toEqual(["1:G5(g)", "1:F5", "1:E5", "2:G5"]);
  });

  it("a tie chain across the barline is one note of its line, and keeps the bar after it two lines", () => {
    // Voice 1 holds its note over the barline while voice 2 moves: bar 2 is not an "a2" passage.
    const xml = partwise([
      attrs(1) + note("A", 5, 2) + note("D", 6, 2, { tie: ["start"] }) + "<backup><duration>4</duration></backup>" + note("F", 5, 4, { voice: "2" }),
      note("D", 6, 2, { tie: ["stop"] }) + note("C", 6, 2) + "<backup><duration>4</duration></backup>" + note("G", 5, 2, { voice: "2" }) + note("A", 5, 2, { voice: "2" }),
    ]);
    const part = read(xml).score.parts[0];
    expect(names(part, "upper")).toEqual(["1:A5", "1:D6", "2:C6"]);
    expect(names(part, "lower")).toEqual(["1:F5", "2:G5", "2:A5"]);
  });

  it("a tied note held in a chord while the other player moves stays in its line", () => {
    // Chords: flute 1 holds D6 over the barline (tied), flute 2 moves B5 → G5 under it.
    const xml = partwise([
      attrs(1) + note("A", 5, 2) + note("F", 5, 2, { chord: true }) + note("D", 6, 2, { tie: ["start"] }) + note("B", 5, 2, { chord: true }),
      note("D", 6, 2, { tie: ["stop"] }) + note("G", 5, 2, { chord: true }) + note("C", 6, 2) + note("A", 5, 2, { chord: true }),
    ]);
    const part = read(xml).score.parts[0];
    expect(names(part, "upper")).toEqual(["1:A5", "1:D6", "2:C6"]);
    expect(names(part, "lower")).toEqual(["1:F5", "1:B5", "2:G5", "2:A5"]);
  });

  it("a chord in one voice while the other voice rests is both players; while it plays, one", () => {
    const xml = partwise([
      attrs(1) + note("A", 5, 2) + note("F", 5, 2, { chord: true }) + note("G", 5, 2) + note("D", 5, 2, { chord: true }) +
        "<backup><duration>4</duration></backup>" + rest(2, "2") + note("B", 4, 2, { voice: "2" }),
    ]);
    const part = read(xml).score.parts[0];
    expect(names(part, "upper")).toEqual(["1:A5", "1:G5"]);
    // Beat 3: voice 2 plays B4, so the chord's D5 has no player of its own.
    expect(names(part, "lower")).toEqual(["1:F5", "1:rest", "1:B4"]);
  });

  it("a part with one player is not offered two lines and reads as it is", () => {
    const single = read(partwise([attrs(1) + note("A", 5, 2) + note("G", 5, 2)])).score.parts[0];
    expect(twoPlayersOf(single)).toBeNull();
    expect(lineOf(single, "lower")).toBe(single);
    // One voice renumbered from bar to bar (never two at once) is one player too.
    const turns = read(partwise([attrs(1) + note("A", 5, 4), note("G", 5, 4, { voice: "5" })])).score.parts[0];
    expect(twoPlayersOf(turns)).toBeNull();
    // A keyboard part on two staves is not two players on one staff.
    const keys = read(
      partwise([
        "<attributes><divisions>1</divisions><staves>2</staves></attributes>" + note("C", 5, 4, { staff: 1 }) + note("E", 5, 4, { staff: 1, chord: true }) + "<backup><duration>4</duration></backup>" + note("C", 3, 4, { staff: 2, voice: "5" }),
      ]),
    ).score.parts[0];
    expect(twoPlayersOf(keys)).toBeNull();
    // A few double stops in a long line are one player (below MIN_APART).
    const stops = read(partwise([attrs(1) + note("A", 5, 1) + note("D", 5, 1, { chord: true }) + note("G", 5, 1) + note("F", 5, 1) + note("E", 5, 1), ...Array.from({ length: 4 }, () => note("D", 5, 4))])).score.parts[0];
    expect(twoPlayersOf(stops)).toBeNull();
  });

  it("finds the chords whatever order the notes are listed in, and in a crowded instant (our sample)", () => {
    const part = ours("two-flutes-chords.musicxml");
    const expected = twoPlayersOf(part);
    expect(expected).toMatchObject({ writtenAs: "chords" });
    // The reader lists notes in time order; a part listed otherwise gives the same answer.
    expect(twoPlayersOf({ ...part, notes: [...part.notes].reverse() })).toEqual(expected);
    // Twenty unisons at one instant are one note for two players; a second pitch among them is a chord.
    const unisons = Array.from({ length: 20 }, () => note("A", 5, 4, { chord: true })).join("").replace("<chord/>", "");
    expect(twoPlayersOf(read(partwise([attrs(1) + unisons])).score.parts[0])).toBeNull();
    const chord = unisons + note("D", 5, 4, { chord: true });
    expect(twoPlayersOf(read(partwise([attrs(1) + chord])).score.parts[0])).toMatchObject({ writtenAs: "chords" });
  });
});
