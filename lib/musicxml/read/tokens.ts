import { SaxesParser } from "saxes";
import { fail, MusicXmlError } from "../errors";
import { FractionRangeError } from "../fraction";

/**
 * Step 1 of the reader: tokens. One strict saxes pass (XML 1.0, no DTD, only XML's own entities)
 * that hands each element's opening and closing to a sink with the few pieces of context every
 * later step needs: depth, parent name and the element's own text. No tree is built.
 */

export interface TokenSink {
  /** `depth` is the element's own depth (the root is 1). */
  open(name: string, attrs: Record<string, string>, depth: number, parent: string, selfClosing: boolean): void;
  /** `text` is a leaf element's whole text ("" for an element with children: none of them is read). */
  close(name: string, text: string, depth: number, parent: string): void;
}

export class Tokens {
  private readonly parser: SaxesParser;
  private readonly names: string[] = [];
  private depth = 0;
  private pending = "";
  private sawRoot = false;

  constructor(
    readonly source: string,
    private readonly maxDepth: number,
    /** Track line and column too (only callers that report positions pay for it). */
    position = false,
  ) {
    // XML 1.0 forced: the browser parses the normalized output as XML 1.0, so both accept the same text.
    this.parser = new SaxesParser({ position, xmlns: false, defaultXMLVersion: "1.0", forceXMLVersion: true });
  }

  /** Offset just past the current token. */
  get position(): number {
    return this.parser.position;
  }

  /** Offset of the `<` that begins the current tag. */
  tagStart(): number {
    return this.source.lastIndexOf("<", this.parser.position - 1);
  }

  run(sink: TokenSink): void {
    const { parser, names, maxDepth } = this;
    // Text is only listened to between an element's opening and the next tag: the whitespace
    // between elements (most of a file's text) then costs saxes no string at all.
    const onText = (t: string) => {
      this.pending += t;
    };
    let listening = false;
    // What `on("text")` and `off("text")` set (saxes 6.0.0, pinned), written directly: the two
    // calls go through a lookup by event name that cost a tenth of the whole read, twice per element.
    const hooks = parser as unknown as { textHandler: ((t: string) => void) | undefined };
    parser.on("opentag", (tag) => {
      const depth = ++this.depth;
      if (depth > maxDepth) throw fail.nesting(maxDepth);
      names[depth] = tag.name;
      this.pending = "";
      if (depth === 1) this.sawRoot = true;
      if (!listening && !tag.isSelfClosing) {
        hooks.textHandler = onText;
        listening = true;
      }
      sink.open(tag.name, tag.attributes as Record<string, string>, depth, names[depth - 1], tag.isSelfClosing);
    });
    parser.on("cdata", onText);
    parser.on("closetag", (tag) => {
      const depth = this.depth--;
      const text = this.pending;
      this.pending = "";
      if (listening) {
        hooks.textHandler = undefined;
        listening = false;
      }
      sink.close(tag.name, text, depth, names[depth - 1]);
    });

    try {
      parser.write(this.source);
    } catch (err) {
      throw translate(err, this.source, false);
    }
    try {
      parser.close();
    } catch (err) {
      if (!this.sawRoot && !(err instanceof MusicXmlError)) throw fail.notXml("it has no root element");
      throw translate(err, this.source, true);
    }
    if (!this.sawRoot) throw fail.notXml("it has no root element");
  }
}

/** The reader's own errors pass through; the tokenizer's become a refusal a person can act on. */
export function translate(err: unknown, text: string, closing: boolean): Error {
  if (err instanceof MusicXmlError) return err;
  if (err instanceof FractionRangeError) return fail.duration("?", "out of range");
  const why = err instanceof Error ? err.message : String(err);
  if (closing) return fail.truncated();
  return fail.malformed(locate(text), why.replace(/^[^:]*:\d+:\d+: /, ""));
}

/** Line and column of the first well-formedness error, found by a second pass only on failure. */
function locate(text: string): string {
  const p = new SaxesParser({ position: true });
  let where = "";
  p.on("error", () => {
    if (!where) where = `line ${p.line}, column ${p.column}`;
  });
  try {
    p.write(text).close();
  } catch {
    /* the first position is all we need */
  }
  return where;
}
