import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { readScoreFile } from "./index";
import { isForeign, selectPartsXml } from "./select-parts";

const XSD = fs.readFileSync(path.resolve("tests/fixtures/standards/musicxml-4.0/musicxml.xsd"), "utf8");

describe("selectPartsXml drops markup that is not MusicXML", () => {
  it("treats no element of the MusicXML 4.0 schema as foreign (musicxml.xsd)", () => {
    const names = [...XSD.matchAll(/<xs:element name="([^"]+)"/g)].map((m) => m[1]);
    expect(names.length).toBeGreaterThan(300);
    expect(names.filter(isForeign)).toEqual([]);
    // Nor does the schema define any attribute that an HTML event handler's "on…" could be.
    expect([...XSD.matchAll(/<xs:attribute name="(on[^"]*)"/g)]).toEqual([]);
  });

  it("removes foreign-namespace elements, scripts and event-handler attributes from what it serves", () => {
    const hostile = `<?xml version="1.0" encoding="UTF-8"?>
<score-partwise version="4.0" xmlns:h="http://www.w3.org/1999/xhtml">
  <part-list><score-part id="P1"><part-name>Flute</part-name></score-part></part-list>
  <part id="P1"><measure number="1" onload="alert(1)">
    <h:script>alert(document.cookie)</h:script><script>alert(2)</script>
    <attributes><divisions>1</divisions><time><beats>4</beats><beat-type>4</beat-type></time></attributes>
    <note><pitch><step>C</step><octave>5</octave></pitch><duration>4</duration><type>whole</type></note>
  </measure></part>
</score-partwise>`;
    const { partwiseXml } = readScoreFile(new TextEncoder().encode(hostile), "hostile.musicxml");
    const served = selectPartsXml(partwiseXml, ["P1"]);
    expect(served).not.toMatch(/script|alert|onload/i);
    expect(served).toContain("<step>C</step>");
  });
});
