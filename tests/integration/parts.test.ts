import fs from "node:fs";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { readScoreFile, MusicXmlError } from "@/lib/musicxml";
import { createSignedInUser, type ApiClient } from "../helpers/session";
import { multipartFile, sampleFiles, SAMPLES_DIR, uploadSample } from "../helpers/parts";

const HOSTILE_DIR = path.resolve("tests/fixtures/hostile");

describe("upload and library", () => {
  let owner: ApiClient;
  let other: ApiClient;

  beforeAll(async () => {
    owner = (await createSignedInUser({ role: "player" })).client;
    other = (await createSignedInUser({ role: "player" })).client;
  });

  it("stores every sample through the real route and reads it back", async () => {
    const names = sampleFiles();
    expect(names.length).toBeGreaterThanOrEqual(8);
    expect(names.some((n) => n.endsWith(".mxl"))).toBe(true);
    for (const name of names) {
      const created = await uploadSample(owner, name);
      const { score } = readScoreFile(new Uint8Array(fs.readFileSync(path.join(SAMPLES_DIR, name))), name);
      expect(created.parts.map((p) => p.id)).toEqual(score.parts.map((p) => p.id));

      const part = await (await owner.fetch(`/api/parts/${created.id}`)).json();
      expect(part.permission).toBe("owner");
      expect(part.measureCount).toBe(score.parts.find((p) => p.id === created.chosenPart)!.measures.length);

      const xml = await owner.fetch(`/api/parts/${created.id}/musicxml`);
      expect(xml.status).toBe(200);
      const text = await xml.text();
      expect(text).toContain("<score-partwise");
      expect(text).not.toContain("<!DOCTYPE");

      // The keys the page keys its drawn notes by: the reader's, of the chosen part, every
      // sounding note once (tie chains merged), in the reader's order.
      const chosen = score.parts.find((p) => p.id === created.chosenPart)!;
      const keys = await (await owner.fetch(`/api/parts/${created.id}/note-keys`)).json();
      expect(keys).toEqual({ keys: chosen.notes.filter((n) => !n.isRest).map((n) => n.key) });

      const analysis = await (await owner.fetch(`/api/parts/${created.id}/analysis`)).json();
      expect(analysis.id).toBe(created.chosenPart);
      expect(analysis.notes.length).toBeGreaterThan(0);

      const original = await owner.fetch(`/api/parts/${created.id}/source`);
      expect(new Uint8Array(await original.arrayBuffer())).toEqual(new Uint8Array(fs.readFileSync(path.join(SAMPLES_DIR, name))));
    }
  });

  it("chooses the flute in a flute-and-piano score and lets the player choose the piano", async () => {
    const twoPart = sampleFiles().find((n) => {
      const { score } = readScoreFile(new Uint8Array(fs.readFileSync(path.join(SAMPLES_DIR, n))), n);
      return score.parts.length > 1;
    });
    expect(twoPart, "a sample with two parts").toBeTruthy();
    const created = await uploadSample(owner, twoPart!);
    expect(created.parts.length).toBeGreaterThan(1);
    const other = created.parts.find((p) => p.id !== created.chosenPart)!;
    const res = await owner.fetch(`/api/parts/${created.id}`, {
      method: "PATCH",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ chosenPart: other.id }),
    });
    expect(res.status).toBe(200);
    expect((await res.json()).chosenPartId).toBe(other.id);
    // The page's key list follows the chosen part.
    const keys = (await (await owner.fetch(`/api/parts/${created.id}/note-keys`)).json()).keys as string[];
    expect(keys.length).toBeGreaterThan(0);
    expect(keys.every((k) => k.startsWith(`${other.id}:`))).toBe(true);
    const bad = await owner.fetch(`/api/parts/${created.id}`, {
      method: "PATCH",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ chosenPart: "P99" }),
    });
    expect(bad.status).toBe(400);
    expect((await bad.json()).field).toBe("chosenPart");
  });

  it("keeps one working tempo per part: the part's own until the player sets theirs, refused out of range, only by the owner", async () => {
    const created = await uploadSample(owner, sampleFiles().find((n) => n.endsWith(".musicxml"))!);
    const patch = (client: ApiClient, body: unknown) =>
      client.fetch(`/api/parts/${created.id}`, { method: "PATCH", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
    const before = await (await owner.fetch(`/api/parts/${created.id}`)).json();
    expect(before.workingTempo).toBeNull();
    expect(before.tempo).toBe(before.writtenTempo);

    const set = await patch(owner, { workingTempo: 66 });
    expect(set.status).toBe(200);
    expect(await set.json()).toMatchObject({ tempo: 66, workingTempo: 66, writtenTempo: before.writtenTempo });

    const tooFast = await patch(owner, { workingTempo: 900 });
    expect(tooFast.status).toBe(400);
    expect(JSON.stringify(await tooFast.json())).toMatch(/at most ♩ = 300/);
    expect((await patch(other, { workingTempo: 80 })).status).toBe(404);

    const back = await (await patch(owner, { workingTempo: null })).json();
    expect(back).toMatchObject({ tempo: before.writtenTempo, workingTempo: null });
  });

  it("answers every hostile file with the reader's own 4xx code through the route", async () => {
    const files = fs.existsSync(HOSTILE_DIR) ? fs.readdirSync(HOSTILE_DIR).filter((n) => !n.endsWith(".md")) : [];
    expect(files.length).toBeGreaterThanOrEqual(10);
    for (const name of files) {
      const bytes = new Uint8Array(fs.readFileSync(path.join(HOSTILE_DIR, name)));
      let expected: string | null = null;
      try {
        readScoreFile(bytes, name);
      } catch (e) {
        expected = e instanceof MusicXmlError ? e.code : null;
      }
      const res = await owner.fetch("/api/parts", { method: "POST", body: multipartFile(name, bytes) });
      if (expected === null) {
        // Files that are only odd (unknown elements) must load.
        expect(res.status, name).toBe(201);
        continue;
      }
      expect(res.status, name).toBeGreaterThanOrEqual(400);
      expect(res.status, name).toBeLessThan(500);
      const body = await res.json();
      expect(body.code, name).toBe(expected);
      expect(body.message.length, name).toBeGreaterThan(10);
    }
  });

  it("reads a cadenza written as one long bar and says so in the upload answer and the library", async () => {
    const file = path.resolve("tests/fixtures/real/ours/cadenza-long-bar.musicxml");
    const res = await owner.fetch("/api/parts", { method: "POST", body: multipartFile("cadenza-long-bar.musicxml", new Uint8Array(fs.readFileSync(file))) });
    expect(res.status).toBe(201);
    const created = await res.json();
    // 40 sixteenths in bar 3 of a 4/4 part: 10 quarter-note beats (MusicXML 4.0, divisions).
    expect(created.notices).toEqual(["bar 3 lasts 10 beats in 4/4 — read as written"]);
    const listed = (await (await owner.fetch("/api/parts?sort=-updated")).json()).items.find((p: { id: string }) => p.id === created.id);
    expect(listed.notices).toEqual(["bar 3 lasts 10 beats in 4/4 — read as written"]);
  });

  it("refuses a body without a file, and a non-multipart body, with a message", async () => {
    const empty = await owner.fetch("/api/parts", { method: "POST", body: new FormData() });
    expect(empty.status).toBe(400);
    expect((await empty.json()).code).toBe("bad_request:no_file");
    const json = await owner.fetch("/api/parts", { method: "POST", headers: { "content-type": "application/json" }, body: "{}" });
    expect(json.status).toBe(415);
  });

  it("lands two uploads made at the same time by one user", async () => {
    const names = sampleFiles().filter((n) => n.endsWith(".musicxml")).slice(0, 2);
    const results = await Promise.all(names.map((n) => uploadSample(other, n)));
    expect(new Set(results.map((r) => r.id)).size).toBe(2);
    const list = await (await other.fetch("/api/parts?pageSize=100")).json();
    for (const r of results) expect(list.items.map((i: { id: string }) => i.id)).toContain(r.id);
  });

  it("answers 404 for another user's part on every part route", async () => {
    const mine = await uploadSample(owner, sampleFiles()[0]);
    for (const suffix of ["", "/musicxml", "/note-keys", "/analysis", "/source", "/markings"]) {
      const res = await other.fetch(`/api/parts/${mine.id}${suffix}`);
      expect(res.status, suffix).toBe(404);
    }
    const del = await other.fetch(`/api/parts/${mine.id}`, { method: "DELETE" });
    expect(del.status).toBe(404);
    expect((await owner.fetch(`/api/parts/${mine.id}`)).status).toBe(200);
  });

  it("searches, sorts and pages the library on the server", async () => {
    const fresh = (await createSignedInUser({ role: "player" })).client;
    const names = sampleFiles().slice(0, 5);
    for (const n of names) await uploadSample(fresh, n);
    const all = await (await fresh.fetch("/api/parts?sort=title&pageSize=100")).json();
    expect(all.total).toBe(names.length);
    const titles = all.items.map((i: { title: string }) => i.title);
    expect(titles).toEqual([...titles].sort((a: string, b: string) => a.toLowerCase().localeCompare(b.toLowerCase())));
    const desc = await (await fresh.fetch("/api/parts?sort=-title&pageSize=100")).json();
    expect(desc.items.map((i: { title: string }) => i.title)).toEqual([...titles].reverse());

    const page2 = await (await fresh.fetch("/api/parts?sort=title&pageSize=2&page=2")).json();
    expect(page2.items.map((i: { title: string }) => i.title)).toEqual(titles.slice(2, 4));

    const word = titles[0].split(" ")[0];
    const found = await (await fresh.fetch(`/api/parts?query=${encodeURIComponent(word.toLowerCase())}`)).json();
    expect(found.items.length).toBeGreaterThan(0);
    for (const i of found.items) expect(`${i.title} ${i.composer}`.toLowerCase()).toContain(word.toLowerCase());

    const bad = await fresh.fetch("/api/parts?sort=colour");
    expect(bad.status).toBe(400);
  });

  it("renames and deletes, and deleting removes the markings", async () => {
    const created = await uploadSample(owner, sampleFiles()[0]);
    const renamed = await owner.fetch(`/api/parts/${created.id}`, {
      method: "PATCH",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ title: "Lesson copy" }),
    });
    expect((await renamed.json()).title).toBe("Lesson copy");
    const empty = await owner.fetch(`/api/parts/${created.id}`, {
      method: "PATCH",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ title: "  " }),
    });
    expect(empty.status).toBe(400);
    const del = await owner.fetch(`/api/parts/${created.id}`, { method: "DELETE" });
    expect(del.status).toBe(200);
    expect((await owner.fetch(`/api/parts/${created.id}`)).status).toBe(404);
    expect((await owner.fetch(`/api/parts/${created.id}/markings`)).status).toBe(404);
  });

  it("asks for a session", async () => {
    const res = await fetch(`${process.env.APP_URL}/api/parts`);
    expect(res.status).toBe(401);
  });
});
