import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { authTokens, users } from "@/db/schema";
import { setUserStatus } from "@/db/users";
import { hashToken } from "@/lib/auth/tokens";
import { callAction } from "../helpers/actions";
import { APP_URL } from "../helpers/env";
import { linkTo, waitForMail, type MailSummary } from "../helpers/mailbox";
import { ApiClient, attemptLinkSignIn, createUser, getUserRow, uniqueAddress, uniqueEmail, type TestUser } from "../helpers/session";

const AUTH = "app/(auth)/actions.ts";
const SUBJECT = /Your Ondula sign-in link/;
const NEUTRAL = "If an account uses this address, we sent it a sign-in link. It works once and for 15 minutes; check your inbox.";

/** Asks for a link from a fresh address (its own abuse counter) and returns the action's answer. */
async function requestLink(email: string, fields: Record<string, string> = {}, address = uniqueAddress()) {
  return callAction(new ApiClient("anon", { "x-forwarded-for": address }), AUTH, "requestSignInLinkAction", { email, ...fields });
}

/** Asks for a link and reads its token from the mailbox. */
async function mailedToken(user: TestUser, fields: Record<string, string> = {}): Promise<string> {
  const answer = await requestLink(user.email, fields);
  expect(answer).toMatchObject({ status: 200, state: { ok: true, message: NEUTRAL } });
  const mail = await waitForMail(user.email, SUBJECT);
  return new URL(linkTo(mail, "/sign-in/link")).searchParams.get("token")!;
}

async function mailTo(to: string): Promise<MailSummary[]> {
  return (await (await fetch(`${APP_URL}/api/dev/mail?to=${encodeURIComponent(to)}`)).json()) as MailSummary[];
}

async function tokenRow(token: string) {
  const [row] = await db().select().from(authTokens).where(eq(authTokens.tokenHash, hashToken(token)));
  return row;
}

async function linkPage(token: string): Promise<{ status: number; html: string }> {
  const res = await new ApiClient().fetch(`/sign-in/link?token=${encodeURIComponent(token)}`);
  return { status: res.status, html: await res.text() };
}

describe("sign-in links", () => {
  it("mails a link to an existing account; opening it uses nothing, its button signs in and lands on /parts", async () => {
    const user = await createUser();
    const answer = await requestLink(user.email.toUpperCase());
    expect(answer).toMatchObject({ status: 200, state: { ok: true, message: NEUTRAL } });

    const mail = await waitForMail(user.email, SUBJECT);
    const link = new URL(linkTo(mail, "/sign-in/link"));
    expect(link.origin).toBe(new URL(APP_URL).origin);
    const token = link.searchParams.get("token")!;
    expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/); // 32 random bytes, base64url
    expect(mail.text).toContain("once and for 15 minutes");

    // Only the hash is stored, and the link lives 15 minutes.
    const row = await tokenRow(token);
    expect(row).toMatchObject({ purpose: "sign_in_link", userId: user.id, usedAt: null });
    expect(JSON.stringify(row)).not.toContain(token);
    expect(row.expiresAt.getTime() - row.createdAt.getTime()).toBeGreaterThan(15 * 60_000 - 5_000);
    expect(row.expiresAt.getTime() - row.createdAt.getTime()).toBeLessThanOrEqual(15 * 60_000 + 5_000);

    // A mail scanner fetching the link (twice) does not use it up.
    for (let i = 0; i < 2; i++) {
      const page = await linkPage(token);
      expect(page.status).toBe(200);
      expect(page.html).toContain(`Sign in as ${user.email}`);
    }
    expect((await tokenRow(token)).usedAt).toBeNull();

    const signedIn = await attemptLinkSignIn(token);
    expect(signedIn.response.status).toBe(200);
    expect(signedIn.client.hasSession()).toBe(true);
    expect(signedIn.body.url).toBe(`${APP_URL}/parts`);
    expect(await (await signedIn.client.fetch("/api/me")).json()).toMatchObject({ id: user.id, email: user.email });
    expect((await signedIn.client.fetch("/parts")).status).toBe(200);
    expect((await tokenRow(token)).usedAt).not.toBeNull();
  });

  it("answers the same for an unknown address and a disabled account, and mails neither", async () => {
    const unknown = uniqueEmail("nobody");
    const disabled = await createUser();
    await setUserStatus({ userId: disabled.id, status: "disabled" });
    const control = await createUser();

    const answers = [await requestLink(unknown), await requestLink(disabled.email), await requestLink(control.email)];
    for (const a of answers) expect(a).toMatchObject({ status: 200, state: { ok: true, message: NEUTRAL } });

    // The control's mail is sent after the two others were handled.
    await waitForMail(control.email, SUBJECT);
    await new Promise((r) => setTimeout(r, 300));
    expect(await mailTo(unknown)).toEqual([]);
    expect(await mailTo(disabled.email)).toEqual([]);
  });

  it("works once: a second use is refused and the page says the link was used", async () => {
    const user = await createUser();
    const token = await mailedToken(user);
    expect((await attemptLinkSignIn(token)).client.hasSession()).toBe(true);

    const again = await attemptLinkSignIn(token);
    expect(again.response.status).toBe(401);
    expect(again.client.hasSession()).toBe(false);
    expect(new URL(again.body.url!).searchParams.get("error")).toBe("CredentialsSignin");

    const page = await linkPage(token);
    expect(page.html).toContain("This sign-in link has been used");
    expect(page.html).toContain("E-mail me a new link");
    expect(page.html).not.toContain(`Sign in as ${user.email}`);
  });

  it("signs in only once when the button is pressed twice at the same moment", async () => {
    const user = await createUser();
    const token = await mailedToken(user);
    const attempts = await Promise.all([attemptLinkSignIn(token), attemptLinkSignIn(token), attemptLinkSignIn(token)]);
    expect(attempts.filter((a) => a.client.hasSession())).toHaveLength(1);
    expect(attempts.map((a) => a.response.status).sort()).toEqual([200, 401, 401]);
  });

  it("refuses an expired link and the page says it expired, with a way to a new one", async () => {
    const user = await createUser();
    const token = await mailedToken(user);
    // 15 minutes pass.
    await db().update(authTokens).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(authTokens.tokenHash, hashToken(token)));

    const attempt = await attemptLinkSignIn(token);
    expect(attempt.response.status).toBe(401);
    expect(attempt.client.hasSession()).toBe(false);
    const page = await linkPage(token);
    expect(page.html).toContain("This sign-in link has expired");
    expect(page.html).toContain(`/sign-in?method=link&amp;email=${encodeURIComponent(user.email)}`);
  });

  it("refuses a disabled account without using the link; enabled again, it signs in, and disabling ends that session", async () => {
    const user = await createUser();
    const token = await mailedToken(user);
    await setUserStatus({ userId: user.id, status: "disabled" });

    const refused = await attemptLinkSignIn(token);
    expect(refused.response.status).toBe(401);
    expect(refused.client.hasSession()).toBe(false);
    expect((await tokenRow(token)).usedAt).toBeNull();
    const page = await linkPage(token);
    expect(page.html).toContain("This account is disabled");
    expect(page.html).not.toContain("E-mail me a new link");

    await setUserStatus({ userId: user.id, status: "active" });
    const signedIn = await attemptLinkSignIn(token);
    expect(signedIn.client.hasSession()).toBe(true);
    expect((await signedIn.client.fetch("/api/me")).status).toBe(200);
    // The link's session carries the account's epoch like a password's: disabling ends it.
    await setUserStatus({ userId: user.id, status: "disabled" });
    expect((await signedIn.client.fetch("/api/me")).status).toBe(401);
  });

  it("confirms an unconfirmed address, as following the link proves it", async () => {
    const user = await createUser({ verified: false });
    expect((await getUserRow(user.id)).emailVerifiedAt).toBeNull();
    const { client } = await attemptLinkSignIn(await mailedToken(user));
    expect(await (await client.fetch("/api/me")).json()).toMatchObject({ emailVerified: true });
  });

  it("refuses a link whose account has changed its address since", async () => {
    const user = await createUser();
    const token = await mailedToken(user);
    await db().update(users).set({ email: uniqueEmail("moved") }).where(eq(users.id, user.id));
    expect((await attemptLinkSignIn(token)).client.hasSession()).toBe(false);
    expect((await linkPage(token)).html).toContain("This sign-in link is not valid");
  });

  it("refuses a made-up or truncated token and shows the not-valid page", async () => {
    for (const token of ["A".repeat(43), "too-short", ""]) {
      const attempt = await attemptLinkSignIn(token);
      expect(attempt.response.status).toBe(401);
      expect(attempt.client.hasSession()).toBe(false);
      const page = await linkPage(token);
      expect(page.status).toBe(200);
      expect(page.html).toContain("This sign-in link is not valid");
    }
  });

  it("refuses a link sign-in without next-auth's CSRF token", async () => {
    const user = await createUser();
    const token = await mailedToken(user);
    const client = new ApiClient("no-csrf", { "x-forwarded-for": uniqueAddress() });
    const res = await client.fetch("/api/auth/callback/sign-in-link", {
      method: "POST",
      headers: { "content-type": "application/x-www-form-urlencoded" },
      body: new URLSearchParams({ token, json: "true" }),
    });
    expect(client.hasSession()).toBe(false);
    expect(((await res.json()) as { url: string }).url).toContain("csrf=true");
    expect((await tokenRow(token)).usedAt).toBeNull();
  });

  it("limits link requests per account: the sixth within 15 minutes answers 429 naming when to retry", async () => {
    const user = await createUser();
    for (let i = 0; i < 5; i++) expect((await requestLink(user.email)).status).toBe(200);
    const limited = await requestLink(user.email);
    expect(limited.status).toBe(429);
    expect(limited.state?.code).toBe("rate_limited:sign_in_link");
    expect(limited.state?.message).toMatch(/^Too many sign-in link requests\. Try again in 1[45] minutes/);
  });

  it("limits link requests per client address across addresses typed, known or not", async () => {
    const address = uniqueAddress();
    for (let i = 0; i < 10; i++) expect((await requestLink(uniqueEmail("spray"), {}, address)).status).toBe(200);
    const user = await createUser();
    expect((await requestLink(user.email, {}, address)).status).toBe(429);
    // Another address is not affected.
    expect((await requestLink(user.email, {}, uniqueAddress())).status).toBe(200);
  });

  it("limits failed link uses per client address", async () => {
    const address = uniqueAddress();
    for (let i = 0; i < 20; i++) {
      expect((await attemptLinkSignIn(`${"B".repeat(40)}${String(i).padStart(3, "0")}`, { address })).response.status).toBe(401);
    }
    const user = await createUser();
    const token = await mailedToken(user);
    const blocked = await attemptLinkSignIn(token, { address });
    expect(blocked.response.status).toBe(429);
    expect(blocked.body.code).toBe("rate_limited:sign_in");
    expect((await tokenRow(token)).usedAt).toBeNull();
  });

  it("keeps a same-site callbackUrl and refuses one that leaves the site", async () => {
    const user = await createUser();
    const kept = await mailedToken(user, { callbackUrl: "/parts?sort=title" });
    expect((await tokenRow(kept)).data).toEqual({ callbackUrl: "/parts?sort=title" });
    const landed = await attemptLinkSignIn(kept, { callbackUrl: "/parts?sort=title" });
    expect(landed.body.url).toBe(`${APP_URL}/parts?sort=title`);

    for (const evil of ["https://evil.example/steal", "//evil.example/steal", "/\\evil.example/steal"]) {
      const token = await mailedToken(await createUser(), { callbackUrl: evil });
      // Not stored: the link lands on the library.
      expect((await tokenRow(token)).data).toBeNull();
      expect((await linkPage(token)).html).not.toContain("evil.example");
      // And a hand-made POST naming another site is sent home by next-auth's redirect callback.
      const attempt = await attemptLinkSignIn(token, { callbackUrl: evil });
      expect(attempt.client.hasSession()).toBe(true);
      expect(new URL(attempt.body.url!).origin).toBe(new URL(APP_URL).origin);
    }
  });
});
