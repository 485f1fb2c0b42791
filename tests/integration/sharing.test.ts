import fs from "node:fs";
import path from "node:path";
import { and, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { markingHistory, notifications, proposals, shares, users } from "@/db/schema";
import { DEFAULT_MARKING } from "@/lib/markings/schema";
import { COMMENT_MAX_LENGTH } from "@/lib/sharing/comment-text";
import { multipartFile } from "../helpers/parts";
import { createSignedInUser, type ApiClient, type TestUser } from "../helpers/session";
import { accept, invite, json, mailTo, passEmailWindow, sha256, waitForMails } from "../helpers/sharing";

const DIGEST = /new(?: items)? on “/;

const FIXTURE = path.resolve("tests/fixtures/sharing/two-bars.musicxml");

async function newPart(owner: ApiClient) {
  const res = await owner.fetch("/api/parts", { method: "POST", body: multipartFile("two-bars.musicxml", new Uint8Array(fs.readFileSync(FIXTURE))) });
  expect(res.status).toBe(201);
  const created = await res.json();
  const analysis = await (await owner.fetch(`/api/parts/${created.id}/analysis`)).json();
  const keys: string[] = analysis.notes.map((n: { key: string }) => n.key);
  expect(keys.length).toBeGreaterThan(4);
  return { partId: created.id as string, keys };
}

async function person(role: "player" | "teacher") {
  return createSignedInUser({ role });
}

describe("invitations", () => {
  let owner: { user: TestUser; client: ApiClient };
  let teacher: { user: TestUser; client: ApiClient };
  let stranger: { user: TestUser; client: ApiClient };
  let partId: string;

  beforeAll(async () => {
    [owner, teacher, stranger] = await Promise.all([person("player"), person("teacher"), person("teacher")]);
    ({ partId } = await newPart(owner.client));
  });

  it("mails a link whose token is stored only as its SHA-256, valid for 14 days", async () => {
    const { share, token, mail } = await invite(owner.client, partId, teacher.user.email, "comment");
    expect(share).toMatchObject({ email: teacher.user.email, permission: "comment", status: "pending" });
    expect(mail.text).toContain(`/share/accept?token=`);
    expect(Buffer.from(token, "base64url").length).toBe(32);
    const [row] = await db().select().from(shares).where(eq(shares.id, share.id));
    expect(row.tokenHash).toBe(sha256(token));
    expect(JSON.stringify(row)).not.toContain(token);
    const days = (row.expiresAt.getTime() - row.createdAt.getTime()) / 86_400_000;
    expect(days).toBeGreaterThan(13.99);
    expect(days).toBeLessThan(14.01);
    const list = await (await owner.client.fetch(`/api/parts/${partId}/shares`)).json();
    expect(list.shares.map((s: { email: string }) => s.email)).toContain(teacher.user.email);
  });

  it("refuses the wrong address without using the token, then lets the right one accept once", async () => {
    const { partId: pid } = await newPart(owner.client);
    const { share, token } = await invite(owner.client, pid, teacher.user.email, "comment");

    const wrong = await accept(stranger.client, token);
    expect(wrong.status).toBe(403);
    const wrongBody = await wrong.json();
    expect(wrongBody.code).toBe("forbidden:invitation_email");
    expect(wrongBody.message).toContain(teacher.user.email);
    const [untouched] = await db().select().from(shares).where(eq(shares.id, share.id));
    expect(untouched.acceptedAt).toBeNull();
    expect((await stranger.client.fetch(`/api/parts/${pid}`)).status).toBe(404);

    expect((await teacher.client.fetch(`/api/parts/${pid}`)).status).toBe(404);
    const ok = await accept(teacher.client, token);
    expect(ok.status).toBe(200);
    expect((await ok.json()).partId).toBe(pid);
    const part = await (await teacher.client.fetch(`/api/parts/${pid}`)).json();
    expect(part.permission).toBe("comment");

    const again = await accept(teacher.client, token);
    expect(again.status).toBe(409);
    expect((await again.json()).code).toBe("conflict:invitation_used");
    const other = await accept(stranger.client, token);
    expect(other.status).toBe(409);
    expect((await other.json()).message).toMatch(/already been used/);
  });

  it("refuses an expired invitation with a message and leaves it unused", async () => {
    const { partId: pid } = await newPart(owner.client);
    const { share, token } = await invite(owner.client, pid, teacher.user.email, "propose");
    await db().update(shares).set({ expiresAt: new Date(Date.now() - 60_000) }).where(eq(shares.id, share.id));
    const res = await accept(teacher.client, token);
    expect(res.status).toBe(400);
    const body = await res.json();
    expect(body.code).toBe("bad_request:invitation_expired");
    expect(body.message).toMatch(/expired/);
    expect((await teacher.client.fetch(`/api/parts/${pid}`)).status).toBe(404);
    const listed = await (await owner.client.fetch(`/api/parts/${pid}/shares`)).json();
    expect(listed.shares[0].status).toBe("expired");
  });

  it("answers an unknown token with 404 and a message", async () => {
    const res = await accept(teacher.client, "x".repeat(43));
    expect(res.status).toBe(404);
    expect((await res.json()).code).toBe("not_found:invitation");
  });

  it("resends with a new token (the old link stops working), but not twice in a minute", async () => {
    const { partId: pid } = await newPart(owner.client);
    const { share, token: first } = await invite(owner.client, pid, teacher.user.email, "comment");
    const soon = await owner.client.fetch(`/api/parts/${pid}/shares/${share.id}/resend`, { method: "POST" });
    expect(soon.status).toBe(429);
    await db().update(shares).set({ lastSentAt: new Date(Date.now() - 120_000) }).where(eq(shares.id, share.id));
    const before = (await mailTo(teacher.user.email)).length;
    const resent = await owner.client.fetch(`/api/parts/${pid}/shares/${share.id}/resend`, { method: "POST" });
    expect(resent.status).toBe(200);
    const mails = await waitForMails(teacher.user.email, /shares/, before + 1);
    const second = new URL(mails[0].links.find((l) => l.includes("token="))!).searchParams.get("token")!;
    expect(second).not.toBe(first);
    expect((await accept(teacher.client, first)).status).toBe(404);
    expect((await accept(teacher.client, second)).status).toBe(200);
    const afterAccept = await owner.client.fetch(`/api/parts/${pid}/shares/${share.id}/resend`, { method: "POST" });
    expect(afterAccept.status).toBe(409);
  });

  it("refuses sharing with oneself, twice with one address, and by anyone but the owner", async () => {
    const self = await owner.client.fetch(`/api/parts/${partId}/shares`, json({ email: owner.user.email, permission: "comment" }));
    expect(self.status).toBe(400);
    expect((await self.json()).field).toBe("email");
    const twice = await owner.client.fetch(`/api/parts/${partId}/shares`, json({ email: teacher.user.email.toUpperCase(), permission: "comment" }));
    expect(twice.status).toBe(409);
    const bad = await owner.client.fetch(`/api/parts/${partId}/shares`, json({ email: "not an address", permission: "comment" }));
    expect(bad.status).toBe(400);
    expect((await bad.json()).field).toBe("email");
    const perm = await owner.client.fetch(`/api/parts/${partId}/shares`, json({ email: "x@example.test", permission: "edit" }));
    expect((await perm.json()).field).toBe("permission");
    const byStranger = await stranger.client.fetch(`/api/parts/${partId}/shares`, json({ email: "y@example.test", permission: "comment" }));
    expect(byStranger.status).toBe(404);
  });
});

describe("the owner hears that an invitation was accepted", () => {
  it("notifies the owner in the app and by e-mail, and only the owner", async () => {
    const [owner, teacher, listener] = await Promise.all([person("player"), person("teacher"), person("teacher")]);
    const { partId } = await newPart(owner.client);
    const title = (await (await owner.client.fetch(`/api/parts/${partId}`)).json()).title;
    expect(title).toBe("Two Bars for Sharing");
    const { token } = await invite(owner.client, partId, teacher.user.email, "comment");

    // A refused acceptance (another account) tells the owner nothing.
    expect((await accept(listener.client, token)).status).toBe(403);
    expect((await (await owner.client.fetch(`/api/notifications?partId=${partId}`)).json()).items).toEqual([]);

    expect((await accept(teacher.client, token)).status).toBe(200);
    const summary = `${teacher.user.name} accepted your invitation to Two Bars for Sharing`;
    const inApp = await (await owner.client.fetch(`/api/notifications?partId=${partId}`)).json();
    expect(inApp.unread).toBe(1);
    expect(inApp.items).toEqual([
      expect.objectContaining({ kind: "invitation_accepted", summary, actorName: teacher.user.name, read: false, threadKey: "part", url: `/parts/${partId}?thread=part` }),
    ]);
    // The library's badge reads the same per-part count.
    const all = await (await owner.client.fetch(`/api/notifications`)).json();
    expect(all.parts).toContainEqual({ partId, unread: 1 });
    // Nobody is told of their own acceptance.
    expect((await (await teacher.client.fetch(`/api/notifications?partId=${partId}`)).json()).items).toEqual([]);

    // The batched e-mail goes out at once: nothing was e-mailed about this part to the owner before.
    const [mail] = await waitForMails(owner.user.email, DIGEST, 1);
    expect(mail.subject).toBe("Something new on “Two Bars for Sharing”");
    expect(mail.text).toContain(summary);
    expect(mail.links.some((l) => l.endsWith(`/parts/${partId}?thread=part`))).toBe(true);
    expect((await mailTo(teacher.user.email)).filter((m) => DIGEST.test(m.subject))).toEqual([]);

    // Opening the whole part's thread reads it, as the workspace's Discussion tab does.
    const read = await owner.client.fetch(`/api/notifications/read`, json({ partId, thread: "part" }));
    expect((await read.json()).updated).toBe(1);
    expect((await (await owner.client.fetch(`/api/notifications?partId=${partId}`)).json()).unread).toBe(0);
  });

  it("is not repeated when the same invitation is tried again", async () => {
    const [owner, teacher] = await Promise.all([person("player"), person("teacher")]);
    const { partId } = await newPart(owner.client);
    const { token } = await invite(owner.client, partId, teacher.user.email, "propose");
    const [first, second] = await Promise.all([accept(teacher.client, token), accept(teacher.client, token)]);
    expect([first.status, second.status].sort()).toEqual([200, 409]);
    const rows = await db().select().from(notifications).where(and(eq(notifications.partId, partId), eq(notifications.kind, "invitation_accepted")));
    expect(rows).toHaveLength(1);
    expect(rows[0].userId).toBe(owner.user.id);
  });
});

describe("withdrawing a proposal", () => {
  let owner: { user: TestUser; client: ApiClient };
  let teacher: { user: TestUser; client: ApiClient };
  let listener: { user: TestUser; client: ApiClient };
  let stranger: { user: TestUser; client: ApiClient };
  let partId: string;
  let keys: string[];

  beforeAll(async () => {
    [owner, teacher, listener, stranger] = await Promise.all([person("player"), person("teacher"), person("teacher"), person("teacher")]);
    ({ partId, keys } = await newPart(owner.client));
    const a = await invite(owner.client, partId, teacher.user.email, "propose");
    expect((await accept(teacher.client, a.token)).status).toBe(200);
    const b = await invite(owner.client, partId, listener.user.email, "propose");
    expect((await accept(listener.client, b.token)).status).toBe(200);
  });

  const base = () => `/api/parts/${partId}/proposals`;
  async function propose(noteKey: string, depthCents = 25, by = teacher.client) {
    const markings = (await (await owner.client.fetch(`/api/parts/${partId}/markings`)).json()).markings as { noteKey: string; version: number }[];
    const baseVersion = markings.find((m) => m.noteKey === noteKey)?.version ?? null;
    const res = await by.fetch(base(), json({ noteKey, baseVersion, marking: { ...DEFAULT_MARKING, depthCents }, comment: "Try this." }));
    expect(res.status).toBe(201);
    return (await res.json()) as { id: string };
  }
  const act = (client: ApiClient, proposalId: string, action: "accept" | "decline" | "withdraw") =>
    client.fetch(`${base()}/${proposalId}/${action}`, action === "decline" ? json({ reply: "" }) : { method: "POST" });
  const openCount = async (noteKey: string) => {
    const summary = await (await owner.client.fetch(`/api/parts/${partId}/comments/summary`)).json();
    return summary.threads.find((t: { threadKey: string }) => t.threadKey === noteKey)?.openProposals ?? 0;
  };

  it("lets the author withdraw an open proposal; the owner can then neither accept nor decline it", async () => {
    const key = keys[0];
    const made = await propose(key);
    expect(await openCount(key)).toBe(1);

    const res = await act(teacher.client, made.id, "withdraw");
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body).toMatchObject({ id: made.id, status: "withdrawn", stale: false });
    expect(body.decidedAt).not.toBeNull();
    expect(await openCount(key)).toBe(0);

    const listed = await (await owner.client.fetch(`${base()}?status=withdrawn`)).json();
    expect(listed.proposals.map((p: { id: string }) => p.id)).toEqual([made.id]);

    for (const action of ["accept", "decline"] as const) {
      const refused = await act(owner.client, made.id, action);
      expect(refused.status, action).toBe(409);
      expect(await refused.json()).toEqual({
        code: "conflict:proposal_withdrawn",
        message: `${teacher.user.name} withdrew this proposal, so there is nothing to ${action}.`,
      });
    }
    // Nothing was applied and the proposal is still withdrawn, with no reply.
    const markings = (await (await owner.client.fetch(`/api/parts/${partId}/markings`)).json()).markings as { noteKey: string }[];
    expect(markings.find((m) => m.noteKey === key)).toBeUndefined();
    expect((await db().select().from(markingHistory).where(eq(markingHistory.proposalId, made.id))).length).toBe(0);
    const [stored] = await db().select().from(proposals).where(eq(proposals.id, made.id));
    expect(stored).toMatchObject({ status: "withdrawn", reply: null });

    const again = await act(teacher.client, made.id, "withdraw");
    expect(again.status).toBe(409);
    expect((await again.json()).message).toBe("You have already withdrawn this proposal.");
  });

  it("refuses to withdraw an accepted or declined proposal with 409", async () => {
    const accepted = await propose(keys[1]);
    expect((await act(owner.client, accepted.id, "accept")).status).toBe(200);
    const late = await act(teacher.client, accepted.id, "withdraw");
    expect(late.status).toBe(409);
    const lateBody = await late.json();
    expect(lateBody.code).toBe("conflict:proposal_decided");
    expect(lateBody.message).toMatch(/already been accepted, so it can no longer be withdrawn/);

    const declined = await propose(keys[2]);
    expect((await act(owner.client, declined.id, "decline")).status).toBe(200);
    const afterDecline = await act(teacher.client, declined.id, "withdraw");
    expect(afterDecline.status).toBe(409);
    expect((await afterDecline.json()).message).toMatch(/already been declined/);
    const [stored] = await db().select().from(proposals).where(eq(proposals.id, declined.id));
    expect(stored.status).toBe("declined");
  });

  it("lets only the author withdraw: the owner and another sharer get 403, a stranger 404", async () => {
    const made = await propose(keys[3]);
    const byOwner = await act(owner.client, made.id, "withdraw");
    expect(byOwner.status).toBe(403);
    expect((await byOwner.json()).message).toMatch(/Only the person who made this proposal can withdraw it/);
    expect((await act(listener.client, made.id, "withdraw")).status).toBe(403);
    expect((await act(stranger.client, made.id, "withdraw")).status).toBe(404);
    expect((await teacher.client.fetch(`${base()}/not-a-uuid/withdraw`, { method: "POST" })).status).toBe(400);
    expect((await teacher.client.fetch(`${base()}/00000000-0000-4000-8000-000000000000/withdraw`, { method: "POST" })).status).toBe(404);
    const [stored] = await db().select().from(proposals).where(eq(proposals.id, made.id));
    expect(stored.status).toBe("open");
  });

  it("lets the author take back a proposal that went stale", async () => {
    const key = keys[4];
    const url = `/api/parts/${partId}/markings/${encodeURIComponent(key)}`;
    const v1 = (await (await owner.client.fetch(url, json({ ...DEFAULT_MARKING, depthCents: 10 }, "PUT"))).json()).marking;
    const made = await propose(key, 40);
    await owner.client.fetch(url, json({ ...DEFAULT_MARKING, depthCents: 15, version: v1.version }, "PUT"));
    expect((await act(owner.client, made.id, "accept")).status).toBe(409);
    const [stale] = await db().select().from(proposals).where(eq(proposals.id, made.id));
    expect(stale.status).toBe("stale");
    const res = await act(teacher.client, made.id, "withdraw");
    expect(res.status).toBe(200);
    expect((await res.json()).status).toBe("withdrawn");
  });

  it("lets exactly one of an accept and a withdrawal at the same moment win", async () => {
    for (let i = 0; i < 3; i++) {
      const key = keys[5 + i];
      const made = await propose(key, 20 + i);
      const [accepted, withdrawn] = await Promise.all([act(owner.client, made.id, "accept"), act(teacher.client, made.id, "withdraw")]);
      expect([accepted.status, withdrawn.status].sort()).toEqual([200, 409]);
      const [stored] = await db().select().from(proposals).where(eq(proposals.id, made.id));
      const markings = (await (await owner.client.fetch(`/api/parts/${partId}/markings`)).json()).markings as { noteKey: string; depthCents: number }[];
      if (accepted.status === 200) {
        expect(stored.status).toBe("accepted");
        expect(markings.find((m) => m.noteKey === key)?.depthCents).toBe(20 + i);
      } else {
        expect(stored.status).toBe("withdrawn");
        expect((await accepted.json()).code).toBe("conflict:proposal_withdrawn");
        expect(markings.find((m) => m.noteKey === key)).toBeUndefined();
      }
    }
  });
});

describe("comments, proposals and revocation", () => {
  let owner: { user: TestUser; client: ApiClient };
  let teacher: { user: TestUser; client: ApiClient };
  let listener: { user: TestUser; client: ApiClient };
  let partId: string;
  let keys: string[];
  let shareId: string;
  let listenerShareId: string;

  beforeAll(async () => {
    [owner, teacher, listener] = await Promise.all([person("player"), person("teacher"), person("teacher")]);
    ({ partId, keys } = await newPart(owner.client));
    const a = await invite(owner.client, partId, teacher.user.email, "propose");
    shareId = a.share.id;
    expect((await accept(teacher.client, a.token)).status).toBe(200);
    const b = await invite(owner.client, partId, listener.user.email, "comment");
    listenerShareId = b.share.id;
    expect((await accept(listener.client, b.token)).status).toBe(200);
  });

  const threadUrl = (thread: string) => `/api/parts/${partId}/comments?thread=${encodeURIComponent(thread)}`;

  it("keeps a thread per note and one for the part, as plain text with line breaks", async () => {
    const body = "Lighter here.\r\nLet the **top** breathe. <i>no markup</i>";
    const res = await teacher.client.fetch(threadUrl(keys[0]), json({ body }));
    expect(res.status).toBe(201);
    expect((await res.json()).body).toBe("Lighter here.\nLet the **top** breathe. <i>no markup</i>");
    expect((await owner.client.fetch(threadUrl("part"), json({ body: "Thanks for looking!" }))).status).toBe(201);

    const note = await (await owner.client.fetch(threadUrl(keys[0]))).json();
    expect(note.comments).toHaveLength(1);
    expect(note.comments[0].authorName).toBe(teacher.user.name);
    const whole = await (await listener.client.fetch(threadUrl("part"))).json();
    expect(whole.comments[0].body).toBe("Thanks for looking!");

    const summary = await (await owner.client.fetch(`/api/parts/${partId}/comments/summary`)).json();
    expect(summary.threads).toEqual(
      expect.arrayContaining([
        expect.objectContaining({ threadKey: keys[0], count: 1, unresolved: true }),
        expect.objectContaining({ threadKey: "part", count: 1, unresolved: true }),
      ]),
    );
  });

  it("refuses unknown note keys, empty and overlong comments", async () => {
    expect((await teacher.client.fetch(threadUrl("P9:m999:s1:v1:0/1:60"))).status).toBe(404);
    expect((await teacher.client.fetch(threadUrl("P9:m999:s1:v1:0/1:60"), json({ body: "x" }))).status).toBe(404);
    const empty = await teacher.client.fetch(threadUrl(keys[1]), json({ body: " \n " }));
    expect(empty.status).toBe(400);
    expect((await empty.json()).field).toBe("body");
    const long = await teacher.client.fetch(threadUrl(keys[1]), json({ body: "a".repeat(COMMENT_MAX_LENGTH + 1) }));
    expect(long.status).toBe(400);
  });

  it("lets people edit and delete only their own comments, and resolve a thread", async () => {
    const created = await (await teacher.client.fetch(threadUrl(keys[2]), json({ body: "Fist draft" }))).json();
    const edited = await teacher.client.fetch(`/api/parts/${partId}/comments/${created.id}`, json({ body: "First draft" }, "PATCH"));
    expect(edited.status).toBe(200);
    expect(await edited.json()).toMatchObject({ body: "First draft", edited: true });
    expect((await owner.client.fetch(`/api/parts/${partId}/comments/${created.id}`, json({ body: "mine now" }, "PATCH"))).status).toBe(403);
    expect((await listener.client.fetch(`/api/parts/${partId}/comments/${created.id}`, { method: "DELETE" })).status).toBe(403);

    const resolved = await listener.client.fetch(`/api/parts/${partId}/threads/resolve`, json({ thread: keys[2] }));
    expect(resolved.status).toBe(200);
    expect((await resolved.json()).resolved).toBe(true);
    let summary = await (await owner.client.fetch(`/api/parts/${partId}/comments/summary`)).json();
    expect(summary.threads.find((t: { threadKey: string }) => t.threadKey === keys[2]).unresolved).toBe(false);
    // A new comment reopens the thread.
    await owner.client.fetch(threadUrl(keys[2]), json({ body: "One more thing" }));
    summary = await (await owner.client.fetch(`/api/parts/${partId}/comments/summary`)).json();
    expect(summary.threads.find((t: { threadKey: string }) => t.threadKey === keys[2])).toMatchObject({ count: 2, unresolved: true });

    expect((await teacher.client.fetch(`/api/parts/${partId}/comments/${created.id}`, { method: "DELETE" })).status).toBe(200);
    const thread = await (await owner.client.fetch(threadUrl(keys[2]))).json();
    expect(thread.comments.map((c: { body: string }) => c.body)).toEqual(["One more thing"]);
  });

  it("lets a propose sharer propose, refuses a comment sharer, and no sharer writes markings", async () => {
    const marking = { ...DEFAULT_MARKING, depthCents: 12, role: "peak" as const };
    const byListener = await listener.client.fetch(`/api/parts/${partId}/proposals`, json({ noteKey: keys[3], baseVersion: null, marking }));
    expect(byListener.status).toBe(403);
    const byOwner = await owner.client.fetch(`/api/parts/${partId}/proposals`, json({ noteKey: keys[3], baseVersion: null, marking }));
    expect(byOwner.status).toBe(403);
    for (const c of [teacher.client, listener.client]) {
      const put = await c.fetch(`/api/parts/${partId}/markings/${encodeURIComponent(keys[3])}`, json(marking, "PUT"));
      expect(put.status).toBe(403);
    }
    const wrongBase = await teacher.client.fetch(`/api/parts/${partId}/proposals`, json({ noteKey: keys[3], baseVersion: 4, marking }));
    expect(wrongBase.status).toBe(409);
    const made = await teacher.client.fetch(`/api/parts/${partId}/proposals`, json({ noteKey: keys[3], baseVersion: null, marking, comment: "A peak here." }));
    expect(made.status).toBe(201);
    const proposal = await made.json();
    expect(proposal).toMatchObject({ status: "open", stale: false, current: null, proposed: { depthCents: 12, role: "peak" } });
    expect((await teacher.client.fetch(`/api/parts/${partId}/proposals/${proposal.id}/accept`, { method: "POST" })).status).toBe(403);

    const accepted = await owner.client.fetch(`/api/parts/${partId}/proposals/${proposal.id}/accept`, { method: "POST" });
    expect(accepted.status).toBe(200);
    const result = await accepted.json();
    expect(result.marking).toMatchObject({ noteKey: keys[3], depthCents: 12, role: "peak" });
    expect(result.proposal.status).toBe("accepted");
    const history = await (await owner.client.fetch(`/api/parts/${partId}/history`)).json();
    expect(history.entries[0]).toMatchObject({ noteKey: keys[3], proposalId: proposal.id, proposedByName: teacher.user.name, actorName: owner.user.name });
    const [row] = await db().select().from(markingHistory).where(eq(markingHistory.proposalId, proposal.id));
    expect(row.action).toBe("create");
    const twice = await owner.client.fetch(`/api/parts/${partId}/proposals/${proposal.id}/accept`, { method: "POST" });
    expect(twice.status).toBe(409);
  });

  it("marks a proposal stale when the marking changed since, answers 409 and applies nothing", async () => {
    const key = keys[4];
    const url = `/api/parts/${partId}/markings/${encodeURIComponent(key)}`;
    const v1 = (await (await owner.client.fetch(url, json({ ...DEFAULT_MARKING, depthCents: 10 }, "PUT"))).json()).marking;
    const made = await (
      await teacher.client.fetch(`/api/parts/${partId}/proposals`, json({ noteKey: key, baseVersion: v1.version, marking: { ...DEFAULT_MARKING, depthCents: 40 } }))
    ).json();
    // The player changes the note after the proposal was made.
    await owner.client.fetch(url, json({ ...DEFAULT_MARKING, depthCents: 15, version: v1.version }, "PUT"));

    const listed = await (await owner.client.fetch(`/api/parts/${partId}/proposals?note=${encodeURIComponent(key)}`)).json();
    expect(listed.proposals[0]).toMatchObject({ id: made.id, status: "open", stale: true, current: { depthCents: 15 } });

    const res = await owner.client.fetch(`/api/parts/${partId}/proposals/${made.id}/accept`, { method: "POST" });
    expect(res.status).toBe(409);
    const body = await res.json();
    expect(body.code).toBe("conflict:proposal_stale");
    expect(body.current).toMatchObject({ depthCents: 15 });
    expect(body.proposal).toMatchObject({ status: "stale", stale: true });
    const marking = await (await owner.client.fetch(`/api/parts/${partId}/markings`)).json();
    expect(marking.markings.find((m: { noteKey: string }) => m.noteKey === key).depthCents).toBe(15);
    const [stored] = await db().select().from(proposals).where(eq(proposals.id, made.id));
    expect(stored.status).toBe("stale");
    expect((await db().select().from(markingHistory).where(eq(markingHistory.proposalId, made.id))).length).toBe(0);

    const declined = await owner.client.fetch(`/api/parts/${partId}/proposals/${made.id}/decline`, json({ reply: "I changed it already,\nsee the new depth." }));
    expect(declined.status).toBe(200);
    expect(await declined.json()).toMatchObject({ status: "declined", reply: "I changed it already,\nsee the new depth." });
  });

  it("notifies the other side, counts unread per part and marks them read", async () => {
    const unread = await (await owner.client.fetch(`/api/notifications?partId=${partId}`)).json();
    expect(unread.unread).toBeGreaterThan(0);
    expect(unread.items.some((i: { kind: string; url: string }) => i.kind === "proposal" && i.url.includes("?note="))).toBe(true);
    const teacherSide = await (await teacher.client.fetch(`/api/notifications?partId=${partId}`)).json();
    expect(teacherSide.items.map((i: { kind: string }) => i.kind)).toEqual(expect.arrayContaining(["comment", "proposal_accepted", "proposal_declined"]));
    // Nobody is notified of their own actions.
    expect(teacherSide.items.every((i: { actorName: string }) => i.actorName !== teacher.user.name)).toBe(true);

    const all = await (await owner.client.fetch(`/api/notifications`)).json();
    expect(all.parts.find((p: { partId: string }) => p.partId === partId).unread).toBe(unread.unread);
    const read = await owner.client.fetch(`/api/notifications/read`, json({ partId }));
    expect((await read.json()).updated).toBe(unread.unread);
    expect((await (await owner.client.fetch(`/api/notifications?partId=${partId}`)).json()).unread).toBe(0);

    const studio = await (await teacher.client.fetch(`/api/shared-parts`)).json();
    const group = studio.students.find((s: { ownerId: string }) => s.ownerId === owner.user.id);
    expect(group.parts[0]).toMatchObject({ partId, permission: "propose" });
    expect(group.parts[0].unread).toBe(teacherSide.unread);
  });

  it("changes a permission, and a revoked sharer gets 404 on the very next request", async () => {
    const down = await owner.client.fetch(`/api/parts/${partId}/shares/${shareId}`, json({ permission: "comment" }, "PATCH"));
    expect((await down.json()).permission).toBe("comment");
    const refused = await teacher.client.fetch(`/api/parts/${partId}/proposals`, json({ noteKey: keys[0], baseVersion: null, marking: DEFAULT_MARKING }));
    expect(refused.status).toBe(403);

    expect((await teacher.client.fetch(`/api/parts/${partId}`)).status).toBe(200);
    const revoked = await owner.client.fetch(`/api/parts/${partId}/shares/${shareId}`, { method: "DELETE" });
    expect(revoked.status).toBe(200);
    for (const path of ["", "/musicxml", "/markings", "/comments/summary", `/comments?thread=part`, "/proposals", "/history"]) {
      expect((await teacher.client.fetch(`/api/parts/${partId}${path}`)).status, path).toBe(404);
    }
    expect((await teacher.client.fetch(threadUrl("part"), json({ body: "still here?" }))).status).toBe(404);
    expect((await teacher.client.fetch(`/api/notifications?partId=${partId}`)).status).toBe(404);
    const studio = await (await teacher.client.fetch(`/api/shared-parts`)).json();
    expect(studio.students.some((s: { ownerId: string }) => s.ownerId === owner.user.id)).toBe(false);
    const list = await (await owner.client.fetch(`/api/parts/${partId}/shares`)).json();
    expect(list.shares.map((s: { id: string }) => s.id)).toEqual([listenerShareId]);
    // The other sharer keeps access.
    expect((await listener.client.fetch(`/api/parts/${partId}`)).status).toBe(200);
  });
});

describe("notification e-mail batching", () => {
  it("sends one e-mail for two comments in a row, another after the window, and none when turned off", async () => {
    const owner = await person("player");
    const teacher = await person("teacher");
    const { partId, keys } = await newPart(owner.client);
    const { token } = await invite(owner.client, partId, teacher.user.email, "comment");
    expect((await accept(teacher.client, token)).status).toBe(200);
    // The acceptance is the pair's first e-mail; the comments below start after its window.
    await waitForMails(owner.user.email, DIGEST, 1);
    await passEmailWindow(owner.user.id, partId);
    const url = `/api/parts/${partId}/comments?thread=${encodeURIComponent(keys[1])}`;

    expect((await teacher.client.fetch(url, json({ body: "First thought" }))).status).toBe(201);
    expect((await teacher.client.fetch(url, json({ body: "Second thought" }))).status).toBe(201);
    const first = await waitForMails(owner.user.email, DIGEST, 2);
    await new Promise((r) => setTimeout(r, 300));
    expect((await mailTo(owner.user.email)).filter((m) => DIGEST.test(m.subject))).toHaveLength(2);
    expect(first[0].text).toContain("First thought");
    expect(first[0].text).not.toContain("Second thought");
    expect(first[0].links.some((l) => l.includes(`/parts/${partId}?note=${encodeURIComponent(keys[1])}`))).toBe(true);

    // The flush within the window sends nothing.
    const early = await (await fetch(new URL("/api/internal/flush-notifications", process.env.APP_URL), { method: "POST" })).json();
    expect((await mailTo(owner.user.email)).filter((m) => DIGEST.test(m.subject))).toHaveLength(2);
    expect(early.sent).toBeGreaterThanOrEqual(0);

    await passEmailWindow(owner.user.id, partId);
    const flushed = await fetch(new URL("/api/internal/flush-notifications", process.env.APP_URL), { method: "POST" });
    expect(flushed.status).toBe(200);
    const second = await waitForMails(owner.user.email, DIGEST, 3);
    expect(second[0].text).toContain("Second thought");
    expect(second[0].text).not.toContain("First thought");

    // After the window, the next event itself sends at once.
    await passEmailWindow(owner.user.id, partId);
    await teacher.client.fetch(url, json({ body: "Third thought" }));
    const third = await waitForMails(owner.user.email, DIGEST, 4);
    expect(third[0].text).toContain("Third thought");

    // E-mail turned off: the notification is in the app, no message goes out.
    await db().update(users).set({ emailNotifications: false }).where(eq(users.id, owner.user.id));
    await passEmailWindow(owner.user.id, partId);
    await teacher.client.fetch(url, json({ body: "Fourth thought" }));
    await new Promise((r) => setTimeout(r, 300));
    expect((await mailTo(owner.user.email)).filter((m) => DIGEST.test(m.subject))).toHaveLength(4);
    const inApp = await (await owner.client.fetch(`/api/notifications?partId=${partId}`)).json();
    expect(inApp.items[0].summary).toContain("Fourth thought");
  });
});
