import { describe, expect, it } from "vitest";
import { ownerOf, systemBands } from "./system-slices";

const systems = [
  { staffTop: 100, staffBottom: 140 },
  { staffTop: 260, staffBottom: 300 },
];

describe("system bands", () => {
  it("hold everything drawn for a system, even where it comes close to the next system", () => {
    // A dynamic under the first staff (180–200) and glyphs above the second (170–250) overlap.
    const extents = [
      { top: 180, bottom: 200 },
      { top: 170, bottom: 250, system: 1 },
    ];
    const bands = systemBands(systems, extents, 4, 400);
    expect(bands[0]).toEqual({ top: 96, bottom: 204 });
    expect(bands[1]).toEqual({ top: 166, bottom: 304 });
  });

  it("give an element to the system it names, else to the nearest staff", () => {
    expect(ownerOf(systems, { top: 230, bottom: 240, system: 0 })).toBe(0);
    expect(ownerOf(systems, { top: 230, bottom: 240 })).toBe(1);
    expect(ownerOf(systems, { top: 150, bottom: 160 })).toBe(0);
  });
});
