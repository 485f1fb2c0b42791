import { describe, expect, it } from "vitest";
import { noteKey, parseNoteKey, type NoteKeyParts } from "./note-key";

const base: NoteKeyParts = { partId: "P1", measureIndex: 12, staff: 1, voice: "1", onset: { num: 3, den: 8 }, midi: 70, graceIndex: 0 };

describe("note keys", () => {
  it("writes part, measure index, staff, voice, onset and MIDI number", () => {
    expect(noteKey(base)).toBe("P1:m12:s1:v1:3/8:70");
  });

  it("reduces the onset so equal positions give equal keys however they are held", () => {
    expect(noteKey({ ...base, onset: { num: 6, den: 16 } })).toBe("P1:m12:s1:v1:3/8:70");
    expect(noteKey({ ...base, onset: { num: 0, den: 96 } })).toBe("P1:m12:s1:v1:0/1:70");
  });

  it("marks grace notes with their position before the onset", () => {
    expect(noteKey({ ...base, graceIndex: 1 })).toBe("P1:m12:s1:v1:3/8:70:g1");
    expect(noteKey({ ...base, graceIndex: 2 })).toBe("P1:m12:s1:v1:3/8:70:g2");
  });

  it("round-trips through parseNoteKey, also for part ids holding colons and dots", () => {
    const cases: NoteKeyParts[] = [
      base,
      { ...base, graceIndex: 3 },
      { ...base, partId: "P-flute.1", staff: 2, voice: "2", onset: { num: 0, den: 1 }, midi: 21 },
      { ...base, partId: "score:part:7", voice: "alto", onset: { num: 11, den: 12 }, midi: 108 },
    ];
    for (const c of cases) expect(parseNoteKey(noteKey(c))).toEqual(c);
  });

  it("stays URL-safe once encoded and survives decoding", () => {
    const key = noteKey({ ...base, partId: "P1", graceIndex: 1 });
    expect(decodeURIComponent(encodeURIComponent(key))).toBe(key);
    expect(encodeURIComponent(key)).toMatch(/^[A-Za-z0-9%._~-]+$/);
  });

  it("refuses text that is not a note key", () => {
    for (const bad of ["", "P1", "P1:m1:s1:v1:1/0:60", ":m1:s1:v1:1/4:60", "P1:m1:s1:v1:1/4", "P1:mX:s1:v1:1/4:60"]) {
      expect(parseNoteKey(bad)).toBeNull();
    }
  });
});
