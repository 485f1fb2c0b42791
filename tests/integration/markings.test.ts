import { randomUUID } from "node:crypto";
import { beforeAll, describe, expect, it } from "vitest";
import { DEFAULT_MARKING } from "@/lib/markings/schema";
import { createSignedInUser, type ApiClient } from "../helpers/session";
import { sampleFiles, uploadSample } from "../helpers/parts";

const json = (body: unknown): RequestInit => ({ headers: { "content-type": "application/json" }, body: JSON.stringify(body) });

describe("markings API", () => {
  let owner: ApiClient;
  let partId: string;
  let keys: string[];
  const url = (key: string) => `/api/parts/${partId}/markings/${encodeURIComponent(key)}`;

  beforeAll(async () => {
    owner = (await createSignedInUser({ role: "player" })).client;
    const created = await uploadSample(owner, sampleFiles().find((n) => n.endsWith(".musicxml"))!);
    partId = created.id;
    const analysis = await (await owner.fetch(`/api/parts/${partId}/analysis`)).json();
    keys = analysis.notes.map((n: { key: string }) => n.key);
    expect(keys.length).toBeGreaterThan(6);
  });

  it("creates a marking at version 1 and updates it with the version it edited", async () => {
    const created = await owner.fetch(url(keys[0]), { method: "PUT", ...json({ ...DEFAULT_MARKING, depthCents: 25, role: "phrase-start" }) });
    expect(created.status).toBe(201);
    const first = (await created.json()).marking;
    expect(first).toMatchObject({ noteKey: keys[0], depthCents: 25, role: "phrase-start", version: 1 });

    const updated = await owner.fetch(url(keys[0]), { method: "PUT", ...json({ ...DEFAULT_MARKING, depthCents: 30, version: 1 }) });
    expect(updated.status).toBe(200);
    expect((await updated.json()).marking).toMatchObject({ depthCents: 30, version: 2 });

    const list = await (await owner.fetch(`/api/parts/${partId}/markings`)).json();
    expect(list.markings.find((m: { noteKey: string }) => m.noteKey === keys[0]).version).toBe(2);
  });

  it("answers 409 with the current marking for a stale version, and changes nothing", async () => {
    await owner.fetch(url(keys[1]), { method: "PUT", ...json({ ...DEFAULT_MARKING, speedHz: 5 }) });
    const tabA = await owner.fetch(url(keys[1]), { method: "PUT", ...json({ ...DEFAULT_MARKING, speedHz: 6, version: 1 }) });
    expect(tabA.status).toBe(200);
    const tabB = await owner.fetch(url(keys[1]), { method: "PUT", ...json({ ...DEFAULT_MARKING, speedHz: 4, version: 1 }) });
    expect(tabB.status).toBe(409);
    const body = await tabB.json();
    expect(body.code).toBe("conflict:marking");
    expect(body.current).toMatchObject({ speedHz: 6, version: 2 });
    // A "new" marking on a note that already has one is a conflict too.
    const blind = await owner.fetch(url(keys[1]), { method: "PUT", ...json(DEFAULT_MARKING) });
    expect(blind.status).toBe(409);
  });

  it("names the field that is out of range and refuses unknown notes", async () => {
    const deep = await owner.fetch(url(keys[2]), { method: "PUT", ...json({ ...DEFAULT_MARKING, depthCents: 140 }) });
    expect(deep.status).toBe(400);
    expect((await deep.json()).field).toBe("depthCents");
    const fast = await owner.fetch(url(keys[2]), { method: "PUT", ...json({ ...DEFAULT_MARKING, speedHz: -1 }) });
    expect((await fast.json()).field).toBe("speedHz");
    const role = await owner.fetch(url(keys[2]), { method: "PUT", ...json({ ...DEFAULT_MARKING, role: "climax" }) });
    expect((await role.json()).field).toBe("role");
    const unknown = await owner.fetch(url("P1:m999:s1:v1:0:60"), { method: "PUT", ...json(DEFAULT_MARKING) });
    expect(unknown.status).toBe(404);
    expect((await unknown.json()).code).toBe("not_found:note");
  });

  it("deletes with the version, and never reuses a version number", async () => {
    const put = await (await owner.fetch(url(keys[3]), { method: "PUT", ...json(DEFAULT_MARKING) })).json();
    const stale = await owner.fetch(`${url(keys[3])}?version=${put.marking.version + 5}`, { method: "DELETE" });
    expect(stale.status).toBe(409);
    const del = await owner.fetch(`${url(keys[3])}?version=${put.marking.version}`, { method: "DELETE" });
    expect(del.status).toBe(200);
    const again = await (await owner.fetch(url(keys[3]), { method: "PUT", ...json(DEFAULT_MARKING) })).json();
    expect(again.marking.version).toBeGreaterThan(put.marking.version);
  });

  it("undoes and redoes a gesture across several notes, and a new change ends redo", async () => {
    const group = randomUUID();
    for (const k of keys.slice(4, 6)) {
      const r = await owner.fetch(url(k), { method: "PUT", ...json({ ...DEFAULT_MARKING, role: "tension", group }) });
      expect(r.status).toBe(201);
    }
    const undo = await (await owner.fetch(`/api/parts/${partId}/history/undo`, { method: "POST" })).json();
    expect(undo.changes.map((c: { noteKey: string }) => c.noteKey).sort()).toEqual(keys.slice(4, 6).sort());
    expect(undo.changes.every((c: { marking: unknown }) => c.marking === null)).toBe(true);
    expect(undo.canRedo).toBe(true);
    let list = (await (await owner.fetch(`/api/parts/${partId}/markings`)).json()).markings;
    expect(list.some((m: { noteKey: string }) => keys.slice(4, 6).includes(m.noteKey))).toBe(false);

    const redo = await (await owner.fetch(`/api/parts/${partId}/history/redo`, { method: "POST" })).json();
    expect(redo.changes.every((c: { marking: { role: string } }) => c.marking.role === "tension")).toBe(true);
    list = (await (await owner.fetch(`/api/parts/${partId}/markings`)).json()).markings;
    expect(list.filter((m: { noteKey: string }) => keys.slice(4, 6).includes(m.noteKey))).toHaveLength(2);

    await owner.fetch(`/api/parts/${partId}/history/undo`, { method: "POST" });
    await owner.fetch(url(keys[6]), { method: "PUT", ...json(DEFAULT_MARKING) });
    const history = await (await owner.fetch(`/api/parts/${partId}/history`)).json();
    expect(history.canRedo).toBe(false);
    expect(history.entries[0]).toMatchObject({ noteKey: keys[6], action: "create" });
  });

  it("remembers suggestion decisions", async () => {
    const post = await owner.fetch(`/api/parts/${partId}/suggestions/decisions`, { method: "POST", ...json({ noteKey: keys[0], role: "peak", decision: "dismissed" }) });
    expect(post.status).toBe(200);
    const list = await (await owner.fetch(`/api/parts/${partId}/suggestions/decisions`)).json();
    expect(list.decisions).toContainEqual({ noteKey: keys[0], role: "peak", decision: "dismissed" });
  });
});
