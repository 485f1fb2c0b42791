import { fail } from "./errors";

/**
 * Refuses every DTD feature that could expand or fetch something, before the parser sees the text:
 * an internal DOCTYPE subset (`[ … ]`), any `<!ENTITY` declaration and parameter entities (`%x;`).
 * A DOCTYPE that only names an external DTD (the public MusicXML one) is accepted and never read.
 */
export function checkProlog(text: string): void {
  const d = text.indexOf("<!DOCTYPE");
  if (d >= 0) {
    let quote = "";
    for (let i = d + 9; i < text.length; i++) {
      const c = text[i];
      if (quote) {
        if (c === quote) quote = "";
      } else if (c === '"' || c === "'") quote = c;
      else if (c === "[") {
        // Name the most dangerous thing the subset holds, so the message says what was refused.
        const end = text.indexOf("]", i);
        const subset = text.slice(i, end < 0 ? text.length : end);
        if (/%[A-Za-z_:]/.test(subset)) throw fail.entity("parameter");
        if (subset.includes("<!ENTITY")) throw fail.entity("entity");
        throw fail.entity("subset");
      } else if (c === "%") throw fail.entity("parameter");
      else if (c === ">") break;
    }
  }
  if (text.indexOf("<!ENTITY") >= 0) throw fail.entity("entity");
}

/** The first meaningful character must open markup; says what the file looks like otherwise. */
export function checkLooksLikeXml(text: string): void {
  let i = 0;
  while (i < text.length && (text[i] === " " || text[i] === "\n" || text[i] === "\r" || text[i] === "\t")) i++;
  if (i === text.length) throw fail.empty();
  if (text.indexOf("\0") >= 0) throw fail.notXml("it contains binary data");
  if (text[i] !== "<") {
    const c = text[i];
    throw fail.notXml(c === "{" || c === "[" ? "it looks like JSON" : "it is plain text, not XML markup");
  }
}
