import { describe, expect, it } from "vitest";
import { pageOfSystem, paginateSystems, standZoom } from "./pages";
import { filesToKeep, isStandPath } from "./offline";

describe("paginateSystems", () => {
  it("fills each page with whole systems, in order", () => {
    // 3 systems of 300 with gaps of 20 fit in 1000 (300+20+300+20+300 = 940); the fourth starts page 2.
    expect(paginateSystems([300, 300, 300, 300, 300], 1000, 20)).toEqual([
      { first: 0, end: 3 },
      { first: 3, end: 5 },
    ]);
  });
  it("gives a system taller than the screen a page of its own", () => {
    expect(paginateSystems([200, 1500, 200], 1000, 10)).toEqual([
      { first: 0, end: 1 },
      { first: 1, end: 2 },
      { first: 2, end: 3 },
    ]);
  });
  it("has no page for no music", () => {
    expect(paginateSystems([], 1000, 10)).toEqual([]);
  });
  it("finds the page holding a system, or the last", () => {
    const pages = paginateSystems([300, 300, 300, 300, 300], 1000, 20);
    expect(pageOfSystem(pages, 0)).toBe(0);
    expect(pageOfSystem(pages, 4)).toBe(1);
    expect(pageOfSystem(pages, 9)).toBe(1);
  });
});

describe("standZoom", () => {
  it("keeps a tablet's staff near the engraver's own size and clamps the extremes", () => {
    // 820 / 800 ≈ 1.02: about the engraver's own staff size on a tablet held upright.
    expect(standZoom(820, 1180)).toBe(1.02);
    expect(standZoom(1180, 820)).toBe(1.3);
    expect(standZoom(360, 640)).toBe(0.75);
  });
});

describe("offline", () => {
  it("knows the stand pages", () => {
    expect(isStandPath("/parts/abc/stand")).toBe(true);
    expect(isStandPath("/parts/abc")).toBe(false);
    expect(isStandPath("/parts/abc/stand/x")).toBe(false);
  });
  it("keeps only this origin's build files", () => {
    const origin = "http://127.0.0.1:3000";
    expect(
      filesToKeep(
        [`${origin}/_next/static/chunks/a.js`, `${origin}/_next/static/chunks/a.js`, `${origin}/api/me`, "https://elsewhere.test/_next/static/x.js", "::bad"],
        origin,
      ),
    ).toEqual([`${origin}/_next/static/chunks/a.js`]);
  });
});
