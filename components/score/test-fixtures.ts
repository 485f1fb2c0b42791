import type { NoteBox } from "@/lib/markings/glyph-geometry";
import { DEFAULT_MARKING, type MarkingDto } from "@/lib/markings/schema";

/** Two systems of notes as the engraving would report them (staff tops at 100 and 260). */
export const fakeBoxes: NoteBox[] = [
  { key: "P1:m0:s1:v1:0/1:72", x: 60, y: 110, width: 10, height: 30, staffTop: 100, measureIndex: 0 },
  { key: "P1:m0:s1:v1:1/4:74", x: 100, y: 105, width: 10, height: 30, staffTop: 100, measureIndex: 0 },
  { key: "P1:m1:s1:v1:0/1:76", x: 160, y: 80, width: 10, height: 30, staffTop: 100, measureIndex: 1 },
  { key: "P1:m2:s1:v1:0/1:71", x: 60, y: 272, width: 10, height: 30, staffTop: 260, measureIndex: 2 },
  { key: "P1:m2:s1:v1:1/2:72", x: 120, y: 270, width: 10, height: 30, staffTop: 260, measureIndex: 2 },
];

export const K = fakeBoxes.map((b) => b.key);

export function marking(noteKey: string, over: Partial<MarkingDto> = {}): MarkingDto {
  return { ...DEFAULT_MARKING, noteKey, version: 1, authorId: "user-1", updatedAt: "2026-01-01T00:00:00.000Z", ...over };
}
