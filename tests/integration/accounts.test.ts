import { describe, expect, it } from "vitest";
import { callAction } from "../helpers/actions";
import { APP_URL, DEMO_PASSWORD } from "../helpers/env";
import { linkTo, waitForMail } from "../helpers/mailbox";
import {
  ApiClient, attemptSignIn, createSignedInUser, createUser, getUserRow, signIn, TEST_PASSWORD, uniqueAddress, uniqueEmail,
} from "../helpers/session";

const AUTH = "app/(auth)/actions.ts";
const ADMIN = "app/(account)/admin/users/actions.ts";
const GENERIC = "E-mail or password is wrong.";

describe("accounts", () => {
  it("signs up through the real form, confirms the address from the mailbox and signs in", async () => {
    const email = uniqueEmail("signup");
    const anon = new ApiClient();
    const signUp = await callAction(anon, AUTH, "signUpAction", {
      name: "Lio Varenne", email, password: "wave-and-breath-2026", role: "teacher",
    });
    expect(signUp.status).toBe(303);
    // The new account lands signed in, in the library.
    expect(signUp.redirect).toBe("/parts?welcome=1");
    expect(anon.hasSession()).toBe(true);
    expect(await (await anon.fetch("/api/me")).json()).toMatchObject({ email, name: "Lio Varenne", role: "teacher" });

    const client = await signIn(email, "wave-and-breath-2026");
    const before = await (await client.fetch("/api/me")).json();
    expect(before).toMatchObject({ email, name: "Lio Varenne", role: "teacher", emailVerified: false });

    const mail = await waitForMail(email, /Confirm your e-mail/);
    expect(mail.text).toContain("48 hours");
    const link = new URL(linkTo(mail, "/verify-email"));
    expect(link.origin).toBe(new URL(APP_URL).origin);
    const token = link.searchParams.get("token")!;
    expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/); // 32 random bytes, base64url

    // The page only shows a button; following the link does not use the token up.
    expect((await anon.fetch(`${link.pathname}${link.search}`)).status).toBe(200);
    const confirm = await callAction(anon, AUTH, "verifyEmailAction", { token });
    expect(confirm).toMatchObject({ status: 200, state: { ok: true } });
    expect(await (await client.fetch("/api/me")).json()).toMatchObject({ emailVerified: true });

    // Single use.
    const again = await callAction(anon, AUTH, "verifyEmailAction", { token });
    expect(again.status).toBe(400);
  });

  it("refuses a short or common password at sign-up, naming the field, and answers a taken address like a new one", async () => {
    const anon = new ApiClient();
    const short = await callAction(anon, AUTH, "signUpAction", { name: "A", email: uniqueEmail(), password: "short", role: "player" });
    expect(short.status).toBe(400);
    expect(short.state?.fieldErrors?.password).toMatch(/at least 10/);
    const common = await callAction(anon, AUTH, "signUpAction", { name: "A", email: uniqueEmail(), password: "password123", role: "player" });
    expect(common.state?.fieldErrors?.password).toMatch(/common passwords/);
    // A taken address gets the same answer as a new one (ASVS 2.2.1 / 3.x: no account enumeration);
    // its owner is told by mail instead, and nothing about the account changes.
    const existing = await createUser();
    const taken = await callAction(anon, AUTH, "signUpAction", { name: "A", email: existing.email.toUpperCase(), password: "wave-and-breath-2026", role: "player" });
    expect(taken.status).toBe(303);
    // The same redirect a new account gets; only a new account is signed in.
    expect(taken.redirect).toBe("/parts?welcome=1");
    const notice = await waitForMail(existing.email, /tried to create an Ondula account/);
    expect(notice.text).toContain("Nothing was changed");
    await signIn(existing.email, existing.password);
    const admin = await callAction(anon, AUTH, "signUpAction", { name: "A", email: uniqueEmail(), password: "wave-and-breath-2026", role: "admin" });
    expect(admin.state?.fieldErrors?.role).toBeDefined();
  });

  it("signs the demo accounts in with DEMO_PASSWORD", async () => {
    for (const [email, role] of [["player@demo.ondula.test", "player"], ["teacher@demo.ondula.test", "teacher"], ["admin@demo.ondula.test", "admin"]]) {
      const client = await signIn(email, DEMO_PASSWORD);
      expect(await (await client.fetch("/api/me")).json()).toMatchObject({ email, role });
    }
  });

  it("sets the session cookie HttpOnly and SameSite=Lax", async () => {
    const user = await createUser();
    const { response } = await attemptSignIn(user.email, user.password);
    const cookie = response.headers.getSetCookie().find((c) => c.includes("next-auth.session-token"))!;
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    // Not Secure outside production (the local app runs on plain http).
    expect(cookie).not.toMatch(/;\s*Secure/i);
  });

  it("answers the same generic message for a wrong password and an unknown account", async () => {
    const user = await createUser();
    const address = uniqueAddress();
    const wrong = await attemptSignIn(user.email, "not-the-password", { address });
    const unknown = await attemptSignIn(uniqueEmail("nobody"), "whatever-password", { address });
    for (const attempt of [wrong, unknown]) {
      expect(attempt.response.status).toBe(401);
      expect(attempt.client.hasSession()).toBe(false);
      expect(new URL(attempt.body.url!).searchParams.get("error")).toBe("CredentialsSignin");
    }
    // The form shows the same sentence for both.
    const page = await (await new ApiClient().fetch("/sign-in?error=CredentialsSignin")).text();
    expect(page).toContain(GENERIC);
  });

  it("refuses a sign-in without next-auth's CSRF token", async () => {
    const user = await createUser();
    const client = new ApiClient();
    const res = await client.fetch("/api/auth/callback/credentials", {
      method: "POST",
      headers: { "content-type": "application/x-www-form-urlencoded" },
      body: new URLSearchParams({ email: user.email, password: user.password, json: "true" }),
    });
    expect(client.hasSession()).toBe(false);
    expect(((await res.json()) as { url: string }).url).toContain("csrf=true");
  });

  it("limits failed sign-ins per account: the sixth answers 429 with Retry-After and a retry time", async () => {
    const user = await createUser();
    for (let i = 0; i < 5; i++) {
      const a = await attemptSignIn(user.email, `wrong-password-${i}`, { address: uniqueAddress() });
      expect(a.response.status).toBe(401);
    }
    // Even the right password is refused while the account is blocked, from any address.
    const blocked = await attemptSignIn(user.email, user.password, { address: uniqueAddress() });
    expect(blocked.response.status).toBe(429);
    const retryAfter = Number(blocked.response.headers.get("retry-after"));
    expect(retryAfter).toBeGreaterThan(14 * 60);
    expect(retryAfter).toBeLessThanOrEqual(15 * 60);
    expect(blocked.body.code).toBe("rate_limited:sign_in");
    expect(blocked.body.message).toMatch(/Try again in 1[45] minutes/);
    expect(blocked.client.hasSession()).toBe(false);
  });

  it("limits failed sign-ins per client address across accounts", async () => {
    const address = uniqueAddress();
    for (let i = 0; i < 20; i++) {
      const a = await attemptSignIn(uniqueEmail("spray"), "guess-password-1", { address });
      expect(a.response.status).toBe(401);
    }
    const user = await createUser();
    const blocked = await attemptSignIn(user.email, user.password, { address });
    expect(blocked.response.status).toBe(429);
    expect(blocked.response.headers.get("retry-after")).toMatch(/^\d+$/);
    // Another address is not affected.
    expect((await attemptSignIn(user.email, user.password, { address: uniqueAddress() })).client.hasSession()).toBe(true);
  });

  it("resets a password through the e-mailed link, once, and ends the old sessions", async () => {
    const user = await createUser();
    const oldSession = await signIn(user.email, user.password);
    const anon = new ApiClient("anon", { "x-forwarded-for": uniqueAddress() });
    const request = await callAction(anon, AUTH, "forgotPasswordAction", { email: user.email.toUpperCase() });
    expect(request).toMatchObject({ status: 200, state: { ok: true } });
    // Unknown addresses get the same answer.
    const unknown = await callAction(anon, AUTH, "forgotPasswordAction", { email: uniqueEmail("nobody") });
    expect(unknown.state?.message).toBe(request.state?.message);

    const mail = await waitForMail(user.email, /Reset your Ondula password/);
    const token = new URL(linkTo(mail, "/reset-password")).searchParams.get("token")!;
    const mismatch = await callAction(anon, AUTH, "resetPasswordAction", { token, password: "new-calm-passphrase", confirm: "other" });
    expect(mismatch.state?.fieldErrors?.confirm).toMatch(/differ/);
    const reset = await callAction(anon, AUTH, "resetPasswordAction", { token, password: "new-calm-passphrase", confirm: "new-calm-passphrase" });
    expect(reset).toMatchObject({ status: 303, redirect: "/sign-in?reset=1" });
    const reuse = await callAction(anon, AUTH, "resetPasswordAction", { token, password: "another-calm-passphrase", confirm: "another-calm-passphrase" });
    expect(reuse.status).toBe(400);

    expect((await oldSession.fetch("/api/me")).status).toBe(401);
    expect((await attemptSignIn(user.email, user.password)).response.status).toBe(401);
    await signIn(user.email, "new-calm-passphrase");
  });

  it("limits reset requests per account with a message naming when to retry", async () => {
    const user = await createUser();
    const anon = new ApiClient("anon", { "x-forwarded-for": uniqueAddress() });
    for (let i = 0; i < 3; i++) {
      expect((await callAction(anon, AUTH, "forgotPasswordAction", { email: user.email })).status).toBe(200);
    }
    const limited = await callAction(anon, AUTH, "forgotPasswordAction", { email: user.email });
    expect(limited.status).toBe(429);
    expect(limited.state?.message).toMatch(/Too many reset requests\. Try again in \d+ minutes?/);
  });

  it("applies an admin's role change at once although the JWT is unchanged", async () => {
    const { user, client } = await createSignedInUser({ role: "player" });
    expect((await client.fetch("/admin/users")).status).toBe(404);
    const admin = await signIn("admin@demo.ondula.test", DEMO_PASSWORD);
    expect(await callAction(admin, ADMIN, "setRoleAction", { userId: user.id, role: "teacher" })).toMatchObject({ status: 200 });
    expect(await (await client.fetch("/api/me")).json()).toMatchObject({ role: "teacher" });
    expect(await callAction(admin, ADMIN, "setRoleAction", { userId: user.id, role: "admin" })).toMatchObject({ status: 200 });
    expect((await client.fetch("/admin/users")).status).toBe(200);
    expect((await client.fetch("/api/admin/users?q=demo.ondula.test")).status).toBe(200);
  });

  it("refuses role changes by non-admins and an admin's change of their own role", async () => {
    const { user: player, client } = await createSignedInUser();
    const denied = await callAction(client, ADMIN, "setRoleAction", { userId: player.id, role: "admin" });
    expect(denied.status).toBe(404);
    expect((await getUserRow(player.id)).role).toBe("player");
    const { user: admin, client: adminClient } = await createSignedInUser({ role: "admin" });
    const self = await callAction(adminClient, ADMIN, "setRoleAction", { userId: admin.id, role: "player" });
    expect(self.status).toBe(403);
  });

  it("ends a disabled account's sessions at once and refuses its sign-in with the generic message", async () => {
    const { user, client } = await createSignedInUser({ role: "teacher" });
    expect((await client.fetch("/api/me")).status).toBe(200);
    const admin = await signIn("admin@demo.ondula.test", DEMO_PASSWORD);
    const res = await admin.fetch(`/api/admin/users/${user.id}`, {
      method: "PATCH", headers: { "content-type": "application/json" }, body: JSON.stringify({ status: "disabled" }),
    });
    expect(res.status).toBe(200);
    expect((await client.fetch("/api/me")).status).toBe(401);
    const studio = await client.fetch("/studio");
    expect(studio.status).toBe(307);
    expect(studio.headers.get("location")).toContain("/sign-in?callbackUrl=%2Fstudio");
    const attempt = await attemptSignIn(user.email, TEST_PASSWORD, { address: uniqueAddress() });
    expect(attempt.response.status).toBe(401);
    expect(new URL(attempt.body.url!).searchParams.get("error")).toBe("CredentialsSignin");

    // Enabled again, the account signs in anew (the old cookie stays dead: its epoch moved on).
    await admin.fetch(`/api/admin/users/${user.id}`, {
      method: "PATCH", headers: { "content-type": "application/json" }, body: JSON.stringify({ status: "active" }),
    });
    expect((await client.fetch("/api/me")).status).toBe(401);
    await signIn(user.email, TEST_PASSWORD);
  });

  it("searches, sorts and pages the account list on the server for admins", async () => {
    const tag = `zq${Date.now().toString(36)}`;
    for (const n of ["Cora", "Abel", "Bram"]) await createUser({ name: `${n} ${tag}` });
    const admin = await signIn("admin@demo.ondula.test", DEMO_PASSWORD);
    const page1 = await (await admin.fetch(`/api/admin/users?q=${tag}&sort=name&dir=asc&pageSize=2`)).json();
    expect(page1.total).toBe(3);
    expect(page1.rows.map((r: { name: string }) => r.name)).toEqual([`Abel ${tag}`, `Bram ${tag}`]);
    const page2 = await (await admin.fetch(`/api/admin/users?q=${tag}&sort=name&dir=asc&pageSize=2&page=2`)).json();
    expect(page2.rows.map((r: { name: string }) => r.name)).toEqual([`Cora ${tag}`]);
    const html = await (await admin.fetch(`/admin/users?q=${tag}&sort=name&dir=desc`)).text();
    expect(html.indexOf(`Cora ${tag}`)).toBeLessThan(html.indexOf(`Abel ${tag}`));
    const bad = await admin.fetch("/api/admin/users?sort=password");
    expect(bad.status).toBe(400);
    expect((await bad.json()).field).toBe("sort");
  });

  it("changes name and notifications in settings; a new password signs out everywhere", async () => {
    const { user, client } = await createSignedInUser();
    const SETTINGS = "app/(account)/settings/actions.ts";
    expect(await callAction(client, SETTINGS, "updateProfileAction", { name: "Renamed Player" })).toMatchObject({ status: 200 });
    const row = await getUserRow(user.id);
    expect(row.name).toBe("Renamed Player");
    expect(row.emailNotifications).toBe(false);
    const wrong = await callAction(client, SETTINGS, "changePasswordAction", { current: "nope", next: "fresh-calm-passphrase", confirm: "fresh-calm-passphrase" });
    expect(wrong.state?.fieldErrors?.current).toMatch(/wrong/);
    const changed = await callAction(client, SETTINGS, "changePasswordAction", { current: user.password, next: "fresh-calm-passphrase", confirm: "fresh-calm-passphrase" });
    expect(changed.status).toBe(303);
    expect((await client.fetch("/api/me")).status).toBe(401);
    await signIn(user.email, "fresh-calm-passphrase");
  });
});
