import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { chordAt, interpretFigure, keyOfBar, parseKeyToken, parseRomanText } from "./romantext";
import { lofOfName } from "./spelling";

const key = (name: string, mode: "major" | "minor") => ({ tonicLof: lofOfName(name), mode });

describe("RomanText keys", () => {
  it("reads major keys in capitals and minor keys in small letters, with sharps and flats", () => {
    // source: the RomanText format (Tymoczko, Gotham, Cuthbert & Ariza 2019): "G:" G major, "g:" G minor; "-" or "b" for flat.
    expect(parseKeyToken("G:")).toEqual(key("G", "major"));
    expect(parseKeyToken("f#:")).toEqual(key("F#", "minor"));
    expect(parseKeyToken("bb:")).toEqual(key("Bb", "minor"));
    expect(parseKeyToken("b:")).toEqual(key("B", "minor"));
    expect(parseKeyToken("B-:")).toEqual(key("Bb", "major"));
    expect(parseKeyToken("Eb:")).toEqual(key("Eb", "major"));
    expect(parseKeyToken("V7")).toBeNull();
  });

  it("keeps the key per bar and beat, changes it mid-line, and carries it to later bars", () => {
    const rt = parseRomanText("Time Signature: 4/4\n\nm1 C: I b2 V65 b3 I b4 G: V7\nm2 I\nm3 b3 e: V\nm4 i");
    expect(rt.chords.map((c) => [c.measure, c.beat, c.figure])).toEqual([
      [1, 1, "I"], [1, 2, "V65"], [1, 3, "I"], [1, 4, "V7"], [2, 1, "I"], [3, 3, "V"], [4, 1, "i"],
    ]);
    expect(chordAt(rt, 1, 4)?.key).toEqual(key("G", "major"));
    expect(chordAt(rt, 3, 2)?.key).toEqual(key("G", "major"));
    expect(chordAt(rt, 3, 3.5)?.key).toEqual(key("E", "minor"));
    // Bar 1 is three beats of C and one of G: C. Bar 3 is half G, half e: the downbeat's key wins the tie.
    expect(keyOfBar(rt, 1)).toEqual(key("C", "major"));
    expect(keyOfBar(rt, 2)).toEqual(key("G", "major"));
    expect(keyOfBar(rt, 3)).toEqual(key("G", "major"));
    expect(keyOfBar(rt, 4)).toEqual(key("E", "minor"));
  });

  it("copies repeated bars (m9-12 = m5-8) and skips variants, repeat signs and notes", () => {
    const rt = parseRomanText("m1 D: I\nm2 V\nm3 I ||\nm4 b3 A: V\nm4var1 IV\nNote: a remark\nm5-7 = m2-4\nm8 I");
    expect(rt.chords.filter((c) => c.measure >= 5 && c.measure <= 7).map((c) => [c.measure, c.beat, c.figure])).toEqual([
      [5, 1, "V"], [6, 1, "I"], [7, 3, "V"],
    ]);
    expect(rt.chords.some((c) => c.figure === "IV")).toBe(false);
    expect(rt.meta.note).toBe("a remark");
    expect(keyOfBar(rt, 8)).toEqual(key("A", "major"));
  });

  it("counts beats of compound metre in dotted beats", () => {
    const rt = parseRomanText("Time Signature: 6/8\nm1 F: I b2 C: V\nm2 I");
    expect(rt.timeSignatures).toEqual([{ fromMeasure: 1, beats: 6, beatType: 8 }]);
    // common practice: 6/8 has two beats; b2 is halfway, so the tie goes to the downbeat's key.
    expect(keyOfBar(rt, 1)).toEqual(key("F", "major"));
  });
});

describe("RomanText chords and their leading tones", () => {
  // source: Open Music Theory v1, "Applied chords": "the chromatically raised tone tends to be the leading-tone of the tonicized key";
  // Hutchinson, "Secondary dominant chords": the raised notes lead to the root of the chord being tonicized.
  const C = key("C", "major");
  const c = key("C", "minor");
  const lt = (figure: string, k = C) => interpretFigure(figure, k).leadingToneLof;

  it("gives the third of V and the root of vii° as the leading tone of the key", () => {
    expect(lt("V")).toBe(lofOfName("B"));
    expect(lt("V7")).toBe(lofOfName("B"));
    expect(lt("viio7")).toBe(lofOfName("B"));
    expect(lt("viiø65")).toBe(lofOfName("B"));
    // In minor the leading tone is the raised seventh (Hutchinson §3.3).
    expect(lt("V", c)).toBe(lofOfName("B"));
    expect(lt("viio43", c)).toBe(lofOfName("B"));
  });

  it("gives the leading tone of the tonicized degree for applied chords", () => {
    expect(lt("V/V")).toBe(lofOfName("F#"));
    expect(lt("V7/IV")).toBe(lofOfName("E"));
    expect(lt("viio7/ii")).toBe(lofOfName("C#"));
    expect(lt("V65/vi")).toBe(lofOfName("G#"));
    expect(interpretFigure("V/V", C).target).toEqual(key("G", "major"));
    expect(interpretFigure("viio7/ii", C).target).toEqual(key("D", "minor"));
    // V7/V/V in C: V/V is D, and its dominant A7 has the third C♯.
    expect(lt("V7/V/V")).toBe(lofOfName("C#"));
    // In C minor, VI is A♭ (natural minor): V/VI is E♭ major, whose third is G.
    expect(lt("V/VI", c)).toBe(lofOfName("G"));
    expect(interpretFigure("V/v", c).target).toEqual(key("G", "minor"));
    expect(lt("viio65/v", c)).toBe(lofOfName("F#"));
  });

  it("gives no leading tone for other chords", () => {
    for (const f of ["I", "IV", "ii65", "Cad64", "It6", "Ger65", "Fr43", "N6", "bVI", "VII", "iii", "vi/V"]) expect(lt(f)).toBeNull();
    expect(lt("VII", c)).toBeNull();
  });
});

describe("RomanText from the When-in-Rome corpus", () => {
  it("reads Bach's Prelude in C minor (WTC I no. 2): its keys, tonicizations and bar 28's beats", () => {
    // source: tests/fixtures/harmony/bach-wtc1-prelude-02.rntxt (When-in-Rome, Mark Gotham et al., CC BY-SA 4.0).
    const text = readFileSync(path.resolve(import.meta.dirname, "../../tests/fixtures/harmony/bach-wtc1-prelude-02.rntxt"), "utf8");
    const rt = parseRomanText(text);
    expect(rt.meta.composer).toBe("J.S. Bach");
    expect(rt.timeSignatures).toEqual([{ fromMeasure: 1, beats: 4, beatType: 4 }]);
    expect(keyOfBar(rt, 1)).toEqual(key("C", "minor"));
    expect(keyOfBar(rt, 12)).toEqual(key("Eb", "major"));
    expect(keyOfBar(rt, 16)).toEqual(key("C", "minor"));
    expect(rt.chords.filter((ch) => ch.measure === 28).map((ch) => [ch.beat, ch.figure])).toEqual([[1, "v5"], [2, "viø42"], [4, "V"]]);
    // m6 V42/v: the dominant of G minor, whose third is F♯.
    expect(chordAt(rt, 6, 1)?.leadingToneLof).toBe(lofOfName("F#"));
    // m15 V42/V in E♭: the dominant of B♭, third A.
    expect(chordAt(rt, 15, 1)?.leadingToneLof).toBe(lofOfName("A"));
    expect(rt.chords.at(-1)?.measure).toBe(38);
  });
});
