import { describe, expect, it } from "vitest";
import { Tokens, type TokenSink } from "./tokens";

function events(xml: string, maxDepth = 64) {
  const out: string[] = [];
  const tokens = new Tokens(xml, maxDepth);
  const sink: TokenSink = {
    open: (name, attrs, depth, parent) => out.push(`open ${name} d${depth} in ${parent ?? "-"} ${JSON.stringify(attrs)} at ${xml.slice(tokens.tagStart(), tokens.tagStart() + name.length + 1)}`),
    close: (name, text, depth, parent) => out.push(`close ${name} d${depth} in ${parent ?? "-"} "${text}"`),
  };
  tokens.run(sink);
  return out;
}

describe("tokens", () => {
  it("hands each element's opening and closing with its depth, parent, attributes and own text", () => {
    expect(events('<a x="1"><b>hi &amp; <![CDATA[there]]></b><c/></a>')).toEqual([
      'open a d1 in - {"x":"1"} at <a',
      'open b d2 in a {} at <b',
      'close b d2 in a "hi & there"',
      "open c d2 in a {} at <c",
      'close c d2 in a ""',
      'close a d1 in - ""',
    ]);
  });

  it("refuses nesting beyond the limit with the reader's code", () => {
    expect(() => events("<a><b><c/></b></a>", 2)).toThrow(expect.objectContaining({ code: "bad_request:nesting" }));
  });

  it("turns a well-formedness error into bad_request:malformed with its line and column", () => {
    expect(() => events("<a>\n<b></a>")).toThrow(expect.objectContaining({ code: "bad_request:malformed", message: expect.stringContaining("line 2") }));
  });

  it("turns a text that stops inside an element into bad_request:truncated", () => {
    expect(() => events("<a><b>")).toThrow(expect.objectContaining({ code: "bad_request:truncated" }));
  });

  it("refuses a text with no root element", () => {
    expect(() => events("")).toThrow(expect.objectContaining({ code: "unsupported:not_xml" }));
  });
});
