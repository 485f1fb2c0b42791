import fs from "node:fs";
import path from "node:path";
import { randomUUID } from "node:crypto";
import { and, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { comments, parts, shares } from "@/db/schema";
import { multipartFile } from "../../helpers/parts";
import { createSignedInUser, uniqueEmail, type ApiClient, type TestUser } from "../../helpers/session";
import { countHostileRequests, hostile } from "./hostile";

countHostileRequests("idempotency");

/**
 * Requests that create something take an Idempotency-Key (the IETF HTTPAPI draft
 * "The Idempotency-Key HTTP Header Field": a retry with the key gets the first answer, the key
 * reused with another payload is 422). ASVS 4.0.3 11.1.6: no race lets concurrent copies of one
 * request create twice.
 */
const FIXTURE = path.resolve("tests/fixtures/sharing/two-bars.musicxml");
const post = (body: unknown, key?: string): RequestInit => ({
  method: "POST",
  headers: { "content-type": "application/json", ...(key ? { "idempotency-key": key } : {}) },
  body: JSON.stringify(body),
});

let owner: ApiClient;
let ownerUser: TestUser;
let partId: string;

const commentsWith = async (body: string) =>
  (await db().select({ id: comments.id }).from(comments).where(and(eq(comments.partId, partId), eq(comments.body, body)))).length;

beforeAll(async () => {
  ({ client: owner, user: ownerUser } = await createSignedInUser());
  const res = await owner.fetch("/api/parts", { method: "POST", body: multipartFile("two-bars.musicxml", new Uint8Array(fs.readFileSync(FIXTURE))) });
  expect(res.status).toBe(201);
  partId = (await res.json()).id;
});

describe("idempotency keys (ASVS 11.1.6)", () => {
  it("answers a retry with the first answer and keeps one comment", async () => {
    const key = randomUUID();
    const body = `retried comment ${key}`;
    const first = await owner.fetch(`/api/parts/${partId}/comments?thread=part`, post({ body }, key));
    expect(first.status).toBe(201);
    const firstBody = await first.text();
    const retry = await hostile(`/api/parts/${partId}/comments?thread=part`, post({ body }, key), owner);
    expect(retry.status).toBe(201); // the first answer's status
    expect(await retry.text()).toBe(firstBody); // and its body, byte for byte
    expect(retry.headers.get("idempotent-replayed")).toBe("true");
    expect(await commentsWith(body)).toBe(1); // ASVS 11.1.6
  });

  it("creates one comment from 10 concurrent copies, and every copy gets its answer", async () => {
    const key = randomUUID();
    const body = `concurrent comment ${key}`;
    const answers = await Promise.all(
      Array.from({ length: 10 }, () => hostile(`/api/parts/${partId}/comments?thread=part`, post({ body }, key), owner)),
    );
    expect(answers.map((a) => a.status)).toEqual(Array(10).fill(201));
    const ids = new Set(await Promise.all(answers.map(async (a) => (await a.json()).id as string)));
    expect(ids.size).toBe(1);
    expect(await commentsWith(body)).toBe(1); // ASVS 11.1.6
  });

  it("refuses the same key with a different body with 422 and a message, creating nothing", async () => {
    const key = randomUUID();
    expect((await owner.fetch(`/api/parts/${partId}/comments?thread=part`, post({ body: `original ${key}` }, key))).status).toBe(201);
    const other = await hostile(`/api/parts/${partId}/comments?thread=part`, post({ body: `changed ${key}` }, key), owner);
    expect(other.status).toBe(422); // IETF Idempotency-Key draft: payload mismatch
    const answer = await other.json();
    expect(answer.code).toBe("unprocessable:idempotency_key");
    expect(answer.message).toMatch(/already used for a different request/);
    expect(await commentsWith(`changed ${key}`)).toBe(0);
  });

  it("keeps keys apart per user and per route", async () => {
    const key = randomUUID();
    const { client: other } = await createSignedInUser();
    // Another user's key of the same value is theirs: it does not replay the owner's answer.
    await owner.fetch(`/api/parts/${partId}/comments?thread=part`, post({ body: `mine ${key}` }, key));
    const theirs = await hostile(`/api/parts/${partId}/comments?thread=part`, post({ body: `mine ${key}` }, key), other);
    expect(theirs.status).toBe(404); // not shared with them: refused, and no replay of the owner's comment
    expect(theirs.headers.get("idempotent-replayed")).toBeNull();
  });

  it("refuses a malformed key (ASVS 5.1.3)", async () => {
    const res = await hostile(`/api/parts/${partId}/comments?thread=part`, post({ body: "short key" }, "abc"), owner);
    expect(res.status).toBe(400);
    expect((await res.json()).code).toBe("bad_request:idempotency_key");
    expect(await commentsWith("short key")).toBe(0);
  });

  it("sends one invitation for a retried share", async () => {
    const key = randomUUID();
    const email = uniqueEmail("invitee");
    const first = await owner.fetch(`/api/parts/${partId}/shares`, post({ email, permission: "comment" }, key));
    expect(first.status).toBe(201);
    const retry = await owner.fetch(`/api/parts/${partId}/shares`, post({ email, permission: "comment" }, key));
    expect(retry.status).toBe(201);
    expect((await retry.json()).id).toBe((await first.json()).id);
    expect((await db().select({ id: shares.id }).from(shares).where(and(eq(shares.partId, partId), eq(shares.email, email)))).length).toBe(1);
  });

  it("stores one part for a retried upload, although a new form draws a new multipart boundary", async () => {
    const key = randomUUID();
    const bytes = new Uint8Array(fs.readFileSync(FIXTURE));
    const send = () => owner.fetch("/api/parts", { method: "POST", headers: { "idempotency-key": key }, body: multipartFile("two-bars.musicxml", bytes) });
    const first = await send();
    expect(first.status).toBe(201);
    const retry = await send();
    expect(retry.status).toBe(201);
    const id = (await first.json()).id;
    expect((await retry.json()).id).toBe(id);
    const before = (await db().select({ id: parts.id }).from(parts).where(eq(parts.ownerId, ownerUser.id))).length;
    expect((await send()).status).toBe(201);
    expect((await db().select({ id: parts.id }).from(parts).where(eq(parts.ownerId, ownerUser.id))).length).toBe(before);
  });
});
