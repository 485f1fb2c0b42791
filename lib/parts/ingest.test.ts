import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { embedMarkings, extractMarkingsWithReport, stripMarkings } from "@/lib/export/musicxml-markings";
import { readScoreFile } from "@/lib/musicxml";
import type { MarkingValues } from "@/lib/markings/schema";
import { ingestScore } from "./ingest";

const SAMPLE = path.resolve(import.meta.dirname, "../../samples/lantern-waltz.musicxml");

describe("an upload reads its file once", () => {
  it("finds the markings of an Ondula export and stores the text without Ondula's elements, as two more passes would", () => {
    const { score, partwiseXml } = readScoreFile(new Uint8Array(readFileSync(SAMPLE)), "lantern-waltz.musicxml");
    const notes = score.parts[0].notes.filter((n) => n.key);
    const marking: MarkingValues = { depthCents: 20, speedHz: 5.5, placement: "centered", onset: "immediate", shape: "steady", role: "peak", comment: "lean in" };
    const chosen = [notes[0], notes.find((n) => n.isGrace)!, notes.at(-1)!];
    const exported = embedMarkings(partwiseXml, new Map(chosen.map((n) => [n.key, marking])));

    const ingested = ingestScore(new TextEncoder().encode(exported), "lantern-waltz.musicxml", {});
    expect([...ingested.ownMarkings.markings.keys()]).toEqual(chosen.map((n) => n.key));
    expect(ingested.ownMarkings).toEqual(extractMarkingsWithReport(exported));
    expect(ingested.partwiseXml).toBe(stripMarkings(readScoreFile(new TextEncoder().encode(exported), "x.musicxml").partwiseXml));
    expect(ingested.partwiseXml).not.toContain("ondula-");
  });

  it("a file without Ondula markings is stored as read", () => {
    const bytes = new Uint8Array(readFileSync(SAMPLE));
    const ingested = ingestScore(bytes, "lantern-waltz.musicxml", {});
    expect(ingested.ownMarkings).toEqual({ markings: new Map(), problems: [] });
    expect(ingested.partwiseXml).toBe(readScoreFile(bytes, "lantern-waltz.musicxml").partwiseXml);
  });
});
