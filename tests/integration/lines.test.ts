import fs from "node:fs";
import path from "node:path";
import { Midi } from "@tonejs/midi";
import { beforeAll, describe, expect, it } from "vitest";
import type { PartAnalysis } from "@/lib/analysis/types";
import { createSignedInUser, type ApiClient } from "../helpers/session";
import { multipartFile, uploadSample } from "../helpers/parts";
import { REAL_DIR } from "../helpers/real-corpus";

// Our two-flute sample (tests/fixtures/real/ours/two-flutes-voices.musicxml): flute 1 in voice 1
// starts on F♯5, flute 2 in voice 2 a third below on D5 and alone falls G5 → F♯5 in bar 2 (4̂ → 3̂
// in D major, common practice); bars 3–4 are written once (a2).
const FILE = path.join(REAL_DIR, "ours/two-flutes-voices.musicxml");
const json = (body: unknown): RequestInit => ({ method: "PATCH", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });

describe("the player's line on a staff with two players", () => {
  let owner: ApiClient;
  let partId: string;

  beforeAll(async () => {
    owner = (await createSignedInUser({ role: "player" })).client;
    const res = await owner.fetch("/api/parts", { method: "POST", body: multipartFile("two-flutes-voices.musicxml", new Uint8Array(fs.readFileSync(FILE))) });
    expect(res.status).toBe(201);
    partId = (await res.json()).id;
  });

  const analysis = async (query = ""): Promise<PartAnalysis> => {
    const res = await owner.fetch(`/api/parts/${partId}/analysis${query}`);
    expect(res.status).toBe(200);
    return res.json();
  };
  const tensionsInBar2 = (a: PartAnalysis) => a.suggestions.filter((s) => s.role === "tension" && s.measure === "2").map((s) => `${s.pitch} ${s.note}`);

  it("starts on the upper line, and the suggestions change when the player chooses the lower", async () => {
    const part = await (await owner.fetch(`/api/parts/${partId}`)).json();
    expect(part.line).toBe("upper");
    const upper = await analysis();
    expect(upper.lines).toEqual({ writtenAs: "voices", line: "upper" });
    expect(upper.suggestions.find((s) => s.role === "phrase-start")?.pitch).toBe("F#5");
    expect(tensionsInBar2(upper)).toEqual([]);

    const res = await owner.fetch(`/api/parts/${partId}`, json({ line: "lower" }));
    expect(res.status).toBe(200);
    expect((await res.json()).line).toBe("lower");

    const lower = await analysis();
    expect(lower.lines).toEqual({ writtenAs: "voices", line: "lower" });
    expect(lower.suggestions.find((s) => s.role === "phrase-start")?.pitch).toBe("D5");
    expect(tensionsInBar2(lower)).toEqual(["G5 P1:m1:s1:v2:0/1:79"]);
    expect(lower.notes.map((n) => n.pitch).slice(0, 3)).toEqual(["D5", "E5", "F#5"]);
    // Asked for again, the kept analysis answers the same.
    expect(await analysis()).toEqual(lower);
    // Either line on request, whatever the player chose.
    expect((await analysis("?line=upper")).suggestions).toEqual(upper.suggestions);
    expect(await analysis("?line=lower")).toEqual(lower);
  });

  it("gives the practice page the chosen line's notes", async () => {
    await owner.fetch(`/api/parts/${partId}`, json({ line: "lower" }));
    const html = await (await owner.fetch(`/parts/${partId}/practice`)).text();
    // The note chooser lists the line's notes by key: flute 2's D5, not flute 1's F♯5 at the start.
    expect(html).toContain("P1:m0:s1:v2:0/1:74");
    expect(html).not.toContain('value="P1:m0:s1:v1:0/1:78"');
    await owner.fetch(`/api/parts/${partId}`, json({ line: "upper" }));
    const upperHtml = await (await owner.fetch(`/parts/${partId}/practice`)).text();
    expect(upperHtml).toContain('value="P1:m0:s1:v1:0/1:78"');
    expect(upperHtml).not.toContain('value="P1:m0:s1:v2:0/1:74"');
  });

  it("plays the chosen line in the MIDI export, the other player's notes quieter on a second track", async () => {
    await owner.fetch(`/api/parts/${partId}`, json({ line: "lower" }));
    const res = await owner.fetch(`/api/parts/${partId}/export?format=midi`);
    expect(res.status).toBe(200);
    const midi = new Midi(new Uint8Array(await res.arrayBuffer()));
    expect(midi.tracks.map((t) => t.notes.map((n) => n.midi))).toEqual([
      [74, 76, 78, 79, 78, 76, 81, 83, 85, 86, 86],
      [78, 79, 81, 83, 81],
    ]);
  });

  it("refuses a lower line where the staff has one player, and a line that is not upper or lower", async () => {
    const single = await uploadSample(owner, "stone-bridge.musicxml");
    const res = await owner.fetch(`/api/parts/${single.id}`, json({ line: "lower" }));
    expect(res.status).toBe(400);
    const body = await res.json();
    expect(body.code).toBe("bad_request:line");
    expect(body.message).toMatch(/one player/);
    expect((await (await owner.fetch(`/api/parts/${single.id}/analysis`)).json()).lines).toBeUndefined();

    const bad = await owner.fetch(`/api/parts/${partId}`, json({ line: "middle" }));
    expect(bad.status).toBe(400);
    expect((await owner.fetch(`/api/parts/${partId}/analysis?line=middle`)).status).toBe(400);
  });

  it("lets only the owner choose the line", async () => {
    const stranger = (await createSignedInUser({ role: "player" })).client;
    expect((await stranger.fetch(`/api/parts/${partId}`, json({ line: "upper" }))).status).toBe(404);
  });
});
