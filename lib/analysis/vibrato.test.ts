import { describe, expect, it } from "vitest";
import {
  beatsPerMinute,
  bendBytes,
  bendToCents,
  centsToBend,
  centsToFrequency,
  frequencyToCents,
  hzToMidi,
  midiToHz,
  pulsesPerBeat,
  speedHz,
} from "./vibrato";

describe("speed ↔ pulses per beat", () => {
  it("6 Hz at ♩ = 90 is 4 pulses per beat; 4 pulses at ♩ = 96 is 6.4 Hz", () => {
    // source: Garrison 2012 table (6 Hz → sixteenths at ♩ = 90) and a flute teacher's guide
    // (four pulses at 92–96 → 6.13–6.40 Hz), check-values §5 and §9 item 9.
    expect(pulsesPerBeat(6, 90)).toBeCloseTo(4, 10);
    expect(speedHz(4, 96)).toBeCloseTo(6.4, 10);
    expect(speedHz(4, 92)).toBeCloseTo(6.1333, 4);
    expect(pulsesPerBeat(6, 120)).toBeCloseTo(3, 10); // Garrison: 6 Hz → triplets at ♩ = 120
    expect(pulsesPerBeat(5, 100)).toBeCloseTo(3, 10); // check-values §5 [computed]
  });

  it("counts the tempo in the metronome's beat unit", () => {
    // source: MusicXML 4.0 <sound> tempo is quarter notes per minute (check-values §3).
    expect(beatsPerMinute(90, "dotted-quarter")).toBe(60);
    expect(pulsesPerBeat(6, beatsPerMinute(90, "dotted-quarter"))).toBeCloseTo(6, 10);
    expect(() => pulsesPerBeat(6, 0)).toThrow();
  });
});

describe("equal temperament, A4 = 440 Hz", () => {
  it("C4 = 261.6256 Hz and other reference frequencies", () => {
    // source: ISO 16:1975 (A4 = 440 Hz) and f = 440·2^((m−69)/12) from MIDI Toolbox midi2hz.m (check-values §8).
    expect(midiToHz(60)).toBeCloseTo(261.6256, 4);
    expect(midiToHz(59)).toBeCloseTo(246.9417, 4);
    expect(midiToHz(70)).toBeCloseTo(466.1638, 4);
    expect(midiToHz(96)).toBeCloseTo(2093.0045, 4);
    expect(midiToHz(0)).toBeCloseTo(8.1758, 4);
    expect(midiToHz(127)).toBeCloseTo(12543.854, 3);
    expect(hzToMidi(445)).toBeCloseTo(69.1956, 4);
  });

  it("440 → 442 Hz is 7.851 cents; ±50 cents around A4 spans 427.474–452.893 Hz", () => {
    // source: check-values §8 and §5 [computed from c = 1200·log2(f2/f1)].
    expect(frequencyToCents(440, 442)).toBeCloseTo(7.851, 3);
    expect(frequencyToCents(440, 445)).toBeCloseTo(19.562, 3);
    expect(frequencyToCents(440, 466.1638)).toBeCloseTo(100, 3);
    expect(centsToFrequency(440, 50)).toBeCloseTo(452.893, 3);
    expect(centsToFrequency(440, -50)).toBeCloseTo(427.474, 3);
    expect(centsToFrequency(440, -20)).toBeCloseTo(434.946, 3);
  });
});

describe("MIDI pitch bend, 14-bit, centre 8192, ±2 semitones", () => {
  it("maps cents to bend values like the check-values table", () => {
    // source: MIDI 1.0 pitch bend (centre 2000H, 0…16383) and GM default ±2 semitones (check-values §7.1).
    expect(centsToBend(0)).toBe(8192);
    expect(centsToBend(1)).toBe(8233);
    expect(centsToBend(10)).toBe(8602);
    expect(centsToBend(25)).toBe(9216);
    expect(centsToBend(50)).toBe(10240);
    expect(centsToBend(-50)).toBe(6144);
    expect(centsToBend(100)).toBe(12288);
    expect(centsToBend(-100)).toBe(4096);
    expect(centsToBend(-200)).toBe(0);
    expect(centsToBend(200)).toBe(16383); // 16384 clamped
    expect(centsToBend(30) - 8192).toBe(1229); // ±30 c → ±1229 units
  });

  it("gives the LSB/MSB bytes of the table and round-trips values to cents", () => {
    // source: check-values §7.1 (+50 c → 0x00, 0x50; +10 c → 0x1A, 0x43; +1 c → 0x29, 0x40).
    expect(bendBytes(centsToBend(50))).toEqual({ lsb: 0x00, msb: 0x50 });
    expect(bendBytes(centsToBend(10))).toEqual({ lsb: 0x1a, msb: 0x43 });
    expect(bendBytes(centsToBend(1))).toEqual({ lsb: 0x29, msb: 0x40 });
    expect(bendBytes(16383)).toEqual({ lsb: 0x7f, msb: 0x7f });
    expect(bendToCents(16383)).toBeCloseTo(199.976, 3);
    expect(bendToCents(10240)).toBeCloseTo(50, 10);
  });

  it("scales with the stated bend range (±12 semitones: 6.827 units per cent)", () => {
    // source: check-values §7.1 [computed].
    expect(centsToBend(100, 12) - 8192).toBe(Math.round(8192 / 12));
    expect(bendToCents(centsToBend(300, 12), 12)).toBeCloseTo(300, 0);
  });
});
