import fs from "node:fs";
import path from "node:path";
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { comments, parts } from "@/db/schema";
import { multipartFile } from "../../helpers/parts";
import { createSignedInUser, type ApiClient } from "../../helpers/session";
import { APP_ORIGIN, countHostileRequests, EVIL_ORIGIN, hostile } from "./hostile";

countHostileRequests("requests");

const FIXTURE = path.resolve("tests/fixtures/sharing/two-bars.musicxml");
const json = (body: unknown, extra: Record<string, string> = {}, method = "POST"): RequestInit => ({
  method, headers: { "content-type": "application/json", ...extra }, body: JSON.stringify(body),
});

let owner: ApiClient;
let partId: string;
let noteKey: string;

async function commentCount(): Promise<number> {
  return (await db().select({ id: comments.id }).from(comments).where(eq(comments.partId, partId))).length;
}

beforeAll(async () => {
  ({ client: owner } = await createSignedInUser());
  const res = await owner.fetch("/api/parts", { method: "POST", body: multipartFile("two-bars.musicxml", new Uint8Array(fs.readFileSync(FIXTURE))) });
  expect(res.status).toBe(201);
  partId = (await res.json()).id;
  const analysis = await (await owner.fetch(`/api/parts/${partId}/analysis`)).json();
  noteKey = analysis.notes[0].key;
});

describe("cross-site requests (ASVS 4.2.2, 13.2.3)", () => {
  it("refuses a cross-site text/plain POST carrying the session cookie, and creates nothing", async () => {
    const before = await commentCount();
    const res = await hostile(`/api/parts/${partId}/comments?thread=part`, {
      method: "POST",
      headers: { "content-type": "text/plain", origin: EVIL_ORIGIN, "sec-fetch-site": "cross-site" },
      body: JSON.stringify({ body: "planted", noteKey: null }),
    }, owner);
    expect(res.status).toBe(403); // ASVS 4.2.2
    expect((await res.json()).code).toBe("forbidden:cross_site");
    expect(await commentCount()).toBe(before);
  });

  it("refuses text/plain and form bodies even without an Origin (ASVS 13.2.3)", async () => {
    const before = await commentCount();
    for (const type of ["text/plain", "application/x-www-form-urlencoded", "text/xml"]) {
      const res = await hostile(`/api/parts/${partId}/comments?thread=part`, { method: "POST", headers: { "content-type": type }, body: `{"body":"planted"}` }, owner);
      expect(res.status).toBe(415); // ASVS 13.2.3 (content type checked)
    }
    expect(await commentCount()).toBe(before);
  });

  it("refuses JSON from a foreign or opaque Origin, and cross-site Fetch Metadata (ASVS 4.2.2)", async () => {
    const before = await commentCount();
    for (const headers of <Record<string, string>[]>[{ origin: EVIL_ORIGIN }, { origin: "null" }, { "sec-fetch-site": "cross-site" }, { "sec-fetch-site": "same-site" }, { origin: `${APP_ORIGIN}.evil.example` }]) {
      const res = await hostile(`/api/parts/${partId}/comments?thread=part`, json({ body: "planted", noteKey: null }, headers), owner);
      expect(res.status).toBe(403); // ASVS 4.2.2
    }
    expect(await commentCount()).toBe(before);
  });

  it("refuses cross-site PUT, PATCH and DELETE, and the part stays as it was (ASVS 4.2.2)", async () => {
    const evil = { origin: EVIL_ORIGIN };
    const put = await hostile(`/api/parts/${partId}/markings/${encodeURIComponent(noteKey)}`, json({ depthCents: 40, speedHz: 5, role: "peak" }, evil, "PUT"), owner);
    expect(put.status).toBe(403);
    const patch = await hostile(`/api/parts/${partId}`, json({ title: "Renamed by someone else" }, evil, "PATCH"), owner);
    expect(patch.status).toBe(403);
    const del = await hostile(`/api/parts/${partId}`, { method: "DELETE", headers: evil }, owner);
    expect(del.status).toBe(403);
    const [row] = await db().select({ title: parts.title }).from(parts).where(eq(parts.id, partId));
    expect(row.title).not.toBe("Renamed by someone else");
  });

  it("accepts the same request from our own origin (the control)", async () => {
    const before = await commentCount();
    const res = await owner.fetch(`/api/parts/${partId}/comments?thread=part`, json({ body: "from our own page", noteKey: null }, { origin: APP_ORIGIN, "sec-fetch-site": "same-origin" }));
    expect(res.status).toBe(201);
    expect(await commentCount()).toBe(before + 1);
  });
});

describe("body size (ASVS 12.1.1, 13.1.3)", () => {
  const big = "x".repeat(5 * 1024 * 1024);

  it("refuses a 5 MB JSON body with 413 and a message a person can act on", async () => {
    const started = Date.now();
    const res = await hostile(`/api/parts/${partId}/comments?thread=part`, json({ body: big, noteKey: null }), owner);
    expect(res.status).toBe(413); // ASVS 12.1.1
    const body = await res.json();
    expect(body.code).toBe("too_large:body");
    expect(body.message).toMatch(/larger than \d+ KB/);
    expect(Date.now() - started).toBeLessThan(5_000);
  });

  it("refuses a streamed (chunked) body past the cap without a Content-Length (ASVS 12.1.1)", async () => {
    const chunk = new TextEncoder().encode("x".repeat(64 * 1024));
    let sent = 0;
    const stream = new ReadableStream<Uint8Array>({
      pull(controller) {
        if (sent++ >= 80) controller.close();
        else controller.enqueue(chunk);
      },
    });
    const res = await hostile(`/api/parts/${partId}/comments?thread=part`, {
      method: "POST", headers: { "content-type": "application/json" }, body: stream, duplex: "half",
    } as RequestInit, owner);
    expect(res.status).toBe(413);
  });

  it("refuses a 5 MB body to the sign-in callback before parsing it (ASVS 12.1.1)", async () => {
    const res = await hostile("/api/auth/callback/credentials", {
      method: "POST", headers: { "content-type": "application/x-www-form-urlencoded" }, body: `email=a%40b.example&password=${big}`,
    });
    expect(res.status).toBe(413);
  });

  it("answers malformed JSON with 400 (ASVS 5.1.4)", async () => {
    const res = await hostile(`/api/parts/${partId}/comments?thread=part`, { method: "POST", headers: { "content-type": "application/json" }, body: "{\"body\": " }, owner);
    expect(res.status).toBe(400);
  });
});

describe("control characters in text (ASVS 5.1.3, 5.1.4)", () => {
  it("answers 400, not 500, for a NUL in a practice note, and stores nothing", async () => {
    const res = await hostile(`/api/parts/${partId}/practice`, json({ kind: "free", minutes: 10, notes: "long tones\u0000then scales" }), owner);
    expect(res.status).toBe(400); // ASVS 5.1.4
    expect((await res.json()).code).toBe("bad_request:control_character");
  });

  it("answers 400 for control characters in a comment and in a part's title", async () => {
    const comment = await hostile(`/api/parts/${partId}/comments?thread=part`, json({ body: "bell\u0007", noteKey: null }), owner);
    expect(comment.status).toBe(400);
    const title = await hostile(`/api/parts/${partId}`, json({ title: "Etude\u001b[31m" }, {}, "PATCH"), owner);
    expect(title.status).toBe(400);
  });

  it("keeps line breaks and tabs, which are text", async () => {
    const res = await owner.fetch(`/api/parts/${partId}/comments?thread=part`, json({ body: "first line\n\tsecond line", noteKey: null }));
    expect(res.status).toBe(201);
  });
});
