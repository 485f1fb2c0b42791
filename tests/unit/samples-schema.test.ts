import fs from "node:fs";
import path from "node:path";
import { strFromU8, unzipSync } from "fflate";
import { describe, expect, it } from "vitest";
import { validateXML, type XMLFileInfo } from "xmllint-wasm";
import { buildMxl, MXL_MIMETYPE } from "../../scripts/make-sample-mxl";

// Every sample must be valid MusicXML 4.0 according to the W3C Music Notation Community Group's
// own XSD (MusicXML 4.0 Final Community Group Report, June 2021; schema/musicxml.xsd), which the
// project keeps in tests/fixtures/standards so validation never touches the network.
const root = path.resolve(import.meta.dirname, "../..");
const schemaDir = path.join(root, "tests/fixtures/standards/musicxml-4.0");
const samplesDir = path.join(root, "samples");

const read = (file: string): XMLFileInfo => ({ fileName: file, contents: fs.readFileSync(path.join(schemaDir, file), "utf8") });
const musicxmlSchema = read("musicxml.xsd");
const containerSchema = read("container.xsd");
// musicxml.xsd imports these two; the local copy points its xs:import at the file names.
const imports = [read("xml.xsd"), read("xlink.xsd")];

/** The DOCTYPE every partwise file written by notation programs carries (MusicXML 4.0 DTD). */
const PARTWISE_DOCTYPE =
  '<!DOCTYPE score-partwise PUBLIC "-//Recordare//DTD MusicXML 4.0 Partwise//EN" "http://www.musicxml.org/dtds/partwise.dtd">';

async function validate(fileName: string, xml: string, schema = musicxmlSchema) {
  // xmllint would try to load the DTD named by the DOCTYPE; the XSD alone decides validity here.
  const withoutDoctype = xml.replace(/<!DOCTYPE[^>]*>/, "");
  const result = await validateXML({ xml: { fileName, contents: withoutDoctype }, schema, preload: imports });
  return { valid: result.valid, errors: result.errors.map((e) => e.rawMessage) };
}

const files = fs.readdirSync(samplesDir).filter((f) => /\.(musicxml|mxl)$/.test(f)).sort();

describe("samples", () => {
  it("has at least fourteen parts, one of them compressed", () => {
    expect(files.length).toBeGreaterThanOrEqual(14);
    expect(files.filter((f) => f.endsWith(".mxl")).length).toBeGreaterThanOrEqual(1);
  });

  it("rejects a broken file (the validator is not vacuous)", async () => {
    const xml = fs.readFileSync(path.join(samplesDir, "harbour-song.musicxml"), "utf8");
    // The XSD requires <duration> on every non-grace note.
    const broken = xml.replace("<duration>4</duration>", "");
    expect(broken).not.toBe(xml);
    const result = await validate("broken.musicxml", broken);
    expect(result.valid).toBe(false);
    expect(result.errors.join("\n")).toMatch(/duration/);
  });

  for (const file of files.filter((f) => f.endsWith(".musicxml"))) {
    it(`${file} is valid MusicXML 4.0 partwise`, async () => {
      const xml = fs.readFileSync(path.join(samplesDir, file), "utf8");
      expect(xml.split("\n")[1]).toBe(PARTWISE_DOCTYPE);
      const result = await validate(file, xml);
      expect(result.errors).toEqual([]);
      expect(result.valid).toBe(true);
    });
  }

  for (const file of files.filter((f) => f.endsWith(".mxl"))) {
    it(`${file} is a MusicXML container with a valid root file`, async () => {
      const bytes = new Uint8Array(fs.readFileSync(path.join(samplesDir, file)));
      const entries = unzipSync(bytes);
      const names = Object.keys(entries);
      // MusicXML 4.0 spec, "Compressed MusicXML files": the mimetype entry comes first.
      expect(names[0]).toBe("mimetype");
      expect(strFromU8(entries.mimetype)).toBe(MXL_MIMETYPE);

      const container = strFromU8(entries["META-INF/container.xml"]);
      const containerResult = await validate("container.xml", container, containerSchema);
      expect(containerResult.errors).toEqual([]);
      const rootPath = /<rootfile[^>]*full-path="([^"]+)"/.exec(container)?.[1];
      expect(rootPath).toBeDefined();

      const score = strFromU8(entries[rootPath!]);
      expect(score.split("\n")[1]).toBe(PARTWISE_DOCTYPE);
      const result = await validate(rootPath!, score);
      expect(result.errors).toEqual([]);
      expect(result.valid).toBe(true);

      // The committed file is what scripts/make-sample-mxl.ts builds from its source today.
      const source = fs.readFileSync(path.join(samplesDir, "source", file.replace(/\.mxl$/, ".musicxml")), "utf8");
      expect(Buffer.from(buildMxl(rootPath!, source)).equals(Buffer.from(bytes))).toBe(true);
    });
  }
});
