import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { validateMusicXml } from "@/tests/helpers/musicxml-xsd";
import { readScoreFile } from "@/lib/musicxml";
import { DEFAULT_MARKING, type MarkingValues } from "@/lib/markings/schema";
import { decodeCarrier, encodeCarrier, markingLabel } from "./marking-text";
import {
  embedMarkings,
  embedMarkingsWithReport,
  extractMarkings,
  extractMarkingsWithReport,
  stripMarkings,
} from "./musicxml-markings";
import { scanNoteSites } from "./note-sites";

const duet = readFileSync(path.join(import.meta.dirname, "fixtures/duet.musicxml"), "utf8");

const base: MarkingValues = DEFAULT_MARKING;

/** Markings on a grace note, a plain note, a tie chain across a barline and two chord notes. */
const markings = new Map<string, MarkingValues>([
  ["P1:m0:s1:v1:0/1:72:g1", { ...base, depthCents: 7.25, speedHz: 6.125, comment: "quick & light <grace>" }],
  ["P1:m0:s1:v1:0/1:70", { ...base, role: "phrase-start", onset: "delayed", comment: "breathe before\r\nthis" }],
  ["P1:m0:s1:v1:1/2:77", { ...base, depthCents: 35, speedHz: 5, shape: "growing", role: "peak", placement: "top-on-pitch" }],
  ["P1:m1:s1:v1:5/8:69", { ...base, depthCents: 0, speedHz: 0, shape: "fading", role: "resolution", comment: "à la fin — “dolce” 🎶" }],
  ["P2:m0:s1:v1:0/1:62", { ...base, depthCents: 12.5, role: "tension" }],
  ["P2:m0:s1:v1:0/1:65", { ...base, depthCents: 100, speedHz: 12 }],
  ["P2:m1:s2:v5:1/2:41", { ...base, shape: "fading" }],
]);

describe("note sites", () => {
  it("computes note keys from measure index, staff, voice, onset and pitch, merging ties", () => {
    // Onsets by MusicXML 4.0 `divisions`/`duration`/`backup`/`forward`/`chord` semantics
    // (https://www.w3.org/2021/06/musicxml40/musicxml-reference/elements/backup/ and …/chord/);
    // MIDI number = 12·(octave+1) + step + alter (check values §3, `pitch`).
    const keys = scanNoteSites(duet).sites.map((s) => s.key);
    expect(keys).toEqual([
      "P1:m0:s1:v1:0/1:72:g1",
      "P1:m0:s1:v1:0/1:70",
      "P1:m0:s1:v1:1/4:74",
      "P1:m0:s1:v1:3/8:75",
      "P1:m0:s1:v1:1/2:77",
      "P1:m0:s1:v1:1/2:77", // tie continuation in bar 2 shares the first note's key
      "P1:m0:s1:v1:1/2:77",
      "P1:m1:s1:v1:5/8:69",
      "P2:m0:s1:v1:0/1:58",
      "P2:m0:s1:v1:0/1:62",
      "P2:m0:s1:v1:0/1:65",
      "P2:m0:s2:v5:0/1:46",
      "P2:m0:s2:v5:1/2:41",
      "P2:m1:s1:v1:0/1:63",
      "P2:m1:s1:v1:0/1:67",
      "P2:m1:s1:v1:1/2:65",
      "P2:m1:s2:v5:1/2:41",
    ]);
    const sites = scanNoteSites(duet).sites;
    expect(sites[4].chainEndIndex).toBe(6);
    // The reader's model has exactly these keys (continuations merged).
    const { score } = readScoreFile(new TextEncoder().encode(duet), "duet.musicxml");
    const model = score.parts.flatMap((p) => p.notes.filter((n) => n.key !== "").map((n) => n.key));
    expect([...new Set(keys)].sort()).toEqual([...model].sort());
    expect(sites.filter((s) => s.isContinuation).map((s) => s.index)).toEqual([5, 6]);
  });
});

describe("marking carrier", () => {
  it("round-trips every field exactly, including awkward comments", () => {
    for (const m of markings.values()) {
      const decoded = decodeCarrier(encodeCarrier(m));
      expect(decoded).toEqual({ ok: true, value: m });
    }
  });

  it("refuses a carrier with an out-of-range or missing value", () => {
    const text = encodeCarrier(base);
    expect(decodeCarrier(text.replace("depthCents=20", "depthCents=250")).ok).toBe(false);
    expect(decodeCarrier(text.replace("speedHz=5.5; ", "")).ok).toBe(false);
    expect(decodeCarrier(text.replace("shape=steady", "shape=wobbly")).ok).toBe(false);
    expect(decodeCarrier(text.replace("ondula-marking 1", "ondula-marking 9")).ok).toBe(false);
  });

  it("labels the marking for people", () => {
    expect(markingLabel(base)).toBe("vib. 20¢ 5.5 Hz");
    expect(markingLabel({ ...base, placement: "top-on-pitch", onset: "delayed", shape: "growing", role: "peak" })).toBe(
      "vib. 20¢ 5.5 Hz, top on pitch, delayed, growing · peak",
    );
  });
});

describe("MusicXML with markings", () => {
  it("keeps the unmarked text valid against the MusicXML 4.0 XSD", async () => {
    // The fixture itself must be valid, or the next test proves nothing.
    const result = await validateMusicXml(duet);
    expect(result.errors).toEqual([]);
    expect(result.valid).toBe(true);
  });

  it("writes markings that validate against the MusicXML 4.0 XSD", async () => {
    const { xml, unplaced } = embedMarkingsWithReport(duet, markings);
    expect(unplaced).toEqual([]);
    // MusicXML 4.0 XSD (tests/fixtures/standards/musicxml-4.0/musicxml.xsd), validated by libxml2.
    const result = await validateMusicXml(xml);
    expect(result.errors).toEqual([]);
    expect(result.valid).toBe(true);
  });

  it("recovers every marking exactly", () => {
    const xml = embedMarkings(duet, markings);
    const back = extractMarkingsWithReport(xml);
    expect(back.problems).toEqual([]);
    expect(back.markings).toEqual(markings);
  });

  it("recovers every marking after the export is read back through Ondula's reader", () => {
    const xml = embedMarkings(duet, markings);
    const again = readScoreFile(new TextEncoder().encode(xml), "duet.exported.musicxml");
    const before = readScoreFile(new TextEncoder().encode(duet), "duet.musicxml");
    expect(again.score.parts.map((p) => p.notes.map((n) => n.key))).toEqual(before.score.parts.map((p) => p.notes.map((n) => n.key)));
    expect(extractMarkingsWithReport(again.partwiseXml)).toEqual({ markings, problems: [] });
  });

  it("shows the marking with words above the note and a vibrato wavy line over the whole tie chain", () => {
    const xml = embedMarkings(duet, markings);
    expect(xml).toContain("<words>vib. 35¢ 5 Hz, top on pitch, growing · peak</words>");
    expect(xml).toContain('<words font-style="italic"> “quick &amp; light &lt;grace&gt;”</words>');
    // The tied F5 starts its line in bar 1 and stops it on the last tied note in bar 2.
    const bar2 = xml.slice(xml.indexOf('<measure number="2">'), xml.indexOf("</measure>", xml.indexOf('<measure number="2">')));
    expect(bar2.match(/<wavy-line type="stop" number="\d+"\/>/g)?.length).toBe(2); // F5 chain end and A4
    // The two marked chord members share onset and stave: their lines need different numbers.
    const p2 = xml.slice(xml.indexOf('<part id="P2">'));
    const starts = [...p2.matchAll(/<wavy-line type="start" number="(\d+)"/g)].map((m) => m[1]);
    expect(starts.slice(0, 2).sort()).toEqual(["1", "2"]);
    // Directions stay before the chord's first note, so they never split a chord.
    const chord = p2.slice(0, p2.indexOf("<backup>"));
    expect(chord.lastIndexOf("</direction>")).toBeLessThan(chord.indexOf("<note>"));
    expect(chord).toContain("<staff>1</staff></direction>");
  });

  it("replaces earlier markings instead of adding to them, and strips back to the original text", () => {
    const first = embedMarkings(duet, markings);
    const changed = new Map([["P1:m0:s1:v1:1/4:74", { ...base, depthCents: 15 }]]);
    const second = embedMarkings(first, changed);
    expect(extractMarkings(second)).toEqual(changed);
    expect(stripMarkings(first)).toBe(duet);
    expect(stripMarkings(second)).toBe(duet);
    expect(embedMarkings(duet, new Map())).toBe(duet);
  });

  it("reports markings whose note is not in the score instead of placing them elsewhere", () => {
    const { xml, unplaced } = embedMarkingsWithReport(
      duet,
      new Map([["P1:m9:s1:v1:0/1:70", base], ["P1:m0:s1:v1:1/4:74", base]]),
    );
    expect(unplaced).toEqual(["P1:m9:s1:v1:0/1:70"]);
    expect([...extractMarkings(xml).keys()]).toEqual(["P1:m0:s1:v1:1/4:74"]);
  });

  it("names a damaged carrier instead of inventing a marking", () => {
    const xml = embedMarkings(duet, new Map([["P1:m0:s1:v1:1/4:74", base]])).replace("speedHz=5.5", "speedHz=fast");
    const back = extractMarkingsWithReport(xml);
    expect(back.markings.size).toBe(0);
    expect(back.problems).toHaveLength(1);
    expect(back.problems[0].noteKey).toBe("P1:m0:s1:v1:1/4:74");
  });
});
