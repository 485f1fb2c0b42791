import { fail } from "./errors";

/**
 * Refuses every DTD feature that could expand or fetch something, before the parser sees the text:
 * an internal DOCTYPE subset (`[ … ]`), any `<!ENTITY` declaration and parameter entities (`%x;`).
 * A DOCTYPE that only names an external DTD (the public MusicXML one) is accepted and never read.
 */
export function checkProlog(text: string): void {
  if (text.indexOf("<!ENTITY") >= 0) throw fail.entity("entity");
  const d = text.indexOf("<!DOCTYPE");
  if (d < 0) return;
  let quote = "";
  for (let i = d + 9; i < text.length; i++) {
    const c = text[i];
    if (quote) {
      if (c === quote) quote = "";
    } else if (c === '"' || c === "'") quote = c;
    else if (c === "[") throw fail.entity("subset");
    else if (c === "%") throw fail.entity("parameter");
    else if (c === ">") return;
  }
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
