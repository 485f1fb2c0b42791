import { Midi } from "@tonejs/midi";
import { beforeAll, describe, expect, it } from "vitest";
import type { PartAnalysis } from "@/lib/analysis/types";
import { extractMarkings } from "@/lib/export/musicxml-markings";
import { readBendToCents } from "@/lib/export/pitch-bend";
import { DEFAULT_MARKING, type MarkingDto, type MarkingValues } from "@/lib/markings/schema";
import { validateMusicXml } from "../helpers/musicxml-xsd";
import { multipartFile, uploadSample } from "../helpers/parts";
import { createSignedInUser, type ApiClient } from "../helpers/session";

/** Exports through the real routes: MusicXML that validates and comes back in, MIDI with the vibrato. */

const json = (method: string, body: unknown): RequestInit => ({ method, headers: { "content-type": "application/json" }, body: JSON.stringify(body) });

describe("exports of a marked part", () => {
  let client: ApiClient;
  let partId: string;
  let analysis: PartAnalysis;
  const marked = new Map<string, MarkingValues>();
  /** Notes whose vibrato the MIDI test measures: steady and immediate, on the longest notes. */
  const measured: string[] = [];

  beforeAll(async () => {
    ({ client } = await createSignedInUser());
    partId = (await uploadSample(client, "slow-river.musicxml")).id;
    analysis = await (await client.fetch(`/api/parts/${partId}/analysis`)).json();
    const byLength = [...analysis.notes].sort((a, b) => {
      const len = (d: string) => Number(d.split("/")[0]) / Number(d.split("/")[1]);
      return len(b.duration) - len(a.duration);
    });
    const plan: MarkingValues[] = [
      { ...DEFAULT_MARKING, depthCents: 20, speedHz: 5.5, role: "phrase-start" },
      { ...DEFAULT_MARKING, depthCents: 35, speedHz: 6.5, role: "peak", comment: "Lean in & sing <it>, “softly” 🎶\nthen let go" },
      { ...DEFAULT_MARKING, depthCents: 12.5, speedHz: 4.75 },
      { ...DEFAULT_MARKING, depthCents: 30, speedHz: 6, placement: "top-on-pitch", onset: "delayed", shape: "growing", role: "tension" },
      { ...DEFAULT_MARKING, depthCents: 0, speedHz: 5, role: "resolution" },
    ];
    for (let i = 0; i < plan.length; i++) {
      const key = byLength[i].key;
      const res = await client.fetch(`/api/parts/${partId}/markings/${encodeURIComponent(key)}`, json("PUT", plan[i]));
      expect(res.status).toBe(201);
      marked.set(key, plan[i]);
      if (i < 3) measured.push(key);
    }
  });

  it("exports MusicXML that validates against the MusicXML 4.0 schema and carries every marking", async () => {
    const res = await client.fetch(`/api/parts/${partId}/export?format=musicxml`);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toContain("musicxml");
    expect(res.headers.get("content-disposition")).toMatch(/attachment; filename=".+-marked\.musicxml"/);
    const xml = await res.text();
    // Reference: the MusicXML 4.0 XSD (W3C Music Notation Community Group), through libxml2.
    const { valid, errors } = await validateMusicXml(xml);
    expect(errors).toEqual([]);
    expect(valid).toBe(true);
    expect(new Map(extractMarkings(xml))).toEqual(marked);
    // Visible to any notation program: a words direction and a wavy line per marked note.
    expect(xml.match(/<wavy-line type="start"/g)?.length).toBe(marked.size);
  });

  it("recovers every marking when the export is uploaded again", async () => {
    const xml = await (await client.fetch(`/api/parts/${partId}/export?format=musicxml`)).text();
    const res = await client.fetch("/api/parts", { method: "POST", body: multipartFile("slow-river-marked.musicxml", new TextEncoder().encode(xml)) });
    expect(res.status).toBe(201);
    const created = await res.json();
    expect(created.importedMarkings).toBe(marked.size);
    expect(created.unreadableMarkings).toEqual([]);
    const back = (await (await client.fetch(`/api/parts/${created.id}/markings`)).json()).markings as MarkingDto[];
    const values = new Map(back.map(({ noteKey, version: _v, authorId: _a, updatedAt: _u, ...v }) => [noteKey, v]));
    expect(values).toEqual(marked);
    // The library's markings column counts them.
    const listed = (await (await client.fetch("/api/parts?sort=-updated")).json()).items.find((p: { id: string }) => p.id === created.id);
    expect(listed.markingCount).toBe(marked.size);
    // The engraving no longer prints the old labels: the markings live in the database now.
    const stored = await (await client.fetch(`/api/parts/${created.id}/musicxml`)).text();
    expect(stored).not.toContain("ondula-marking");
    // One step in the history: a single undo takes the whole import back.
    const undo = await client.fetch(`/api/parts/${created.id}/history/undo`, { method: "POST" });
    expect(undo.status).toBe(200);
    expect((await (await client.fetch(`/api/parts/${created.id}/markings`)).json()).markings).toEqual([]);
  });

  it("names unreadable marking records instead of guessing", async () => {
    const xml = await (await client.fetch(`/api/parts/${partId}/export?format=musicxml`)).text();
    const broken = xml.replace(/depthCents=20;/, "depthCents=999;");
    const created = await (await client.fetch("/api/parts", { method: "POST", body: multipartFile("broken.musicxml", new TextEncoder().encode(broken)) })).json();
    expect(created.importedMarkings).toBe(marked.size - 1);
    expect(created.unreadableMarkings).toHaveLength(1);
  });

  it("exports MIDI whose pitch bend swings at each marking's speed and depth within 2 %", async () => {
    const res = await client.fetch(`/api/parts/${partId}/export?format=midi`);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("audio/midi");
    // Reference parser: @tonejs/midi.
    const midi = new Midi(new Uint8Array(await res.arrayBuffer()));
    const track = midi.tracks.find((t) => t.notes.length > 0)!;
    // The bend range, set through RPN 0 (MIDI 1.0: CC101/CC100 = 0, then data entry CC6).
    const range = track.controlChanges[6]?.[0];
    expect(range).toBeDefined();
    const semitones = Math.round(range!.value * 127);
    expect(semitones).toBeGreaterThan(0);

    expect(track.notes.map((n) => n.midi)).toEqual(analysis.notes.map((n) => n.midi));
    for (const key of measured) {
      const index = analysis.notes.findIndex((n) => n.key === key);
      const note = track.notes[index];
      const points = track.pitchBends
        .filter((b) => b.time >= note.time - 1e-9 && b.time < note.time + note.duration - 1e-6)
        .map((b) => ({ time: b.time, cents: readBendToCents(b.value, semitones) }));
      const peaks: number[] = [];
      const swings: number[] = [];
      let last: number | null = null;
      for (let i = 1; i < points.length - 1; i++) {
        const [a, b, c] = [points[i - 1].cents, points[i].cents, points[i + 1].cents];
        const isPeak = b > a && b >= c;
        const isTrough = b < a && b <= c;
        if (isPeak) peaks.push(points[i].time);
        if (isPeak || isTrough) {
          if (last !== null) swings.push(Math.abs(b - last) / 2);
          last = b;
        }
      }
      const want = marked.get(key)!;
      expect(peaks.length, `peaks on ${key}`).toBeGreaterThan(2);
      const speed = (peaks.length - 1) / (peaks[peaks.length - 1] - peaks[0]);
      expect(Math.abs(speed - want.speedHz) / want.speedHz, `speed on ${key}`).toBeLessThan(0.02);
      for (const depth of swings) expect(Math.abs(depth - want.depthCents) / want.depthCents, `depth on ${key}`).toBeLessThan(0.02);
    }
    // The deliberately plain note bends not at all.
    const plainKey = [...marked].find(([, v]) => v.depthCents === 0)![0];
    const plain = track.notes[analysis.notes.findIndex((n) => n.key === plainKey)];
    const inside = track.pitchBends.filter((b) => b.time > plain.time + 1e-6 && b.time < plain.time + plain.duration - 1e-6);
    expect(inside.every((b) => b.value === 0)).toBe(true);
  });

  it("refuses an unknown format with a clear message", async () => {
    const res = await client.fetch(`/api/parts/${partId}/export?format=xyz`);
    expect(res.status).toBe(400);
    const body = await res.json();
    expect(body.code).toBe("bad_request:validation");
    expect(body.message).toContain("format=musicxml");
  });
});
