import { SaxesParser } from "saxes";
import { fail } from "./errors";

const ESC = /[&<>"\n\r\t]/g;
const ENT: Record<string, string> = { "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "\n": "&#10;", "\r": "&#13;", "\t": "&#9;" };
const esc = (s: string) => s.replace(ESC, (c) => ENT[c]);
const escText = (s: string) => s.replace(/[&<>]/g, (c) => ENT[c]);

/**
 * The normalized partwise text with only the chosen parts, in part-list and body, ids unchanged,
 * so the browser can engrave one part while every note key stays what the full score gives.
 * Input is the reader's own `partwiseXml`, never an upload.
 */
export function selectPartsXml(partwiseXml: string, partIds: string[]): string {
  const keep = new Set(partIds);
  const seen = new Set<string>();
  const parser = new SaxesParser({ position: false, xmlns: false });
  let out = "";
  let skipDepth = 0;
  let depth = 0;
  let tagOpen = false;
  let pending = "";
  parser.on("opentag", (tag) => {
    depth++;
    const attrs = tag.attributes as Record<string, string>;
    if (skipDepth) return;
    // MusicXML has no namespaced elements and no scripts: markup of another vocabulary that an
    // upload carried (SVG, XHTML, <script>) is dropped with everything inside it.
    if (isForeign(tag.name)) {
      skipDepth = depth;
      pending = "";
      return;
    }
    if ((tag.name === "score-part" && depth === 3) || (tag.name === "part" && depth === 2)) {
      if (tag.name === "part") seen.add(attrs.id);
      if (!keep.has(attrs.id)) {
        skipDepth = depth;
        pending = "";
        return;
      }
    }
    if (tagOpen) out += ">";
    out += escText(pending);
    pending = "";
    out += `<${tag.name}`;
    for (const k in attrs) if (keepAttribute(k)) out += ` ${k}="${esc(attrs[k])}"`;
    tagOpen = true;
  });
  parser.on("text", (t) => {
    if (!skipDepth) pending += t;
  });
  parser.on("closetag", (tag) => {
    if (skipDepth) {
      if (depth === skipDepth) skipDepth = 0;
      depth--;
      return;
    }
    depth--;
    if (tagOpen) out += pending === "" ? "/>" : `>${escText(pending)}</${tag.name}>`;
    else out += `${escText(pending)}</${tag.name}>`;
    tagOpen = false;
    pending = "";
  });
  parser.write(partwiseXml).close();
  const missing = partIds.filter((id) => !seen.has(id));
  if (missing.length) throw fail.unknownPart(missing);
  return `<?xml version="1.0" encoding="UTF-8"?>\n${out}\n`;
}

/** An element no MusicXML document has: a prefixed (foreign-namespace) name or a script. */
export function isForeign(name: string): boolean {
  return name.includes(":") || name.toLowerCase() === "script";
}

/** MusicXML's own attributes plus xlink:/xml: ones; event handlers and other namespaces go. */
function keepAttribute(name: string): boolean {
  // No MusicXML 4.0 attribute starts with "on" (musicxml.xsd); HTML event handlers all do.
  if (/^on/i.test(name)) return false;
  if (!name.includes(":")) return true;
  return name.startsWith("xlink:") || name.startsWith("xml:") || name === "xmlns:xlink";
}
