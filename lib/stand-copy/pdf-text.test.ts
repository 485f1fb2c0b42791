import { describe, expect, it } from "vitest";
import { winAnsi } from "./pdf-text";

describe("winAnsi", () => {
  it("keeps what Windows-1252 can encode", () => {
    // Windows-1252 (WHATWG Encoding Standard index): ¢ 0xA2, · 0xB7, – 0x96, “ 0x93, é 0xE9.
    expect(winAnsi("20 ¢ · 5.5 Hz – “légato”")).toBe("20 ¢ · 5.5 Hz – “légato”");
  });

  it("spells music signs and replaces the rest", () => {
    expect(winAnsi("F♯5 B♭4 ♩ = 72")).toBe("F#5 Bb4 quarter = 72");
    expect(winAnsi("good 🎵\nnext")).toBe("good ? next");
  });

  it("keeps only characters of the Windows-1252 code page", () => {
    // Reference: Python's cp1252 codec, which follows the WHATWG/Unicode mapping table
    // (https://encoding.spec.whatwg.org/index-windows-1252.txt); its 0x80–0x9F row, as printed by
    // bytes(range(0x80, 0xa0)).decode("cp1252", "ignore"). Latin-1 (0xA0–0xFF) is the same
    // code point as the byte.
    const high = "€‚ƒ„…†‡ˆ‰Š‹ŒŽ‘’“”•–—˜™š›œžŸ";
    const table = new Set([...Array.from({ length: 0x5f }, (_, i) => String.fromCharCode(0x20 + i)), ...high, ...Array.from({ length: 0x60 }, (_, i) => String.fromCharCode(0xa0 + i))]);
    const sample = Array.from({ length: 0x2200 }, (_, i) => String.fromCodePoint(i + 0x20)).join("");
    const kept = winAnsi(sample);
    for (const ch of kept) expect(table.has(ch), `U+${ch.codePointAt(0)!.toString(16)}`).toBe(true);
    for (const ch of high) expect(kept).toContain(ch);
  });
});
