import { beforeAll, describe, expect, it } from "vitest";
import { DEFAULT_MARKING } from "@/lib/markings/schema";
import { db } from "@/db/client";
import { shares } from "@/db/schema";
import { createSignedInUser, type ApiClient, type TestUser } from "../helpers/session";
import { sampleFiles, uploadSample } from "../helpers/parts";

const post = (body: unknown): RequestInit => ({ method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
const take = (noteKey: string, over: Record<string, unknown> = {}) => ({
  noteKey, speedHz: 6.02, depthCents: 28.7, offsetCents: -4.5, voicedFraction: 0.93, toneSeconds: 2.1, loudnessSpeedHz: null, loudnessDepthDb: null, ...over,
});

describe("practice log and takes API", () => {
  let owner: { user: TestUser; client: ApiClient };
  let teacher: { user: TestUser; client: ApiClient };
  let stranger: ApiClient;
  let partId: string;
  let keys: string[];

  beforeAll(async () => {
    [owner, teacher] = await Promise.all([createSignedInUser({ role: "player" }), createSignedInUser({ role: "teacher" })]);
    stranger = (await createSignedInUser({ role: "player" })).client;
    partId = (await uploadSample(owner.client, sampleFiles().find((n) => n.endsWith(".musicxml"))!)).id;
    keys = (await (await owner.client.fetch(`/api/parts/${partId}/analysis`)).json()).notes.map((n: { key: string }) => n.key);
    await db().insert(shares).values({
      partId, email: teacher.user.email, permission: "comment", tokenHash: `practice-${partId}`, invitedBy: owner.user.id,
      userId: teacher.user.id, acceptedAt: new Date(), expiresAt: new Date(Date.now() + 86_400_000),
    });
  });

  it("adds practice-log entries and lists them newest first with the minutes summed", async () => {
    const first = await owner.client.fetch(`/api/parts/${partId}/practice`, post({ kind: "pulse-trainer", minutes: 10, noteKey: keys[2], notes: "  4 pulses at 84  " }));
    expect(first.status).toBe(201);
    expect((await first.json()).entry).toMatchObject({ kind: "pulse-trainer", minutes: 10, noteKey: keys[2], notes: "4 pulses at 84" });
    const second = await owner.client.fetch(`/api/parts/${partId}/practice`, post({ kind: "free", minutes: 15 }));
    expect(second.status).toBe(201);

    const log = await (await owner.client.fetch(`/api/parts/${partId}/practice`)).json();
    expect(log.entries.map((e: { kind: string }) => e.kind)).toEqual(["free", "pulse-trainer"]);
    expect(log.totalMinutes).toBe(25);
    expect(log.canWrite).toBe(true);
  });

  it("lets the teacher the part is shared with read the log, but not write it", async () => {
    const log = await (await teacher.client.fetch(`/api/parts/${partId}/practice`)).json();
    expect(log.entries.length).toBeGreaterThanOrEqual(2);
    expect(log.canWrite).toBe(false);
    const refused = await teacher.client.fetch(`/api/parts/${partId}/practice`, post({ kind: "free", minutes: 5 }));
    expect(refused.status).toBe(403);
    expect((await refused.json()).code).toBe("forbidden:part");
  });

  it("names the field of a bad practice-log entry", async () => {
    const cases: Array<[Record<string, unknown>, string]> = [
      [{ kind: "scales", minutes: 5 }, "kind"],
      [{ kind: "free", minutes: 0 }, "minutes"],
      [{ kind: "free", minutes: "ten" }, "minutes"],
      [{ kind: "free", minutes: 601 }, "minutes"],
      [{ kind: "free", minutes: 5, notes: "x".repeat(2001) }, "notes"],
      [{ kind: "free", minutes: 5, noteKey: "P1:m999:s1:v1:0:60" }, "noteKey"],
    ];
    for (const [body, field] of cases) {
      const res = await owner.client.fetch(`/api/parts/${partId}/practice`, post(body));
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect((await res.json()).field).toBe(field);
    }
    const broken = await owner.client.fetch(`/api/parts/${partId}/practice`, { method: "POST", headers: { "content-type": "application/json" }, body: "{" });
    expect(broken.status).toBe(400);
  });

  it("stores a take's numbers with the note's marking as it was, and lists takes by note", async () => {
    await owner.client.fetch(`/api/parts/${partId}/markings/${encodeURIComponent(keys[3])}`, { method: "PUT", headers: { "content-type": "application/json" }, body: JSON.stringify({ ...DEFAULT_MARKING, depthCents: 30, speedHz: 6 }) });
    const saved = await owner.client.fetch(`/api/parts/${partId}/takes`, post(take(keys[3])));
    expect(saved.status).toBe(201);
    const body = (await saved.json()).take;
    expect(body).toMatchObject({ noteKey: keys[3], speedHz: 6.02, depthCents: 28.7, marked: { speedHz: 6, depthCents: 30 } });
    // A note without a marking stores the take with nothing to compare against.
    const unmarked = await owner.client.fetch(`/api/parts/${partId}/takes`, post(take(keys[4], { speedHz: null, depthCents: 0.3 })));
    expect((await unmarked.json()).take).toMatchObject({ noteKey: keys[4], speedHz: null, marked: null });

    const all = await (await owner.client.fetch(`/api/parts/${partId}/takes`)).json();
    expect(all.takes.map((t: { noteKey: string }) => t.noteKey)).toEqual([keys[4], keys[3]]);
    const one = await (await owner.client.fetch(`/api/parts/${partId}/takes?noteKey=${encodeURIComponent(keys[3])}`)).json();
    expect(one.takes).toHaveLength(1);
    const seen = await (await teacher.client.fetch(`/api/parts/${partId}/takes`)).json();
    expect(seen.takes).toHaveLength(2);
  });

  it("names the field of a bad take", async () => {
    const cases: Array<[Record<string, unknown>, string]> = [
      [take("P1:m999:s1:v1:0:60"), "noteKey"],
      [take(keys[0], { speedHz: 25 }), "speedHz"],
      [take(keys[0], { depthCents: -1 }), "depthCents"],
      [take(keys[0], { voicedFraction: 1.5 }), "voicedFraction"],
      [take(keys[0], { offsetCents: "flat" }), "offsetCents"],
      [take(keys[0], { toneSeconds: 10_000 }), "toneSeconds"],
      [{ speedHz: 6 }, "noteKey"],
    ];
    for (const [body, field] of cases) {
      const res = await owner.client.fetch(`/api/parts/${partId}/takes`, post(body));
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect((await res.json()).field).toBe(field);
    }
  });

  it("answers 404 for another player's part, whether reading or writing", async () => {
    for (const path of ["practice", "takes"]) {
      const read = await stranger.fetch(`/api/parts/${partId}/${path}`);
      expect(read.status).toBe(404);
      expect((await read.json()).code).toBe("not_found:part");
    }
    const write = await stranger.fetch(`/api/parts/${partId}/practice`, post({ kind: "free", minutes: 5 }));
    expect(write.status).toBe(404);
    const takeWrite = await stranger.fetch(`/api/parts/${partId}/takes`, post(take(keys[0])));
    expect(takeWrite.status).toBe(404);
    // The stranger's attempts left no trace in the owner's log.
    const log = await (await owner.client.fetch(`/api/parts/${partId}/practice`)).json();
    expect(log.totalMinutes).toBe(25);
  });
});
