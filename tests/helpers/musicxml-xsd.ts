import { readFileSync } from "node:fs";
import path from "node:path";
import { validateXML } from "xmllint-wasm";

/** The MusicXML 4.0 schema kept in the repository (see its README): `tests/fixtures/standards/musicxml-4.0`. */
export const SCHEMA_DIR = path.resolve(import.meta.dirname, "../fixtures/standards/musicxml-4.0");

let schemaFiles: { main: string; xml: string; xlink: string } | null = null;

function loadSchema() {
  schemaFiles ??= {
    main: readFileSync(path.join(SCHEMA_DIR, "musicxml.xsd"), "utf8"),
    xml: readFileSync(path.join(SCHEMA_DIR, "xml.xsd"), "utf8"),
    xlink: readFileSync(path.join(SCHEMA_DIR, "xlink.xsd"), "utf8"),
  };
  return schemaFiles;
}

/** Validates a MusicXML text against the MusicXML 4.0 XSD with libxml2 (xmllint-wasm). */
export async function validateMusicXml(xml: string, fileName = "part.musicxml") {
  const s = loadSchema();
  const result = await validateXML({
    xml: [{ fileName, contents: xml }],
    schema: [{ fileName: "musicxml.xsd", contents: s.main }],
    preload: [
      { fileName: "xml.xsd", contents: s.xml },
      { fileName: "xlink.xsd", contents: s.xlink },
    ],
    maxMemoryPages: 1024,
  });
  return { valid: result.valid, errors: result.errors.map((e) => e.rawMessage) };
}
