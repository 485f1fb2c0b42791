import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { readMusicXmlText } from "./reader";
import { DEFAULT_LIMITS } from "./errors";
import { keepMusicXml } from "./keep-musicxml";
import { MUSICXML_ATTRIBUTES, MUSICXML_ELEMENTS } from "./vocabulary";

const XSD = path.resolve("tests/fixtures/standards/musicxml-4.0/musicxml.xsd");

const hostile = `<?xml version="1.0" encoding="UTF-8"?>
<!-- a comment that should not survive -->
<score-partwise version="4.0" xmlns:svg="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" onload="alert(1)">
  <?xml-stylesheet href="evil.xsl"?>
  <script>alert("root")</script>
  <part-list><score-part id="P1"><part-name>Flute &amp; friends</part-name></score-part></part-list>
  <part id="P1">
    <measure number="1">
      <attributes><divisions>1</divisions><time><beats>4</beats><beat-type>4</beat-type></time></attributes>
      <svg:svg><svg:script>alert("svg")</svg:script><note><pitch><step>C</step><octave>4</octave></pitch><duration>4</duration></note></svg:svg>
      <note svg:onclick="alert(2)" default-x="10"><pitch><step>A</step><octave>4</octave></pitch><duration>4</duration><type>whole</type></note>
      <!-- inside a measure -->
      <direction><direction-type><words xml:lang="en">dolce &lt;espr.&gt;</words></direction-type></direction>
      <credit-image xlink:href="cover.png" xlink:type="simple"/>
    </measure>
  </part>
</score-partwise>
`;

describe("keepMusicXml", () => {
  it("drops script, foreign-namespace markup, event attributes, comments and processing instructions", () => {
    const { xml, dropped } = keepMusicXml(hostile);
    expect(xml).not.toMatch(/script|svg|alert|onload|onclick|<!--|<\?xml-stylesheet/);
    expect(dropped).toEqual({ elements: 2, attributes: 3, comments: 2, instructions: 1 });
    // What is MusicXML stays, with its text and attributes written as they were read.
    expect(xml).toContain('<note default-x="10"><pitch><step>A</step><octave>4</octave></pitch><duration>4</duration><type>whole</type></note>');
    expect(xml).toContain("<part-name>Flute &amp; friends</part-name>");
    expect(xml).toContain('<words xml:lang="en">dolce &lt;espr.&gt;</words>');
    expect(xml).toContain('<credit-image xlink:href="cover.png" xlink:type="simple"/>');
    expect(xml).toContain('xmlns:xlink="http://www.w3.org/1999/xlink"');
  });

  it("leaves the model the reader builds unchanged", () => {
    const before = readMusicXmlText(hostile, DEFAULT_LIMITS);
    const after = readMusicXmlText(keepMusicXml(hostile).xml, DEFAULT_LIMITS);
    expect(after.score).toEqual(before.score);
    expect(after.score.parts[0].notes.map((n) => n.key.split(":").at(-1))).toEqual(["69"]); // A4 = MIDI 69 (MIDI 1.0 note numbers)
  });

  it("is idempotent: a kept text is kept as it is", () => {
    const once = keepMusicXml(hostile).xml;
    expect(keepMusicXml(once)).toEqual({ xml: once, dropped: { elements: 0, attributes: 0, comments: 0, instructions: 0 } });
  });
});

describe("the MusicXML vocabulary", () => {
  it("is every element and attribute name the MusicXML 4.0 schema declares (musicxml.xsd)", () => {
    const xsd = fs.readFileSync(XSD, "utf8");
    const names = (re: RegExp) => [...new Set([...xsd.matchAll(re)].map((m) => m[1]))].sort();
    expect([...MUSICXML_ELEMENTS]).toEqual(names(/<xs:element name="([^"]+)"/g));
    expect([...MUSICXML_ATTRIBUTES]).toEqual(names(/<xs:attribute name="([^"]+)"/g));
    expect(MUSICXML_ELEMENTS).toContain("score-partwise");
    expect(MUSICXML_ELEMENTS).not.toContain("script");
  });
});
