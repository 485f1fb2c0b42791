import fs from "node:fs";
import path from "node:path";
import { sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db, transaction } from "@/db/client";
import { MAIL_QUEUE } from "@/db/job-queue";
import { messageIdFor } from "@/lib/mail/message-id";
import { SMTP_TIMEOUTS } from "@/lib/mail/send";
import { queueMail } from "@/server/outbox/queue";
import { callAction } from "../helpers/actions";
import { APP_URL } from "../helpers/env";
import { setSmtp } from "../helpers/mailbox";
import { multipartFile } from "../helpers/parts";
import { ApiClient, createSignedInUser, createUser, uniqueAddress, uniqueEmail } from "../helpers/session";
import { accept, invite, json, mailTo, passEmailWindow, waitForMails, type CaughtMail } from "../helpers/sharing";

const DIGEST = /new(?: items)? on “/;
const INVITE = /shares/;
const SIGN_IN = /Your Ondula sign-in link/;
const FIXTURE = path.resolve("tests/fixtures/sharing/two-bars.musicxml");

type JobRow = {
  id: string;
  state: string;
  to: string;
  retry_count: number;
  output: unknown;
};

/** The outbox's jobs addressed to these people (pg-boss keeps one row per job in pgboss.job). */
async function jobsTo(addresses: string[]): Promise<JobRow[]> {
  const result = await db().execute<JobRow>(
    sql`select id, state::text as state, data->>'to' as "to", retry_count, output from pgboss.job
        where name = ${MAIL_QUEUE} and data->>'to' in (${sql.join(addresses.map((a) => sql`${a}`), sql`, `)})`,
  );
  return result.rows;
}

async function until<T>(what: string, probe: () => Promise<T | undefined | false>, timeoutMs: number): Promise<T> {
  const started = Date.now();
  for (;;) {
    const found = await probe();
    if (found) return found;
    if (Date.now() - started > timeoutMs) throw new Error(`${what}: not within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

/** Runs a request and tells how long its answer took. */
async function timed(run: () => Promise<Response | { status: number }>): Promise<{ status: number; ms: number }> {
  const started = performance.now();
  const res = await run();
  return { status: res.status, ms: Math.round(performance.now() - started) };
}

const content = (subject: string) => ({ subject, text: `${subject}\n\nhttp://127.0.0.1/`, html: `<p>${subject}</p>` });

describe("mail outbox", () => {
  // Whatever happens here, the mail server serves again for the tests after these.
  afterAll(() => setSmtp("up"));

  it("drops a message queued in a transaction that is undone, and sends one that is kept, with its job's Message-ID", async () => {
    const dropped = uniqueEmail("dropped");
    const kept = uniqueEmail("kept");
    await expect(
      transaction(async (tx) => {
        await queueMail(dropped, content("Never sent"), { tx });
        throw new Error("the change failed");
      }),
    ).rejects.toThrow("the change failed");
    await transaction((tx) => queueMail(kept, content("Sent once"), { tx }));

    const [mail] = await waitForMails(kept, /Sent once/, 1);
    const job = await until("the job is done", async () => (await jobsTo([kept])).find((j) => j.state === "completed"), 10_000);
    // RFC 5322 §3.6.4: msg-id = "<" id-left "@" id-right ">"; the job's id makes it the same on every attempt.
    expect(mail.messageId).toBe(messageIdFor(job.id, APP_URL));
    expect(await jobsTo([dropped])).toEqual([]);
    expect(await mailTo(dropped)).toEqual([]);
  });

  describe("with the mail server down, then silent", () => {
    let owner: Awaited<ReturnType<typeof createSignedInUser>>;
    let teacher: Awaited<ReturnType<typeof createSignedInUser>>;
    let partId: string;
    let noteKey: string;

    beforeAll(async () => {
      owner = await createSignedInUser({ role: "player" });
      teacher = await createSignedInUser({ role: "teacher" });
      const res = await owner.client.fetch("/api/parts", { method: "POST", body: multipartFile("two-bars.musicxml", new Uint8Array(fs.readFileSync(FIXTURE))) });
      expect(res.status).toBe(201);
      partId = (await res.json()).id;
      const analysis = await (await owner.client.fetch(`/api/parts/${partId}/analysis`)).json();
      noteKey = analysis.notes[1].key;
      const { token } = await invite(owner.client, partId, teacher.user.email, "comment");
      expect((await accept(teacher.client, token)).status).toBe(200);
      // The acceptance is the pair's first digest; the comment below comes after its window.
      await waitForMails(owner.user.email, DIGEST, 1);
      await passEmailWindow(owner.user.id, partId);
    });

    it("answers at once, keeps the mail, and delivers every message exactly once when the server is back", async () => {
      const invitedWhileDown = uniqueEmail("invited-down");
      const invitedWhileSilent = uniqueEmail("invited-silent");
      const linkUser = await createUser();
      const timings: Record<string, number> = {};

      const recipients = [invitedWhileDown, owner.user.email, linkUser.email, invitedWhileSilent];
      await setSmtp("down");
      const invitation = await timed(() => owner.client.fetch(`/api/parts/${partId}/shares`, json({ email: invitedWhileDown, permission: "comment" })));
      const comment = await timed(() =>
        teacher.client.fetch(`/api/parts/${partId}/comments?thread=${encodeURIComponent(noteKey)}`, json({ body: "Breathe before the long note" })),
      );
      const link = await timed(() => callAction(new ApiClient("anon", { "x-forwarded-for": uniqueAddress() }), "app/(auth)/actions.ts", "requestSignInLinkAction", { email: linkUser.email }));
      expect([invitation.status, comment.status, link.status]).toEqual([201, 201, 200]);
      Object.assign(timings, { "invitation (SMTP down)": invitation.ms, "comment (SMTP down)": comment.ms, "sign-in link (SMTP down)": link.ms });

      await setSmtp("silent");
      const silentInvitation = await timed(() => owner.client.fetch(`/api/parts/${partId}/shares`, json({ email: invitedWhileSilent, permission: "propose" })));
      expect(silentInvitation.status).toBe(201);
      timings["invitation (SMTP silent)"] = silentInvitation.ms;
      console.log("[outbox] request times with the mail server out (ms):", timings);
      // No request waits for SMTP: each answer comes before a single SMTP attempt could give up.
      for (const ms of Object.values(timings)) expect(ms).toBeLessThan(SMTP_TIMEOUTS.greetingTimeout);

      // The silent server holds an attempt until the greeting timeout; the job is then retried.
      const held = await until(
        "an attempt on the silent server gives up",
        async () => (await jobsTo(recipients)).find((j) => j.retry_count >= 1 && /greeting/i.test(JSON.stringify(j.output))),
        6 * SMTP_TIMEOUTS.greetingTimeout,
      );
      expect(held.state).toMatch(/^(retry|created|active)$/);
      const waiting = (await jobsTo(recipients)).filter((j) => j.state !== "completed");
      expect(new Set(waiting.map((j) => j.to))).toEqual(new Set(recipients));
      expect((await mailTo(invitedWhileDown)).length + (await mailTo(linkUser.email)).length + (await mailTo(invitedWhileSilent)).length).toBe(0);

      await setSmtp("up");
      // Back-off: the n-th retry waits 2ⁿ to 2ⁿ⁺¹ s, so a few retries in, a minute is ample.
      const [invited] = await waitForMails(invitedWhileDown, INVITE, 1, 90_000);
      const [digest] = await waitForMails(owner.user.email, DIGEST, 2, 90_000);
      const [signIn] = await waitForMails(linkUser.email, SIGN_IN, 1, 90_000);
      const [invitedSilent] = await waitForMails(invitedWhileSilent, INVITE, 1, 90_000);
      expect(digest.text).toContain("Breathe before the long note");
      expect(signIn.links.some((l) => l.startsWith(`${APP_URL}/sign-in/link?token=`))).toBe(true);

      // Every job done, and a moment later still one message each: at-least-once without a copy.
      const done = await until("every job is done", async () => {
        const jobs = await jobsTo(recipients);
        return jobs.length >= recipients.length && jobs.every((j) => j.state === "completed") && jobs;
      }, 30_000);
      await new Promise((r) => setTimeout(r, 3_000));
      const count = async (to: string, subject: RegExp) => (await mailTo(to)).filter((m: CaughtMail) => subject.test(m.subject)).length;
      expect(await count(invitedWhileDown, INVITE)).toBe(1);
      expect(await count(invitedWhileSilent, INVITE)).toBe(1);
      expect(await count(linkUser.email, SIGN_IN)).toBe(1);
      expect(await count(owner.user.email, DIGEST)).toBe(2); // the acceptance's and the comment's
      // Each message carries its job's id, the handle a receiver dedupes by.
      const byId = new Map(done.map((j) => [messageIdFor(j.id, APP_URL), j.to]));
      for (const mail of [invited, digest, signIn, invitedSilent]) expect(byId.get(mail.messageId!)).toBe(mail.to[0]);
    }, 180_000);
  });
});
