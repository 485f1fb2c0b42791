import { strToU8, zipSync } from "fflate";
import { describe, expect, it } from "vitest";
import { readScoreFile, selectPartsXml, MusicXmlError } from "./index";
import type { Note } from "./model";
import { attrs, note, partwise, read, rest, XML_DECL } from "./test-scores";

const sounding = (notes: Note[]) => notes.filter((n) => !n.isRest);
const f = (n: Note) => `${n.onset.num}/${n.onset.den}`;
const d = (n: Note) => `${n.duration.num}/${n.duration.den}`;

describe("element semantics (MusicXML 4.0)", () => {
  it("divisions: duration counts divisions per quarter note; 128 at divisions 32 is a whole note", () => {
    // https://www.w3.org/2021/06/musicxml40/musicxml-reference/elements/divisions/
    // (spec example: divisions 32, a whole note has duration 128)
    const { score } = read(partwise([attrs(32) + note("C", 5, 128)]));
    const [n] = score.parts[0].notes;
    expect(d(n)).toBe("1/1");
    expect(score.parts[0].measures[0].divisions).toBe(32);
  });

  it("backup: after three quarters at divisions 6, backup 18 returns to the start for voice 2", () => {
    // https://www.w3.org/2021/06/musicxml40/musicxml-reference/elements/backup/
    // (spec example: three quarter notes of duration 6, then <backup><duration>18</duration>)
    const m =
      attrs(6, 0, 3, 4) +
      note("C", 5, 6) +
      note("D", 5, 6) +
      note("E", 5, 6) +
      "<backup><duration>18</duration></backup>" +
      note("C", 4, 18, { voice: "2" });
    const notes = read(partwise([m])).score.parts[0].notes;
    const low = notes.find((n) => n.voice === "2")!;
    expect(f(low)).toBe("0/1");
    expect(d(low)).toBe("3/4");
    expect(notes.filter((n) => n.voice === "1").map(f)).toEqual(["0/1", "1/4", "1/2"]);
    expect(low.key).toBe("P1:m0:s1:v2:0/1:60");
  });

  it("forward: moves the position without a note, inside the voice", () => {
    // https://www.w3.org/2021/06/musicxml40/musicxml-reference/elements/forward/
    const m = attrs(4) + note("C", 5, 4) + "<forward><duration>8</duration></forward>" + note("G", 5, 4);
    const notes = read(partwise([m])).score.parts[0].notes;
    expect(notes.map(f)).toEqual(["0/1", "3/4"]);
  });

  it("chord: a chord tone starts with the preceding note and does not move the position", () => {
    // https://www.w3.org/2021/06/musicxml40/musicxml-reference/elements/chord/
    const m = attrs(1) + note("C", 4, 2) + note("E", 4, 2, { chord: true }) + note("G", 4, 2, { chord: true }) + note("C", 5, 2);
    const notes = read(partwise([m])).score.parts[0].notes;
    expect(notes.map((n) => [n.pitch!.name, f(n), n.isChord])).toEqual([
      ["C4", "0/1", false],
      ["E4", "0/1", true],
      ["G4", "0/1", true],
      ["C5", "1/2", false],
    ]);
  });

  it("tie: a C5 half (duration 4) tied to a C5 eighth (duration 1) is one sounding note of duration 5", () => {
    // https://www.w3.org/2021/06/musicxml40/musicxml-reference/elements/tie/
    // (spec example: divisions 2, C5 duration 4 tied to C5 duration 1)
    const m = attrs(2) + note("C", 5, 4, { tie: ["start"] }) + note("C", 5, 1, { tie: ["stop"] }) + note("D", 5, 1) + rest(2);
    const notes = sounding(read(partwise([m])).score.parts[0].notes);
    expect(notes).toHaveLength(2);
    expect(d(notes[0])).toBe("5/8"); // 5 divisions of a quarter at 2 per quarter = 5/8 of a whole
    expect(notes[0].tied).toBe(true);
    expect(f(notes[1])).toBe("5/8");
  });

  it("tie: a chain across two barlines merges into its first note and keeps its key", () => {
    const m1 = attrs(1, 0, 2, 4) + note("G", 4, 1) + note("A", 4, 1, { tie: ["start"], notations: '<tied type="start"/>' });
    const m2 = note("A", 4, 2, { tie: ["stop", "start"] });
    const m3 = note("A", 4, 1, { tie: ["stop"], notations: "<fermata/>" }) + rest(1);
    const notes = sounding(read(partwise([m1, m2, m3])).score.parts[0].notes);
    expect(notes.map((n) => n.key)).toEqual(["P1:m0:s1:v1:0/1:67", "P1:m0:s1:v1:1/4:69"]);
    expect(d(notes[1])).toBe("1/1");
    expect(notes[1].marks.fermata).toBe(true); // the chain ends on the fermata
  });

  it("key: fifths and mode, with a change in the middle of the part", () => {
    // https://www.w3.org/2021/06/musicxml40/musicxml-reference/elements/key/
    // fifths: negative numbers are flats, positive sharps (circle of fifths); mode is optional.
    const m1 = attrs(1, -2, 4, 4, "minor") + note("G", 4, 4);
    const m2 = note("F", 4, 4, { alter: 1 });
    const m3 = '<attributes><key><fifths>3</fifths></key></attributes>' + note("A", 4, 4);
    const ms = read(partwise([m1, m2, m3])).score.parts[0].measures;
    expect(ms.map((m) => [m.key.fifths, m.key.mode, m.keyChanged])).toEqual([
      [-2, "minor", true],
      [-2, "minor", false],
      [3, null, true],
    ]);
  });

  it("key: fifths beyond ±7 are legal xs:integer values and are accepted", () => {
    // https://www.w3.org/2021/06/musicxml40/musicxml-reference/elements/fifths/ (type xs:integer)
    const ms = read(partwise([attrs(1, 11) + note("C", 5, 4)])).score.parts[0].measures;
    expect(ms[0].key.fifths).toBe(11);
  });

  it("time: 6/8 lasts three quarters; a change of signature mid-part is recorded", () => {
    // https://www.w3.org/2021/06/musicxml40/musicxml-reference/elements/time/
    const m1 = attrs(2, 0, 6, 8) + note("C", 5, 3) + note("D", 5, 3);
    const m2 = "<attributes><time><beats>2</beats><beat-type>4</beat-type></time></attributes>" + note("E", 5, 4);
    const ms = read(partwise([m1, m2])).score.parts[0].measures;
    expect(ms[0].time).toEqual({ beats: 6, beatType: 8 });
    expect(ms[0].length).toEqual({ num: 3, den: 4 });
    expect(ms[1].time).toEqual({ beats: 2, beatType: 4 });
    expect(ms[1].timeChanged).toBe(true);
    expect(ms[1].length).toEqual({ num: 1, den: 2 });
  });

  it("sound tempo wins over a metronome mark: eighth = 132–144 with sound tempo 69 is 69 quarters per minute", () => {
    // https://www.w3.org/2021/06/musicxml40/musicxml-reference/elements/metronome/ (spec example)
    // https://www.w3.org/2021/06/musicxml40/musicxml-reference/elements/sound/ (tempo = quarter notes per minute)
    const dir =
      '<direction><direction-type><metronome><beat-unit>eighth</beat-unit><per-minute>132-144</per-minute></metronome></direction-type><sound tempo="69"/></direction>';
    const ms = read(partwise([attrs(1) + dir + note("C", 5, 4)])).score.parts[0].measures;
    expect(ms[0].tempo).toBe(69);
  });

  it("metronome alone converts to quarters per minute: eighth = 138 → 69; dotted quarter = 60 → 90", () => {
    // https://www.w3.org/2021/06/musicxml40/musicxml-reference/elements/metronome/
    const met = (unit: string, dot: boolean, pm: string) =>
      `<direction><direction-type><metronome><beat-unit>${unit}</beat-unit>${dot ? "<beat-unit-dot/>" : ""}<per-minute>${pm}</per-minute></metronome></direction-type></direction>`;
    expect(read(partwise([attrs(1) + met("eighth", false, "138") + note("C", 5, 4)])).score.parts[0].measures[0].tempo).toBe(69);
    expect(read(partwise([attrs(2, 0, 6, 8) + met("quarter", true, "60") + note("C", 5, 6)])).score.parts[0].measures[0].tempo).toBe(90);
  });

  it("gives seconds at the tempo in force, changing mid-part", () => {
    const t = (q: number) => `<direction><sound tempo="${q}"/></direction>`;
    const m1 = attrs(1) + t(60) + note("C", 5, 1) + note("D", 5, 1) + note("E", 5, 2);
    const m2 = t(120) + note("F", 5, 2) + note("G", 5, 2);
    const p = read(partwise([m1, m2])).score.parts[0];
    expect(p.notes.map((n) => n.onsetSeconds)).toEqual([0, 1, 2, 4, 5]);
    expect(p.notes[2].durationSeconds).toBe(2);
    expect(p.measures.map((m) => [m.startSeconds, m.tempo])).toEqual([
      [0, 60],
      [4, 120],
    ]);
  });

  it("a pickup measure is as long as its notes, for seconds and the following onsets", () => {
    const pickup = attrs(1) + '<direction><sound tempo="60"/></direction>' + note("G", 4, 1);
    const p = read(partwise([pickup, note("C", 5, 4)])).score.parts[0];
    expect(p.measures[1].startSeconds).toBe(1);
    expect(p.notes[1].onsetSeconds).toBe(1);
  });

  it("grace notes take the onset of the note they lead into and number themselves before it", () => {
    // https://www.w3.org/2021/06/musicxml40/musicxml-reference/elements/grace/ (no duration)
    const m = attrs(1) + note("C", 5, 1) + note("E", 5, 0, { grace: true }) + note("F", 5, 0, { grace: true }) + note("D", 5, 3);
    const notes = read(partwise([m])).score.parts[0].notes;
    expect(notes.map((n) => n.key)).toEqual([
      "P1:m0:s1:v1:0/1:72",
      "P1:m0:s1:v1:1/4:76:g1",
      "P1:m0:s1:v1:1/4:77:g2",
      "P1:m0:s1:v1:1/4:74",
    ]);
    expect(notes[1].isGrace && notes[1].duration.num === 0).toBe(true);
  });

  it("grace notes after a bar's last note are keyed at that note, numbered on after its own grace notes", () => {
    // One grace note leads into the half note at 1/2; two more follow it before the barline
    // (a trill's closing notes). Convention: DEVELOPERS.md, "Note keys".
    const m = attrs(1, 0, 4, 4) + note("C", 5, 2) + note("B", 4, 0, { grace: true }) + note("D", 5, 2) + note("C", 5, 0, { grace: true }) + note("D", 5, 0, { grace: true });
    const notes = read(partwise([m, note("E", 5, 4)])).score.parts[0].notes;
    expect(notes.filter((n) => n.isGrace).map((n) => [n.key, f(n)])).toEqual([
      ["P1:m0:s1:v1:1/2:71:g1", "1/2"],
      ["P1:m0:s1:v1:1/2:72:g2", "1/1"],
      ["P1:m0:s1:v1:1/2:74:g3", "1/1"],
    ]);
  });

  it("keeps staves and voices apart in keys, and lists notes in time order", () => {
    const m =
      "<attributes><divisions>1</divisions><staves>2</staves><time><beats>2</beats><beat-type>4</beat-type></time></attributes>" +
      note("E", 5, 1, { staff: 1 }) +
      note("F", 5, 1, { staff: 1 }) +
      "<backup><duration>2</duration></backup>" +
      note("C", 3, 2, { staff: 2, voice: "5" });
    const notes = read(partwise([m])).score.parts[0].notes;
    expect(notes.map((n) => n.key)).toEqual(["P1:m0:s1:v1:0/1:76", "P1:m0:s2:v5:0/1:48", "P1:m0:s1:v1:1/4:77"]);
  });

  it("reads the phrase marks: fermata, breath mark, caesura, slurs with numbers, dynamics", () => {
    const dyn = "<direction><direction-type><dynamics><pp/></dynamics></direction-type></direction>";
    const m =
      attrs(1) +
      dyn +
      note("C", 5, 1, { notations: '<slur type="start" number="2"/>' }) +
      note("D", 5, 1, { notations: '<slur type="stop" number="2"/><articulations><breath-mark/></articulations>' }) +
      note("E", 5, 1, { notations: "<articulations><caesura/></articulations>" }) +
      note("F", 5, 1, { notations: "<fermata/><dynamics><sfz/></dynamics>" });
    const [a, b, c, e] = read(partwise([m])).score.parts[0].notes.map((n) => n.marks);
    expect(a.slurStarts).toEqual([2]);
    expect(a.dynamics).toBe("pp");
    expect(b.slurStops).toEqual([2]);
    expect(b.breathMark).toBe(true);
    expect(c.caesura).toBe(true);
    expect(e.fermata).toBe(true);
    expect(e.dynamics).toBe("sfz");
  });

  it("reads barline styles and repeats, keeping repeats in written order with a remark", () => {
    const m1 = attrs(1) + note("C", 5, 4) + '<barline location="right"><bar-style>light-light</bar-style></barline>';
    const m2 =
      '<barline location="left"><bar-style>heavy-light</bar-style><repeat direction="forward"/></barline>' +
      note("D", 5, 4) +
      '<barline location="right"><bar-style>light-heavy</bar-style><repeat direction="backward"/></barline>';
    const m3 = note("E", 5, 4) + '<barline location="right"><bar-style>light-heavy</bar-style></barline>';
    const { score } = read(partwise([m1, m2, m3]));
    const ms = score.parts[0].measures;
    expect(ms.map((m) => [m.barlineLeft, m.barlineRight])).toEqual([
      ["regular", "double"],
      ["repeat-start", "repeat-end"],
      ["regular", "final"],
    ]);
    expect(score.parts[0].notes).toHaveLength(3); // not unfolded
    expect(score.remarks.join(" ")).toMatch(/written order/);
  });

  it("reports written pitch for a transposing part and says so", () => {
    // https://www.w3.org/2021/06/musicxml40/musicxml-reference/elements/transpose/
    // (chromatic: semitones to add to the written pitch to get the sounding pitch)
    const m =
      "<attributes><divisions>1</divisions><key><fifths>2</fifths></key><time><beats>4</beats><beat-type>4</beat-type></time><transpose><diatonic>-1</diatonic><chromatic>-2</chromatic></transpose></attributes>" +
      note("E", 5, 4);
    const { score } = read(partwise([m]));
    expect(score.parts[0].notes[0].pitch!.name).toBe("E5");
    expect(score.parts[0].measures[0].key.fifths).toBe(2);
    expect(score.remarks.join(" ")).toMatch(/2 semitones lower than written.*as written/);
  });

  it("reads a bar longer than its time signature as written and names it (a cadenza is one long bar)", () => {
    const long = attrs(1) + note("C", 5, 4) + note("D", 5, 1);
    const cadenza = note("C", 5, 4) + note("D", 5, 4) + note("E", 5, 2);
    const { score } = read(partwise([long, cadenza, note("C", 5, 4)]));
    const [part] = score.parts;
    expect(part.notes.map((n) => n.measureIndex)).toEqual([0, 0, 1, 1, 1, 2]);
    // The next bar starts where the long one ends: 5 + 10 quarters at the default 120 per minute.
    expect(part.measures[2].startSeconds).toBeCloseTo(7.5, 9);
    expect(score.notices).toEqual([
      { code: "bar_longer", measureIndex: 0, measureNumber: "1", message: "bar 1 lasts 5 beats in 4/4 — read as written" },
      { code: "bar_longer", measureIndex: 1, measureNumber: "2", message: "bar 2 lasts 10 beats in 4/4 — read as written" },
    ]);
  });
});

// The same two-part music (flute, and a piano chord under it) in both encodings.
const FLUTE_M1 = attrs(2, 1, 2, 4, "major") + '<direction><sound tempo="80"/></direction>' + note("G", 5, 2, { tie: ["start"] }) + note("A", 5, 2);
const FLUTE_M2 = note("G", 5, 1, { tie: ["stop"] }) + note("F", 5, 1, { alter: 1 }) + note("G", 5, 2, { notations: "<fermata/>" });
const PIANO_M1 = attrs(2, 1, 2, 4, "major") + note("G", 3, 4) + note("B", 3, 4, { chord: true }) + note("D", 4, 4, { chord: true });
const PIANO_M2 = note("D", 3, 2) + note("G", 3, 2);
const PART_LIST =
  '<part-list><score-part id="P1"><part-name>Flute</part-name></score-part><score-part id="P2"><part-name>Piano</part-name></score-part></part-list>';

const TWO_PARTWISE = [
  XML_DECL,
  '<score-partwise version="4.0">',
  "<work><work-title>Evening Air</work-title></work>",
  PART_LIST,
  `<part id="P1"><measure number="1">${FLUTE_M1}</measure><measure number="2">${FLUTE_M2}</measure></part>`,
  `<part id="P2"><measure number="1">${PIANO_M1}</measure><measure number="2">${PIANO_M2}</measure></part>`,
  "</score-partwise>",
].join("\n");

const TWO_TIMEWISE = [
  XML_DECL,
  '<!DOCTYPE score-timewise PUBLIC "-//Recordare//DTD MusicXML 4.0 Timewise//EN" "http://www.musicxml.org/dtds/timewise.dtd">',
  '<score-timewise version="4.0">',
  "<work><work-title>Evening Air</work-title></work>",
  PART_LIST,
  `<measure number="1"><part id="P1">${FLUTE_M1}</part><part id="P2">${PIANO_M1}</part></measure>`,
  `<measure number="2"><part id="P1">${FLUTE_M2}</part><part id="P2">${PIANO_M2}</part></measure>`,
  "</score-timewise>",
].join("\n");

describe("encodings and the normalized text", () => {
  it("timewise and partwise encodings of the same music give the same model", () => {
    const a = read(TWO_PARTWISE);
    const b = read(TWO_TIMEWISE);
    expect(b.score).toEqual(a.score);
    expect(a.score.parts.map((p) => p.name)).toEqual(["Flute", "Piano"]);
    expect(a.score.title).toBe("Evening Air");
    expect(b.partwiseXml).toMatch(/^<\?xml version="1.0" encoding="UTF-8"\?>\n<score-partwise version="4.0">/);
    expect(b.partwiseXml).not.toMatch(/timewise|DOCTYPE/);
  });

  it("reading the normalized text again gives the same model and the same keys", () => {
    for (const src of [TWO_PARTWISE, TWO_TIMEWISE]) {
      const first = read(src);
      const again = read(first.partwiseXml);
      expect(again.score).toEqual(first.score);
      expect(again.partwiseXml).toBe(first.partwiseXml);
    }
  });

  it("drops the DOCTYPE and comments between top-level elements, keeps the music", () => {
    const src = read(partwise([attrs(1) + note("C", 5, 4)])).partwiseXml;
    expect(src).not.toContain("<!DOCTYPE");
    expect(src.startsWith("<?xml")).toBe(true); // the engraving library treats short non-XML strings as URLs
  });

  it("selectPartsXml keeps only the chosen part, with unchanged ids and note keys", () => {
    const full = read(TWO_PARTWISE);
    const pianoOnly = selectPartsXml(full.partwiseXml, ["P2"]);
    expect(pianoOnly).not.toContain('id="P1"');
    const reread = read(pianoOnly).score;
    expect(reread.parts.map((p) => p.id)).toEqual(["P2"]);
    expect(reread.parts[0].notes.map((n) => n.key)).toEqual(full.score.parts[1].notes.map((n) => n.key));
    expect(() => selectPartsXml(full.partwiseXml, ["P9"])).toThrow(expect.objectContaining({ code: "not_found:part" }));
  });

  it("reads a compressed .mxl through META-INF/container.xml, without a mimetype entry, by content not name", () => {
    // MusicXML 4.0 tutorial "Compressed .MXL Files": the first rootfile names the score;
    // files before 3.1 may lack the mimetype entry.
    const container =
      '<?xml version="1.0" encoding="UTF-8"?><container><rootfiles><rootfile full-path="music/evening.musicxml" media-type="application/vnd.recordare.musicxml+xml"/><rootfile full-path="music/evening.pdf" media-type="application/pdf"/></rootfiles></container>';
    const zip = zipSync({ "META-INF/container.xml": strToU8(container), "music/evening.musicxml": strToU8(TWO_PARTWISE) });
    const r = readScoreFile(zip, "evening.musicxml");
    expect(r.format).toBe("mxl");
    expect(r.score).toEqual(read(TWO_PARTWISE).score);
  });

  it("counts notes against the limit while streaming", () => {
    const m = attrs(1) + note("C", 5, 1).repeat(4);
    const bytes = new TextEncoder().encode(partwise([m, m, m]));
    expect(readScoreFile(bytes, "x.musicxml", { maxNotes: 12 }).score.parts[0].notes).toHaveLength(12);
    let err: unknown;
    try {
      readScoreFile(bytes, "x.musicxml", { maxNotes: 11 });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(MusicXmlError);
    expect((err as MusicXmlError).code).toBe("too_large:notes");
    expect((err as MusicXmlError).status).toBe(413);
  });
});
