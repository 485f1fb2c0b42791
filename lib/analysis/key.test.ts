import { Key as TonalKey } from "tonal";
import { describe, expect, it } from "vitest";
import { degreeOf, diatonicLof, inflectionOf, leadingToneLof, scaleOf } from "./degree";
import { type Key, inferMode, keyFromSignature, keyName } from "./key";
import { buildTimeline, extractMelody } from "./melody";
import { asciiName, lofOfName } from "./spelling";
import { buildPart, buildScore } from "./test-part";

describe("keys from the signature, every signature from 7 flats to 7 sharps", () => {
  for (let fifths = -7; fifths <= 7; fifths++) {
    it(`fifths ${fifths}: major tonic, scale, leading tone and degrees match tonal's Key.majorKey`, () => {
      const key = keyFromSignature(fifths, "major") as Key;
      const ref = TonalKey.majorKey(asciiName(fifths)); // source: tonal 6.5.1 Key.majorKey
      expect(asciiName(key.tonicLof)).toBe(ref.tonic);
      expect(scaleOf(key)).toEqual(ref.scale); // tonal writes double sharps as "##", as we do
      // The leading tone of a major key is its seventh degree (tonal: scale[6]).
      expect(asciiName(leadingToneLof(key))).toBe(ref.scale[6]);
      ref.scale.forEach((name, i) => {
        expect(degreeOf(lofOfName(name), key)).toBe(i + 1);
        expect(inflectionOf(lofOfName(name), key)).toBe(0);
      });
      // The relative minor shares the signature: tonal's majorKey(...).minorRelative.
      expect(asciiName((keyFromSignature(fifths, "minor") as Key).tonicLof)).toBe(ref.minorRelative);
    });

    it(`fifths ${fifths}: minor tonic, natural scale, raised seventh and degrees match tonal's Key.minorKey`, () => {
      const key = keyFromSignature(fifths, "minor") as Key;
      const ref = TonalKey.minorKey(asciiName(key.tonicLof)); // source: tonal 6.5.1 Key.minorKey
      expect(ref.alteration).toBe(fifths);
      expect(scaleOf(key)).toEqual(ref.natural.scale);
      // In minor the leading tone is the raised seventh: the 7th of tonal's harmonic minor.
      expect(asciiName(leadingToneLof(key))).toBe(ref.harmonic.scale[6]);
      // …and the natural seventh (the subtonic) is a different note, a whole step below the tonic.
      expect(asciiName(diatonicLof(7, key))).toBe(ref.natural.scale[6]);
      expect(asciiName(leadingToneLof(key))).not.toBe(ref.natural.scale[6]);
      ref.natural.scale.forEach((name, i) => expect(degreeOf(lofOfName(name), key)).toBe(i + 1));
      ref.harmonic.scale.forEach((name, i) => expect(degreeOf(lofOfName(name), key)).toBe(i + 1));
      ref.melodic.scale.forEach((name, i) => expect(degreeOf(lofOfName(name), key)).toBe(i + 1));
      expect(inflectionOf(lofOfName(ref.harmonic.scale[6]), key)).toBe(1);
    });
  }
});

describe("modes on the line of fifths", () => {
  it("places each church mode's tonic like music21's modeSharpsAlter (check values §3)", () => {
    // source: check-values §3 table (fifths 0, 2, −3), matching music21 key.modeSharpsAlter.
    const rows: Array<[number, string[]]> = [
      [0, ["C", "A", "D", "E", "F", "G", "B"]],
      [2, ["D", "B", "E", "F#", "G", "A", "C#"]],
      [-3, ["Eb", "C", "F", "G", "Ab", "Bb", "D"]],
    ];
    const modes = ["major", "minor", "dorian", "phrygian", "lydian", "mixolydian", "locrian"];
    for (const [fifths, tonics] of rows) {
      modes.forEach((mode, i) => expect(asciiName((keyFromSignature(fifths, mode) as Key).tonicLof)).toBe(tonics[i]));
    }
  });

  it("treats dorian, phrygian and locrian as minor, lydian and mixolydian as major (our mapping)", () => {
    expect(keyFromSignature(2, "dorian")?.mode).toBe("minor");
    expect(keyFromSignature(0, "phrygian")?.mode).toBe("minor");
    expect(keyFromSignature(0, "locrian")?.mode).toBe("minor");
    expect(keyFromSignature(0, "lydian")?.mode).toBe("major");
    expect(keyFromSignature(0, "mixolydian")?.mode).toBe("major");
  });

  it("gives no key for a missing or 'none' mode, so the melody decides", () => {
    // source: MusicXML 4.0 <mode> reference — "none" is a legal value; the element is optional.
    expect(keyFromSignature(0, null)).toBeNull();
    expect(keyFromSignature(0, "none")).toBeNull();
  });

  it("accepts signatures beyond seven accidentals (MusicXML fifths is xs:integer)", () => {
    // source: MusicXML 4.0 <fifths> reference, type xs:integer.
    expect(keyName(keyFromSignature(11, "major") as Key)).toBe("E# major");
    expect(keyName(keyFromSignature(-8, "major") as Key)).toBe("Fb major");
  });

  it("(−2, major) is B♭ with leading tone A; (−2, minor) is G with raised seventh F♯ and subtonic F", () => {
    // source: check-values §9 item 4 and §2.3 table.
    const bb = keyFromSignature(-2, "major") as Key;
    expect(asciiName(bb.tonicLof)).toBe("Bb");
    expect(asciiName(leadingToneLof(bb))).toBe("A");
    const g = keyFromSignature(-2, "minor") as Key;
    expect(asciiName(g.tonicLof)).toBe("G");
    expect(asciiName(leadingToneLof(g))).toBe("F#");
    expect(asciiName(diatonicLof(7, g))).toBe("F");
  });
});

describe("degrees by spelling", () => {
  it("answers Hutchinson's 'specify the key from the scale degree name' exercise", () => {
    // source: Hutchinson, Music Theory for the 21st-Century Classroom, §3.3 exercise
    // (src/MinorScalesAndKeySignatures.xml), via check-values §2.2.
    const cases: Array<[string, string, number, string]> = [
      // [key tonic, mode, degree, note]
      ["F", "minor", 3, "Ab"], // A♭ is the mediant of f minor
      ["Eb", "minor", 7, "Db"], // D♭ is the subtonic of e♭ minor
      ["E", "major", 5, "B"], // B is the dominant of E major
      ["Eb", "major", 6, "C"], // C is the submediant of E♭ major
      ["A#", "minor", 4, "D#"], // D♯ is the subdominant of a♯ minor
      ["Cb", "major", 7, "Bb"], // B♭ is the leading tone of C♭ major
      ["D#", "minor", 2, "E#"], // E♯ is the supertonic of d♯ minor
    ];
    for (const [tonic, mode, degree, note] of cases) {
      const key: Key = { tonicLof: lofOfName(tonic), mode: mode as Key["mode"] };
      expect(degreeOf(lofOfName(note), key)).toBe(degree);
      expect(inflectionOf(lofOfName(note), key)).toBe(0);
    }
    expect(lofOfName("Bb")).toBe(leadingToneLof({ tonicLof: lofOfName("Cb"), mode: "major" }));
  });

  it("keeps A♯ and B♭ apart: raised sixth versus lowered seventh in C major", () => {
    // source: check-values §2.3 note — "A♯ and B♭ are different degrees (♯6̂ vs ♭7̂ in C)".
    const c: Key = { tonicLof: 0, mode: "major" };
    expect([degreeOf(lofOfName("A#"), c), inflectionOf(lofOfName("A#"), c)]).toEqual([6, 1]);
    expect([degreeOf(lofOfName("Bb"), c), inflectionOf(lofOfName("Bb"), c)]).toEqual([7, -1]);
  });
});

describe("mode inference when the signature gives no mode", () => {
  const infer = (text: string, fifths: number) => {
    const part = buildPart(text, { fifths, mode: null });
    return keyName(inferMode(fifths, extractMelody(part, buildTimeline(buildScore(part), part))).key);
  };

  it("hears a C major scale as C major", () => {
    // source: check-values §1.3 — K–K and Temperley both pick C major for the C major scale.
    expect(infer("C4:q D4:q E4:q F4:q | G4:q A4:q B4:q C5:q |]", 0)).toBe("C major");
  });

  it("hears an A harmonic minor scale as A minor", () => {
    // source: check-values §1.3 — A harmonic minor: K–K, Temperley and Aarden all pick A minor.
    expect(infer("A3:q B3:q C4:q D4:q | E4:q F4:q G#4:q A4:q |]", 0)).toBe("A minor");
  });

  it("takes a tune that circles and ends on G (one sharp) as E minor when D♯ leads to E", () => {
    // common practice: the raised seventh (D♯) and the closing tonic mark E minor.
    expect(infer("E4:q G4:q B4:q A4:q | G4:q F#4:q D#4:q E4:q | B4:q A4:q G4:q F#4:q | D#4:h E4:h |]", 1)).toBe("E minor");
  });

  it("takes the same signature as G major when the melody outlines and ends on G", () => {
    // common practice: tonic triad outline and final tonic.
    expect(infer("G4:q B4:q D5:q B4:q | C5:q A4:q F#4:q A4:q | G4:q B4:q A4:q F#4:q | G4:w |]", 1)).toBe("G major");
  });
});
