import { describe, expect, it } from "vitest";
import { Interval, Note } from "tonal";
import { intervalWords, partNameOf, soundingSentence, transposeTonic, transpositionOf } from "./transposition";

const part = (transpose: string) =>
  `<score-partwise><part-list><score-part id="P1"><part-name>Alto Flute in G</part-name></score-part></part-list><part id="P1"><measure number="1"><attributes>${transpose}</attributes></measure></part></score-partwise>`;

describe("transposing parts", () => {
  it("reads <transpose> (MusicXML 4.0: diatonic, chromatic, octave-change)", () => {
    expect(transpositionOf(part("<transpose><diatonic>-3</diatonic><chromatic>-5</chromatic></transpose>"))).toEqual({ diatonic: -3, chromatic: -5 });
    // B♭ clarinet: a major second down; bass clarinet adds an octave.
    expect(transpositionOf(part("<transpose><diatonic>-1</diatonic><chromatic>-2</chromatic><octave-change>-1</octave-change></transpose>"))).toEqual({ diatonic: -8, chromatic: -14 });
    expect(transpositionOf(part(""))).toBeNull();
    expect(partNameOf(part(""))).toBe("Alto Flute in G");
  });

  it("names intervals and moves keys as the tonal library does", () => {
    let compared = 0;
    const cases: [number, number][] = [[-3, -5], [-1, -2], [-5, -9], [-8, -14], [1, 2], [-7, -12], [4, 7]];
    for (const [diatonic, chromatic] of cases) {
      const t = { diatonic, chromatic };
      for (const tonic of ["C", "D", "F#", "Bb", "Eb", "A"]) {
        // tonal's Interval.fromSemitones spells the usual interval; Note.transpose is the reference.
        const ivl = Interval.fromSemitones(chromatic);
        const expected = Note.pitchClass(Note.transpose(`${tonic}4`, ivl));
        if (Interval.get(ivl).num !== (diatonic < 0 ? -(Math.abs(diatonic) + 1) : diatonic + 1)) continue;
        expect(transposeTonic(tonic, t), `${tonic} by ${ivl}`).toBe(expected);
        compared++;
      }
    }
    expect(compared).toBeGreaterThanOrEqual(36);
    expect(intervalWords({ diatonic: -3, chromatic: -5 })).toBe("a fourth lower");
    expect(intervalWords({ diatonic: -1, chromatic: -2 })).toBe("a major second lower");
    expect(intervalWords({ diatonic: -5, chromatic: -9 })).toBe("a major sixth lower");
    expect(intervalWords({ diatonic: -8, chromatic: -14 })).toBe("an octave and a major second lower");
    expect(intervalWords({ diatonic: -7, chromatic: -12 })).toBe("an octave lower");
  });

  it("says the sounding key", () => {
    expect(soundingSentence("Alto flute in G", { diatonic: -3, chromatic: -5 }, { tonic: "D", mode: "major" })).toBe(
      "Alto flute in G: sounds a fourth lower — written in D major, sounds in A major.",
    );
    expect(soundingSentence("Clarinet in B♭", { diatonic: -1, chromatic: -2 }, { tonic: "F#", mode: "minor" })).toBe(
      "Clarinet in B♭: sounds a major second lower — written in F♯ minor, sounds in E minor.",
    );
  });
});
