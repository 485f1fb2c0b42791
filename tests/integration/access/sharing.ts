import { createHash } from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { shares } from "@/db/schema";
import { DEFAULT_MARKING } from "@/lib/markings/schema";
import { statuses, type AccessModule, type MatrixContext, type Persona } from "../../helpers/access-matrix";
import { multipartFile } from "../../helpers/parts";
import { createUser, signIn, uniqueEmail, type ApiClient } from "../../helpers/session";

/** Invitations, comments, proposals, notifications and the studio's list of shared parts. */

interface SharingData {
  partId: string;
  keys: string[];
  /** A part of a bystander's, for invitations any persona may accept. */
  otherPartId: string;
}

const FIXTURE = path.resolve("tests/fixtures/sharing/two-bars.musicxml");
const data = (ctx: MatrixContext) => ctx.data.sharing as SharingData;
const json = (method: string, body: unknown): RequestInit => ({ method, headers: { "content-type": "application/json" }, body: JSON.stringify(body) });

/** Owner and the teacher it is shared with see it; nobody else learns it exists. */
const view = statuses(404, { anonymous: 401, owner: 200, teacherWithAccess: 200 });
/** The owner only; the sharer sees the part but may not do this. */
const ownerOnly = (ok: number) => statuses(404, { anonymous: 401, owner: ok, teacherWithAccess: 403 });
/** Owner and sharer alike. */
const participants = (ok: number) => statuses(404, { anonymous: 401, owner: ok, teacherWithAccess: ok });
const signedIn = statuses(200, { anonymous: 401 });

async function upload(client: ApiClient): Promise<string> {
  const res = await client.fetch("/api/parts", { method: "POST", body: multipartFile("two-bars.musicxml", new Uint8Array(fs.readFileSync(FIXTURE))) });
  if (res.status !== 201) throw new Error(`upload answered ${res.status}`);
  return (await res.json()).id;
}

const owner = (ctx: MatrixContext) => ctx.clients.owner.clone();
const teacher = (ctx: MatrixContext) => ctx.clients.teacherWithAccess.clone();

/** A pending invitation of the owner's part, made fresh for one cell. */
async function freshShare(ctx: MatrixContext, { sentLongAgo = false } = {}): Promise<string> {
  const res = await owner(ctx).fetch(`/api/parts/${data(ctx).partId}/shares`, json("POST", { email: uniqueEmail("invitee"), permission: "comment" }));
  const { id } = await res.json();
  if (sentLongAgo) await db().update(shares).set({ lastSentAt: new Date(Date.now() - 3_600_000) }).where(eq(shares.id, id));
  return id;
}

async function ownersComment(ctx: MatrixContext): Promise<string> {
  const res = await owner(ctx).fetch(`/api/parts/${data(ctx).partId}/comments?thread=part`, json("POST", { body: "A comment of the owner's." }));
  return (await res.json()).id;
}

let keyCursor = 0;

/** An open proposal by the teacher against the note's current marking. */
async function freshProposal(ctx: MatrixContext): Promise<string> {
  const { partId, keys } = data(ctx);
  const noteKey = keys[keyCursor++ % keys.length];
  const markings = await (await owner(ctx).fetch(`/api/parts/${partId}/markings`)).json();
  const current = markings.markings.find((m: { noteKey: string }) => m.noteKey === noteKey);
  const res = await teacher(ctx).fetch(
    `/api/parts/${partId}/proposals`,
    json("POST", { noteKey, baseVersion: current?.version ?? null, marking: { ...DEFAULT_MARKING, depthCents: 10 + (keyCursor % 50) } }),
  );
  if (res.status !== 201) throw new Error(`proposal answered ${res.status}: ${await res.text()}`);
  return (await res.json()).id;
}

/** An invitation to the bystander's part for this persona's address, with its raw token. */
async function invitationFor(ctx: MatrixContext, persona: Persona): Promise<string> {
  const token = `matrix-token-${Math.random().toString(36).slice(2)}-${Date.now()}`;
  const bystander = ctx.data.sharingBystander as { id: string };
  await db().insert(shares).values({
    partId: data(ctx).otherPartId,
    email: persona === "anonymous" ? uniqueEmail("anon") : ctx.users[persona].email,
    permission: "comment",
    tokenHash: createHash("sha256").update(token, "utf8").digest("hex"),
    invitedBy: bystander.id,
    expiresAt: new Date(Date.now() + 86_400_000),
  });
  return token;
}

export const accessModule: AccessModule = {
  async setup(ctx) {
    const partId = await upload(owner(ctx));
    const analysis = await (await owner(ctx).fetch(`/api/parts/${partId}/analysis`)).json();
    await db().insert(shares).values({
      partId,
      email: ctx.users.teacherWithAccess.email,
      permission: "propose",
      tokenHash: `matrix-sharing-${partId}`,
      invitedBy: ctx.users.owner.id,
      userId: ctx.users.teacherWithAccess.id,
      acceptedAt: new Date(),
      expiresAt: new Date(Date.now() + 86_400_000),
    });
    // The part thread exists, so resolving it is meaningful for everyone who may.
    await owner(ctx).fetch(`/api/parts/${partId}/comments?thread=part`, json("POST", { body: "Welcome." }));
    const bystander = await createUser({ role: "player", name: "Matrix bystander" });
    const otherPartId = await upload(await signIn(bystander.email, bystander.password));
    ctx.data.sharingBystander = bystander;
    ctx.data.sharing = { partId, keys: analysis.notes.map((n: { key: string }) => n.key), otherPartId } satisfies SharingData;
  },
  routes: [
    { method: "GET", route: "/api/parts/[partId]/shares", request: (ctx) => ({ path: `/api/parts/${data(ctx).partId}/shares` }), expect: ownerOnly(200) },
    {
      method: "POST",
      route: "/api/parts/[partId]/shares",
      request: (ctx) => ({ path: `/api/parts/${data(ctx).partId}/shares`, init: json("POST", { email: uniqueEmail("invitee"), permission: "comment" }) }),
      expect: ownerOnly(201),
    },
    {
      method: "PATCH",
      route: "/api/parts/[partId]/shares/[shareId]",
      request: async (ctx) => ({ path: `/api/parts/${data(ctx).partId}/shares/${await freshShare(ctx)}`, init: json("PATCH", { permission: "propose" }) }),
      expect: ownerOnly(200),
    },
    {
      method: "DELETE",
      route: "/api/parts/[partId]/shares/[shareId]",
      request: async (ctx) => ({ path: `/api/parts/${data(ctx).partId}/shares/${await freshShare(ctx)}` }),
      expect: ownerOnly(200),
    },
    {
      method: "POST",
      route: "/api/parts/[partId]/shares/[shareId]/resend",
      request: async (ctx) => ({ path: `/api/parts/${data(ctx).partId}/shares/${await freshShare(ctx, { sentLongAgo: true })}/resend` }),
      expect: ownerOnly(200),
    },
    {
      method: "POST",
      route: "/api/shares/accept",
      label: "an invitation sent to the caller's own address",
      request: async (ctx, persona) => ({ path: "/api/shares/accept", init: json("POST", { token: await invitationFor(ctx, persona) }) }),
      // Admins keep to accounts and do not take part in sharing.
      expect: statuses(200, { anonymous: 401, admin: 403 }),
    },
    {
      method: "GET",
      route: "/api/parts/[partId]/comments",
      request: (ctx) => ({ path: `/api/parts/${data(ctx).partId}/comments?thread=part` }),
      expect: view,
    },
    {
      method: "POST",
      route: "/api/parts/[partId]/comments",
      request: (ctx) => ({ path: `/api/parts/${data(ctx).partId}/comments?thread=${encodeURIComponent(data(ctx).keys[0])}`, init: json("POST", { body: "Matrix comment" }) }),
      expect: participants(201),
    },
    {
      method: "PATCH",
      route: "/api/parts/[partId]/comments/[commentId]",
      label: "the owner's comment",
      request: async (ctx) => ({ path: `/api/parts/${data(ctx).partId}/comments/${await ownersComment(ctx)}`, init: json("PATCH", { body: "Edited" }) }),
      expect: ownerOnly(200),
    },
    {
      method: "DELETE",
      route: "/api/parts/[partId]/comments/[commentId]",
      label: "the owner's comment",
      request: async (ctx) => ({ path: `/api/parts/${data(ctx).partId}/comments/${await ownersComment(ctx)}` }),
      expect: ownerOnly(200),
    },
    { method: "GET", route: "/api/parts/[partId]/comments/summary", request: (ctx) => ({ path: `/api/parts/${data(ctx).partId}/comments/summary` }), expect: view },
    {
      method: "POST",
      route: "/api/parts/[partId]/threads/resolve",
      request: (ctx) => ({ path: `/api/parts/${data(ctx).partId}/threads/resolve`, init: json("POST", { thread: "part", resolved: true }) }),
      expect: participants(200),
    },
    { method: "GET", route: "/api/parts/[partId]/proposals", request: (ctx) => ({ path: `/api/parts/${data(ctx).partId}/proposals` }), expect: view },
    {
      method: "POST",
      route: "/api/parts/[partId]/proposals",
      request: (ctx) => ({
        path: `/api/parts/${data(ctx).partId}/proposals`,
        // A note nobody marks in this module, so the base version stays "none".
        init: json("POST", { noteKey: data(ctx).keys[data(ctx).keys.length - 1], baseVersion: null, marking: DEFAULT_MARKING }),
      }),
      // Only someone the part is shared with proposes; the owner simply marks.
      expect: statuses(404, { anonymous: 401, owner: 403, teacherWithAccess: 201 }),
    },
    {
      method: "POST",
      route: "/api/parts/[partId]/proposals/[proposalId]/accept",
      request: async (ctx) => ({ path: `/api/parts/${data(ctx).partId}/proposals/${await freshProposal(ctx)}/accept` }),
      expect: ownerOnly(200),
    },
    {
      method: "POST",
      route: "/api/parts/[partId]/proposals/[proposalId]/decline",
      request: async (ctx) => ({ path: `/api/parts/${data(ctx).partId}/proposals/${await freshProposal(ctx)}/decline`, init: json("POST", { reply: "Not now." }) }),
      expect: ownerOnly(200),
    },
    {
      method: "POST",
      route: "/api/parts/[partId]/proposals/[proposalId]/withdraw",
      label: "the teacher's own open proposal",
      request: async (ctx) => ({ path: `/api/parts/${data(ctx).partId}/proposals/${await freshProposal(ctx)}/withdraw` }),
      // Only its author takes a proposal back; the owner declines instead.
      expect: statuses(404, { anonymous: 401, owner: 403, teacherWithAccess: 200 }),
    },
    { method: "GET", route: "/api/notifications", label: "all parts", request: () => ({ path: "/api/notifications" }), expect: signedIn },
    { method: "GET", route: "/api/notifications", label: "one part", request: (ctx) => ({ path: `/api/notifications?partId=${data(ctx).partId}` }), expect: view },
    {
      method: "POST",
      route: "/api/notifications/read",
      label: "only the caller's own notifications change",
      request: (ctx) => ({ path: "/api/notifications/read", init: json("POST", { partId: data(ctx).partId }) }),
      expect: signedIn,
    },
    {
      method: "POST",
      route: "/api/internal/flush-notifications",
      label: "open in development and test; production needs the scheduler's secret",
      request: () => ({ path: "/api/internal/flush-notifications" }),
      expect: statuses(200),
    },
    { method: "GET", route: "/api/shared-parts", request: () => ({ path: "/api/shared-parts" }), expect: signedIn },
  ],
};
