import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { readScoreFile, selectPartsXml } from "@/lib/musicxml";
import { scoreNoteKeys } from "@/lib/musicxml/key-order";
import { barNumbers, blankFrom, blankMeasures, firstMeasures, listBars, measureCount, measureSpans, mendForEngraving } from "./repair";

// Real encodings (tests/fixtures/real, sources and licences in its SOURCES.md) on which
// OpenSheetMusicDisplay 2.1.3 stopped: grace notes without a type (Beethoven op. 18 no. 3, bar 94
// of the first violin: a grace A4 before a whole-note A5) and a trill line started and never
// stopped (Mozart K. 458, first movement, bar 29 of the first violin).
import { validateMusicXml } from "@/tests/helpers/musicxml-xsd";

const real = (file: string) => path.resolve(import.meta.dirname, "../../tests/fixtures/real", file);
function part(file: string, partId = "P1") {
  const { partwiseXml } = readScoreFile(new Uint8Array(fs.readFileSync(real(file))), file);
  return selectPartsXml(partwiseXml, [partId]);
}
const keysOf = (xml: string) => scoreNoteKeys(readScoreFile(new TextEncoder().encode(xml), "x.musicxml").score);
const measureOfKey = (key: string) => Number(/:m(\d+):/.exec(key)![1]);

describe("mending the text for the engraver", () => {
  it("gives every grace note a type and keeps every note key (Beethoven op. 18 no. 3)", () => {
    const xml = part("music21/beethoven/opus18no3.mxl");
    const untyped = (t: string) => (t.match(/<note\b[^>]*>(?:(?!<\/note>)[\s\S])*?<grace\b(?:(?!<\/note>)[\s\S])*<\/note>/g) ?? []).filter((n) => !/<type\b/.test(n)).length;
    expect(untyped(xml)).toBeGreaterThan(0);
    const mended = mendForEngraving(xml);
    expect(untyped(mended)).toBe(0);
    expect(keysOf(mended)).toEqual(keysOf(xml));
    // Bar 94 (measure index 93) holds the grace A4 (MIDI 69) before the whole-note A5 (from the file).
    expect(measureSpans(xml)[93].number).toBe("94");
  }, 60_000);

  it("leaves out a trill line that never stops and keeps every note key (Mozart K. 458)", () => {
    const xml = part("music21/mozart/k458/movement1.mxl");
    const mended = mendForEngraving(xml);
    const count = (t: string, type: string) => (t.match(new RegExp(`<wavy-line\\b[^>]*type="${type}"`, "g")) ?? []).length;
    expect(count(xml, "start")).toBeGreaterThan(count(xml, "stop"));
    expect(count(mended, "start")).toBe(count(mended, "stop"));
    expect(keysOf(mended)).toEqual(keysOf(xml));
  }, 60_000);
});

describe("harmonies that spell themselves", () => {
  const harmonies = (t: string) => t.match(/<harmony\b[\s\S]*?<\/harmony>/g) ?? [];
  const numeralTexts = (t: string) => [...t.matchAll(/<numeral-root text="([^"]*)"/g)].map((m) => m[1]);
  // Schema errors, with line numbers left out: the mend never adds one (MusicXML 4.0 XSD, tests/fixtures/standards).
  const errorKinds = async (t: string) => new Set((await validateMusicXml(t)).errors.map((e) => e.replace(/^[^:]*:\d+:\s*/, "")));

  it("hands a Roman numeral written as kind none with a text to the engraver as a numeral (When in Rome, Mozart K. 331)", async () => {
    const xml = part("when-in-rome/piano-sonatas/mozart-k331-1.mxl");
    const mended = mendForEngraving(xml);
    // The file's first chords: root-step text="" with kind text ".A.I{", then "I6", "V6" (from the file).
    expect(numeralTexts(mended).slice(0, 3)).toEqual([".A.I{", "I6", "V6"]);
    expect(harmonies(mended).length).toBe(harmonies(xml).length);
    expect(harmonies(mended).some((h) => /<kind\b[^>]*text="[^"]+"[^>]*>none</.test(h))).toBe(false);
    expect(keysOf(mended)).toEqual(keysOf(xml));
    const before = await errorKinds(xml);
    for (const e of await errorKinds(mended)) expect(before).toContain(e);
  }, 120_000);

  it("shows a function's words (MusicXML 3.1 function, When in Rome, Beethoven op. 131)", () => {
    const xml = part("when-in-rome/quartets/beethoven-op131-1.mxl", "P4");
    // The file's first harmony, under the cello: <function>c#.i64</function> over kind none (from the file).
    expect(numeralTexts(mendForEngraving(xml))[0]).toBe("c#.i64");
  }, 60_000);

  it("leaves chord symbols and a plain no-chord sign as they are", () => {
    const chords = part("music21/leadSheet/fosterBrownHair.mxl");
    expect(mendForEngraving(chords).match(/<harmony\b[\s\S]*?<\/harmony>/g)).toEqual(chords.match(/<harmony\b[\s\S]*?<\/harmony>/g));
    const noChord = '<measure number="1"><harmony><root><root-step>C</root-step></root><kind>none</kind></harmony></measure>';
    expect(mendForEngraving(noChord)).toBe(noChord);
    const spelledNoChord = '<measure number="1"><harmony><root><root-step>C</root-step></root><kind text="N.C.">none</kind></harmony></measure>';
    expect(mendForEngraving(spelledNoChord)).toBe(spelledNoChord);
  });
});

describe("a tempo written as words and a metronome mark", () => {
  const dir = (inner: string) => `<measure number="1"><direction placement="above">${inner}<sound tempo="72"/></direction></measure>`;
  const words = (t: string) => `<direction-type><words>${t}</words></direction-type>`;
  const metronome = (inner: string) => `<direction-type><metronome>${inner}</metronome></direction-type>`;

  it("joins the mark to the words, one direction, nothing else touched (ours: the cadenza's opening)", () => {
    const xml = part("ours/cadenza-long-bar.musicxml");
    const mended = mendForEngraving(xml);
    expect(mended).toContain("<words>Andante ♩ = 72</words>");
    expect(mended).not.toContain("<metronome");
    expect(keysOf(mended)).toEqual(keysOf(xml));
  });

  it("writes a dotted beat with its dot, and a real edition's tempo too (Mozart K. 331: Andante grazioso, eighth = 120)", () => {
    expect(mendForEngraving(dir(words("Allegro") + metronome("<beat-unit>quarter</beat-unit><beat-unit-dot/><per-minute>96</per-minute>")))).toBe(
      dir("<direction-type><words>Allegro ♩. = 96</words></direction-type>"),
    );
    expect(mendForEngraving(part("when-in-rome/piano-sonatas/mozart-k331-1.mxl"))).toMatch(/>Andante grazioso ♪ = 120<\/words>/);
  });

  it("leaves a mark alone without words, and a metric modulation or a half-note beat as written", () => {
    const alone = dir(metronome("<beat-unit>quarter</beat-unit><per-minute>60</per-minute>"));
    expect(mendForEngraving(alone)).toBe(alone);
    const modulation = dir(words("Più mosso") + metronome("<beat-unit>quarter</beat-unit><beat-unit>eighth</beat-unit>"));
    expect(mendForEngraving(modulation)).toBe(modulation);
    const half = dir(words("Alla breve") + metronome("<beat-unit>half</beat-unit><per-minute>60</per-minute>"));
    expect(mendForEngraving(half)).toBe(half);
  });
});

describe("bars drawn as rests", () => {
  const xml = mendForEngraving(part("music21/haydn/opus74no1/movement4.mxl"));

  it("drops exactly the notes of the blanked bars; every other key stays", () => {
    const before = keysOf(xml);
    const blanked = keysOf(blankMeasures(xml, new Set([3, 10])));
    expect(blanked).toEqual(before.filter((k) => ![3, 10].includes(measureOfKey(k))));
    expect(measureCount(blankMeasures(xml, new Set([3, 10])))).toBe(measureCount(xml));
  });

  it("blanks from a bar on, and cuts the opening", () => {
    const n = measureCount(xml);
    expect(n).toBe(287);
    expect(keysOf(blankFrom(xml, 5, new Set([1]))).every((k) => measureOfKey(k) < 5 && measureOfKey(k) !== 1)).toBe(true);
    const opening = firstMeasures(xml, 24);
    expect(measureCount(opening)).toBe(24);
    expect(keysOf(opening)).toEqual(keysOf(xml).filter((k) => measureOfKey(k) < 24));
  });

  it("names bars by their written numbers", () => {
    // The movement opens with a pickup the file numbers "0" (from the file).
    expect(barNumbers(xml, [2, 0])).toEqual(["0", "2"]);
    expect(listBars(["12"])).toBe("bar 12");
    expect(listBars(["3", "12", "40"])).toBe("bars 3, 12 and 40");
  });
});
