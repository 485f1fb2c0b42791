import fs from "node:fs";
import path from "node:path";
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { shares } from "@/db/schema";
import { callAction } from "../../helpers/actions";
import { linkTo, waitForMail } from "../../helpers/mailbox";
import { multipartFile } from "../../helpers/parts";
import {
  ApiClient, attemptLinkSignIn, attemptSignIn, createSignedInUser, createUser, signIn, TEST_PASSWORD, uniqueAddress, uniqueEmail, type TestUser,
} from "../../helpers/session";
import { accept, invite, json } from "../../helpers/sharing";
import { countHostileRequests, hostile } from "./hostile";

countHostileRequests("accounts");

const AUTH = "app/(auth)/actions.ts";
const FIXTURE = path.resolve("tests/fixtures/sharing/two-bars.musicxml");

async function newPart(owner: ApiClient): Promise<string> {
  const res = await owner.fetch("/api/parts", { method: "POST", body: multipartFile("two-bars.musicxml", new Uint8Array(fs.readFileSync(FIXTURE))) });
  expect(res.status).toBe(201);
  return (await res.json()).id;
}

async function signOut(client: ApiClient): Promise<Response> {
  const { csrfToken } = (await (await client.fetch("/api/auth/csrf")).json()) as { csrfToken: string };
  return client.fetch("/api/auth/signout", {
    method: "POST", headers: { "content-type": "application/x-www-form-urlencoded" }, body: new URLSearchParams({ csrfToken, json: "true" }),
  });
}

describe("sessions (ASVS 3.3.1, 3.3.3)", () => {
  it("ends the session on the server at sign-out: a copied cookie stops working", async () => {
    const { client } = await createSignedInUser();
    const copy = client.clone("copied cookie");
    expect((await copy.fetch("/api/me")).status).toBe(200);
    expect((await signOut(client)).status).toBe(200);
    const replay = await hostile("/api/me", {}, copy);
    expect(replay.status).toBe(401); // ASVS 3.3.1
  });

  it("hands an address proved by a sign-in link to its owner: the earlier password and sessions end (ASVS 3.3.3)", async () => {
    // Someone signs up first with an address that is not theirs; it stays unconfirmed.
    const squatted = await createUser({ verified: false });
    const squatter = await signIn(squatted.email, TEST_PASSWORD);
    expect((await squatter.fetch("/api/me")).status).toBe(200);
    // The mailbox's owner asks for a sign-in link and follows it.
    await callAction(new ApiClient("owner", { "x-forwarded-for": uniqueAddress() }), AUTH, "requestSignInLinkAction", { email: squatted.email });
    const mail = await waitForMail(squatted.email, /sign-in link/i);
    const token = new URL(linkTo(mail, "/sign-in/link")).searchParams.get("token")!;
    const owner = await attemptLinkSignIn(token);
    expect(owner.client.hasSession()).toBe(true);
    expect(await (await owner.client.fetch("/api/me")).json()).toMatchObject({ email: squatted.email, emailVerified: true });
    // The squatter's session and password are gone.
    expect((await hostile("/api/me", {}, squatter)).status).toBe(401); // ASVS 3.3.3
    const retry = await attemptSignIn(squatted.email, TEST_PASSWORD, { address: uniqueAddress() });
    expect(retry.client.hasSession()).toBe(false);
  });
});

describe("no account enumeration (ASVS 2.2.1 anti-automation, 2.5.x uniform answers)", () => {
  it("answers forgot-password alike, in text and time, for known and unknown addresses", async () => {
    const known = await Promise.all([createUser(), createUser(), createUser()]);
    const timed = async (email: string) => {
      const t0 = performance.now();
      const r = await callAction(new ApiClient("anon", { "x-forwarded-for": uniqueAddress() }), AUTH, "forgotPasswordAction", { email });
      return { ms: performance.now() - t0, message: r.state?.message, status: r.status };
    };
    const runs: Array<{ known: boolean; ms: number; message?: string; status: number }> = [];
    for (let i = 0; i < 3; i++) {
      runs.push({ known: true, ...(await timed(known[i].email)) });
      runs.push({ known: false, ...(await timed(uniqueEmail("nobody"))) });
    }
    expect(new Set(runs.map((r) => `${r.status} ${r.message}`)).size).toBe(1);
    const median = (xs: number[]) => xs.sort((a, b) => a - b)[Math.floor(xs.length / 2)];
    const knownMs = median(runs.filter((r) => r.known).map((r) => r.ms));
    const unknownMs = median(runs.filter((r) => !r.known).map((r) => r.ms));
    // The lookup and the mail run after the answer; what remains is noise of the shared machine.
    expect(Math.abs(knownMs - unknownMs)).toBeLessThan(80);
    await waitForMail(known[0].email, /Reset your Ondula password/);
  });

  it("answers sign-up alike for a taken address and tells its owner by mail", async () => {
    const existing = await createUser();
    const taken = await callAction(new ApiClient(), AUTH, "signUpAction", { name: "Someone", email: existing.email, password: "wave-and-breath-2026", role: "player" });
    const fresh = await callAction(new ApiClient(), AUTH, "signUpAction", { name: "Someone", email: uniqueEmail("new"), password: "wave-and-breath-2026", role: "player" });
    expect(taken.status).toBe(fresh.status);
    expect(taken.redirect?.replace(/email=[^&]+/, "")).toBe(fresh.redirect?.replace(/email=[^&]+/, ""));
    await waitForMail(existing.email, /tried to create an Ondula account/);
  });
});

describe("sign-in attempts are limited (ASVS 2.2.1)", () => {
  it("lets at most 5 of 12 parallel wrong passwords for one account through to the comparison", async () => {
    const user = await createUser();
    const results = await Promise.all(Array.from({ length: 12 }, () => attemptSignIn(user.email, "wrong-password-guess", { address: uniqueAddress() })));
    const limited = results.filter((r) => r.response.status === 429).length;
    expect(12 - limited).toBeLessThanOrEqual(5); // ASVS 2.2.1
    expect(limited).toBeGreaterThanOrEqual(7);
  });

  it("does not clear the failures when the right password is given in between", async () => {
    const user = await createUser();
    const address = uniqueAddress();
    for (let i = 0; i < 4; i++) expect((await attemptSignIn(user.email, "wrong-password-guess", { address })).response.status).not.toBe(429);
    await signIn(user.email, user.password, { address });
    expect((await attemptSignIn(user.email, "wrong-password-guess", { address })).response.status).not.toBe(429);
    const sixth = await attemptSignIn(user.email, "wrong-password-guess", { address });
    expect(sixth.response.status).toBe(429); // ASVS 2.2.1
  });

  it("gives no fresh per-address budget to a spoofed extra X-Forwarded-For entry (one trusted proxy in the test run)", async () => {
    const address = uniqueAddress();
    for (let i = 0; i < 20; i++) {
      expect((await attemptSignIn(uniqueEmail("spray"), "guess-password-1", { address })).response.status).toBe(401);
    }
    // The client writes an address of its choosing in front of what the proxy appended.
    const spoofed = await attemptSignIn(uniqueEmail("spray"), "guess-password-1", { address: `${uniqueAddress()}, ${address}` });
    expect(spoofed.response.status).toBe(429); // ASVS 2.2.1
  });
});

describe("mail on someone's behalf (ASVS 11.1.4 anti-automation, 11.1.5 business limits)", () => {
  it("needs a confirmed address to invite anyone to a part", async () => {
    const { client } = await createSignedInUser({ verified: false });
    const partId = await newPart(client);
    const res = await hostile(`/api/parts/${partId}/shares`, json({ email: uniqueEmail("stranger"), permission: "comment" }), client);
    expect(res.status).toBe(403);
    expect((await res.json()).code).toBe("forbidden:unconfirmed");
  });

  it("limits invite/withdraw loops to one recipient", async () => {
    const { client } = await createSignedInUser();
    const partId = await newPart(client);
    const target = uniqueEmail("target");
    const statuses: number[] = [];
    for (let i = 0; i < 4; i++) {
      const res = await hostile(`/api/parts/${partId}/shares`, json({ email: target, permission: "comment" }), client);
      statuses.push(res.status);
      if (res.status === 201) {
        const { id } = await res.json();
        expect((await client.fetch(`/api/parts/${partId}/shares/${id}`, { method: "DELETE" })).status).toBeLessThan(300);
      }
    }
    expect(statuses).toEqual([201, 201, 201, 429]);
  });
});

describe("reads follow the written policy (ASVS 4.1.3, 4.2.1)", () => {
  let owner: { user: TestUser; client: ApiClient };
  let teacher: { user: TestUser; client: ApiClient };
  let fellow: { user: TestUser; client: ApiClient };
  let partId: string;

  beforeAll(async () => {
    [owner, teacher, fellow] = await Promise.all([createSignedInUser(), createSignedInUser({ role: "teacher" }), createSignedInUser()]);
    partId = await newPart(owner.client);
    for (const who of [teacher, fellow]) {
      const { token } = await invite(owner.client, partId, who.user.email, "comment");
      expect((await accept(who.client, token)).status).toBe(200);
    }
    await invite(owner.client, partId, uniqueEmail("pending"), "comment");
  });

  it("shows the invitee list to the owner only, not to the people it is shared with", async () => {
    const mine = await (await owner.client.fetch("/api/parts")).json();
    expect(mine.items.find((p: { id: string }) => p.id === partId).sharedWith.length).toBe(3);
    for (const who of [teacher, fellow]) {
      const theirs = await (await hostile("/api/parts", {}, who.client)).json();
      expect(theirs.items.find((p: { id: string }) => p.id === partId).sharedWith).toEqual([]); // ASVS 4.2.1
    }
    expect((await hostile(`/api/parts/${partId}/shares`, {}, teacher.client)).status).toBe(403);
  });

  it("lets a teacher read the owner's practice log and takes, and not a fellow player it is shared with", async () => {
    expect((await teacher.client.fetch(`/api/parts/${partId}/practice`)).status).toBe(200);
    expect((await hostile(`/api/parts/${partId}/practice`, {}, fellow.client)).status).toBe(403); // ASVS 4.1.3
    expect((await hostile(`/api/parts/${partId}/takes`, {}, fellow.client)).status).toBe(403); // ASVS 4.1.3
  });
});

describe("invitation links (ASVS 13.2.x: no state change on GET)", () => {
  it("opening the link accepts nothing; the page's POST does", async () => {
    const { client: owner } = await createSignedInUser();
    const { user, client } = await createSignedInUser({ role: "teacher" });
    const partId = await newPart(owner);
    const { share, token } = await invite(owner, partId, user.email, "comment");
    const page = await hostile(`/share/accept?token=${encodeURIComponent(token)}`, {}, client);
    expect(page.status).toBe(200);
    expect(await page.text()).toContain("Accept and open the part");
    const [row] = await db().select().from(shares).where(eq(shares.id, share.id));
    expect(row.acceptedAt).toBeNull();
    expect((await accept(client, token)).status).toBe(200);
  });
});

describe("information exposure (ASVS 14.3.2, 14.3.3)", () => {
  it("answers anonymous health checks with a status only", async () => {
    const res = await hostile("/api/health");
    expect(await res.json()).toEqual({ status: "ok" }); // ASVS 14.3.3
  });

  it("serves stored MusicXML as a sandboxed attachment that is not sniffed (ASVS 12.5.2, 14.4.4)", async () => {
    const { client } = await createSignedInUser();
    const partId = await newPart(client);
    for (const path of [`/api/parts/${partId}/musicxml`, `/api/parts/${partId}/source`]) {
      const res = await hostile(path, {}, client);
      expect(res.status).toBe(200);
      expect(res.headers.get("content-disposition")).toMatch(/^attachment/); // ASVS 12.5.2
      expect(res.headers.get("x-content-type-options")).toBe("nosniff"); // ASVS 14.4.4
      expect(res.headers.get("content-security-policy")).toMatch(/\bsandbox\b/);
    }
  });

  it("stores only MusicXML: script, foreign-namespace markup, comments and instructions do not come back (ASVS 12.2.1, 5.2.7)", async () => {
    const { client } = await createSignedInUser();
    const planted = fs.readFileSync(FIXTURE, "utf8")
      .replace("<score-partwise version=\"4.0\">", '<score-partwise version="4.0" xmlns:h="http://www.w3.org/1999/xhtml" onload="alert(1)">')
      .replace("<part-list>", '<?xml-stylesheet href="https://evil.example/x.xsl"?><!-- planted --><script>alert(2)</script><h:iframe src="https://evil.example/"/><part-list>')
      .replace("<note>", '<note h:onclick="alert(3)"><h:script>alert(4)</h:script>');
    const res = await hostile("/api/parts", { method: "POST", body: multipartFile("planted.musicxml", new TextEncoder().encode(planted)) }, client);
    expect(res.status).toBe(201);
    const { id } = await res.json();
    const stored = await (await client.fetch(`/api/parts/${id}/musicxml`)).text();
    expect(stored).not.toMatch(/script|iframe|alert|onload|onclick|xhtml|<!--|xml-stylesheet/); // ASVS 12.2.1, 5.2.7
    // The music itself is all there.
    expect(stored).toContain("<work-title>Two Bars for Sharing</work-title>");
    expect(stored.match(/<note>/g)?.length).toBe(fs.readFileSync(FIXTURE, "utf8").match(/<note>/g)?.length);
  });

  it("a 404 for someone else's part says nothing about it (ASVS 4.2.1)", async () => {
    const { client: owner } = await createSignedInUser();
    const partId = await newPart(owner);
    const { client: other } = await createSignedInUser();
    for (const path of [`/api/parts/${partId}`, `/api/parts/${partId}/musicxml`, `/api/parts/${partId}/practice`]) {
      expect((await hostile(path, {}, other)).status).toBe(404);
    }
  });
});

