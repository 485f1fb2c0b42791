import { SaxesParser } from "saxes";
import { escAttr } from "./read/assemble";
import { MUSICXML_ATTRIBUTES, MUSICXML_ELEMENTS, MUSICXML_REFERENCED_ATTRIBUTES } from "./vocabulary";

/**
 * Keeps only MusicXML in a stored text (the reader's normalized partwise text): elements the
 * MusicXML 4.0 schema does not name — with everything inside them — and elements or attributes
 * of another namespace (a `<script>`, `<svg:…>`, `on…=` handlers, `xmlns` declarations other than
 * XLink's) are dropped, and so are comments and processing instructions. What is kept is written
 * back with the same text and attribute values, so the reader reads the same model from it.
 * The file as uploaded is kept apart (parts.source_bytes) and only ever served as an attachment.
 */

const ELEMENTS = new Set(MUSICXML_ELEMENTS);
const ATTRIBUTES = new Set([...MUSICXML_ATTRIBUTES, ...MUSICXML_REFERENCED_ATTRIBUTES]);
const XLINK_NS = "http://www.w3.org/1999/xlink";

export interface Dropped {
  elements: number;
  attributes: number;
  comments: number;
  instructions: number;
}

export interface KeptMusicXml {
  xml: string;
  dropped: Dropped;
}

const escText = (s: string) => (/[&<>]/.test(s) ? s.replace(/[&<>]/g, (c) => (c === "&" ? "&amp;" : c === "<" ? "&lt;" : "&gt;")) : s);

const keepsAttribute = (name: string, value: string) =>
  ATTRIBUTES.has(name) || (name === "xmlns:xlink" && value === XLINK_NS);

/** `xml` must be well-formed (it is: the reader wrote it from text its strict pass accepted). */
export function keepMusicXml(xml: string): KeptMusicXml {
  const dropped: Dropped = { elements: 0, attributes: 0, comments: 0, instructions: 0 };
  const out: string[] = ['<?xml version="1.0" encoding="UTF-8"?>\n'];
  const parser = new SaxesParser({ xmlns: false, position: false, defaultXMLVersion: "1.0", forceXMLVersion: true });
  // Depth inside a dropped element (0: not inside one).
  let skipping = 0;
  let selfClosed = false;
  // Depth of the kept elements: text outside the root (only white space) is not kept.
  let depth = 0;
  parser.on("opentag", (tag) => {
    depth++;
    if (skipping > 0) {
      skipping++;
      return;
    }
    if (!ELEMENTS.has(tag.name)) {
      dropped.elements++;
      skipping = 1;
      return;
    }
    let s = `<${tag.name}`;
    for (const [name, value] of Object.entries(tag.attributes as Record<string, string>)) {
      if (keepsAttribute(name, value)) s += ` ${name}="${escAttr(value)}"`;
      else dropped.attributes++;
    }
    selfClosed = tag.isSelfClosing;
    out.push(selfClosed ? `${s}/>` : `${s}>`);
  });
  parser.on("closetag", (tag) => {
    depth--;
    if (skipping > 0) {
      skipping--;
      return;
    }
    if (selfClosed) selfClosed = false;
    else out.push(`</${tag.name}>`);
  });
  parser.on("text", (text) => {
    if (skipping === 0 && depth > 0) out.push(escText(text));
  });
  parser.on("cdata", (text) => {
    if (skipping === 0) out.push(escText(text));
  });
  parser.on("comment", () => {
    if (skipping === 0) dropped.comments++;
  });
  parser.on("processinginstruction", () => {
    if (skipping === 0) dropped.instructions++;
  });
  parser.on("error", (error) => {
    throw error;
  });
  parser.write(xml).close();
  out.push("\n");
  return { xml: out.join(""), dropped };
}
