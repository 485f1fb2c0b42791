import { describe, expect, it } from "vitest";
import { contentSizeMm, contentWidthPx, PAPERS, parseStandCopyOptions, standCopyHref } from "./options";

describe("stand copy paper", () => {
  it("knows the A4 and Letter sheets", () => {
    // ISO 216: A4 is 210 × 297 mm. ANSI/ASME Y14.1: Letter is 8.5 × 11 in = 215.9 × 279.4 mm.
    expect([PAPERS.a4.widthMm, PAPERS.a4.heightMm]).toEqual([210, 297]);
    expect(PAPERS.letter.widthMm).toBeCloseTo(8.5 * 25.4, 10);
    expect(PAPERS.letter.heightMm).toBeCloseTo(11 * 25.4, 10);
    // CSS Paged Media: `size` accepts the keywords A4 and letter.
    expect([PAPERS.a4.cssSize, PAPERS.letter.cssSize]).toEqual(["A4", "letter"]);
  });

  it("engraves at the printable width in CSS pixels (96 px to the inch)", () => {
    // A4 inside 12 mm margins: 186 mm = 186 / 25.4 × 96 ≈ 702.99 px.
    expect(contentSizeMm(PAPERS.a4)).toEqual({ width: 186, height: 273 });
    expect(contentWidthPx(PAPERS.a4)).toBe(702);
    // Letter inside half-inch margins: 7.5 in × 96 = 720 px.
    expect(contentWidthPx(PAPERS.letter)).toBe(720);
  });
});

describe("stand copy options", () => {
  it("defaults to A4, with comments and without suggestions", () => {
    expect(parseStandCopyOptions({})).toEqual({ paper: "a4", comments: true, suggestions: false });
  });

  it("reads the query and ignores values it does not know", () => {
    expect(parseStandCopyOptions({ paper: "letter", comments: "0", suggestions: "1" })).toEqual({ paper: "letter", comments: false, suggestions: true });
    expect(parseStandCopyOptions({ paper: "a3", comments: "maybe", suggestions: ["1", "0"] })).toEqual({ paper: "a4", comments: true, suggestions: true });
  });

  it("builds the link back from the options", () => {
    const href = standCopyHref("p1", { paper: "letter", comments: false, suggestions: true });
    expect(href).toBe("/parts/p1/print?paper=letter&comments=0&suggestions=1");
    const params = Object.fromEntries(new URL(href, "http://x").searchParams);
    expect(parseStandCopyOptions(params)).toEqual({ paper: "letter", comments: false, suggestions: true });
  });
});
