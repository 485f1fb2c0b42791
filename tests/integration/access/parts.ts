import fs from "node:fs";
import path from "node:path";
import { DEFAULT_MARKING } from "@/lib/markings/schema";
import { db } from "@/db/client";
import { shares } from "@/db/schema";
import { statuses, type AccessModule, type MatrixContext, type Persona, type RouteRow } from "../../helpers/access-matrix";
import { multipartFile, SAMPLES_DIR, sampleFiles, uploadSample } from "../../helpers/parts";

/** Parts, markings, history, suggestion decisions and exports. */

interface PartsData {
  partId: string;
  keys: string[];
}

const data = (ctx: MatrixContext) => ctx.data.parts as PartsData;
const json = (method: string, body: unknown): RequestInit => ({ method, headers: { "content-type": "application/json" }, body: JSON.stringify(body) });

/** Owner and the teacher the part is shared with may look; nobody else learns it exists. */
const view = statuses(404, { anonymous: 401, owner: 200, teacherWithAccess: 200 });
/** Only the owner changes the part and its markings; the sharer sees it but may not. */
const ownerOnly = (ok: number) => statuses(404, { anonymous: 401, owner: ok, teacherWithAccess: 403 });
const create = statuses(201, { anonymous: 401, admin: 403 });
const signedIn = statuses(200, { anonymous: 401 });

function sampleBytes(): { name: string; bytes: Uint8Array } {
  const name = sampleFiles().find((n) => n.endsWith(".musicxml"))!;
  return { name, bytes: new Uint8Array(fs.readFileSync(path.join(SAMPLES_DIR, name))) };
}

/** A fresh part of the owner's for cells that change or delete it. */
async function freshPart(ctx: MatrixContext): Promise<string> {
  return (await uploadSample(ctx.clients.owner.clone(), sampleBytes().name)).id;
}

let noteCursor = 0;
const nextKey = (ctx: MatrixContext) => data(ctx).keys[noteCursor++ % data(ctx).keys.length];

const viewRow = (route: string, suffix: string, label?: string): RouteRow => ({
  method: "GET",
  route: `/api/parts/[partId]${route}`,
  label,
  request: (ctx) => ({ path: `/api/parts/${data(ctx).partId}${suffix}` }),
  expect: view,
});

export const accessModule: AccessModule = {
  async setup(ctx) {
    const owner = ctx.clients.owner.clone();
    const created = await uploadSample(owner, sampleBytes().name);
    const analysis = await (await owner.fetch(`/api/parts/${created.id}/analysis`)).json();
    await db().insert(shares).values({
      partId: created.id,
      email: ctx.users.teacherWithAccess.email,
      permission: "propose",
      tokenHash: `matrix-${created.id}`,
      invitedBy: ctx.users.owner.id,
      userId: ctx.users.teacherWithAccess.id,
      acceptedAt: new Date(),
      expiresAt: new Date(Date.now() + 86_400_000),
    });
    ctx.data.parts = { partId: created.id, keys: analysis.notes.map((n: { key: string }) => n.key) } satisfies PartsData;
  },
  routes: [
    { method: "GET", route: "/api/parts", request: () => ({ path: "/api/parts?sort=title" }), expect: signedIn },
    {
      method: "POST",
      route: "/api/parts",
      request: () => {
        const { name, bytes } = sampleBytes();
        return { path: "/api/parts", init: { method: "POST", body: multipartFile(name, bytes) } };
      },
      expect: create,
    },
    { method: "GET", route: "/api/parts/samples", request: () => ({ path: "/api/parts/samples" }), expect: signedIn },
    { method: "POST", route: "/api/parts/samples", request: () => ({ path: "/api/parts/samples", init: json("POST", { name: sampleBytes().name }) }), expect: create },
    viewRow("", ""),
    {
      method: "PATCH",
      route: "/api/parts/[partId]",
      request: (ctx) => ({ path: `/api/parts/${data(ctx).partId}`, init: json("PATCH", { composer: "Matrix composer" }) }),
      expect: ownerOnly(200),
    },
    {
      method: "DELETE",
      route: "/api/parts/[partId]",
      request: async (ctx, persona: Persona) => ({ path: `/api/parts/${persona === "owner" ? await freshPart(ctx) : data(ctx).partId}` }),
      expect: ownerOnly(200),
    },
    viewRow("/musicxml", "/musicxml"),
    viewRow("/note-keys", "/note-keys"),
    viewRow("/source", "/source"),
    viewRow("/analysis", "/analysis"),
    viewRow("/markings", "/markings"),
    viewRow("/history", "/history"),
    viewRow("/suggestions/decisions", "/suggestions/decisions"),
    viewRow("/export", "/export?format=musicxml", "MusicXML"),
    viewRow("/export", "/export?format=midi", "MIDI"),
    {
      method: "PUT",
      route: "/api/parts/[partId]/markings/[noteKey]",
      request: (ctx) => ({
        path: `/api/parts/${data(ctx).partId}/markings/${encodeURIComponent(nextKey(ctx))}`,
        init: json("PUT", { ...DEFAULT_MARKING, depthCents: 15 }),
      }),
      expect: ownerOnly(201),
    },
    {
      method: "DELETE",
      route: "/api/parts/[partId]/markings/[noteKey]",
      request: async (ctx) => {
        const key = nextKey(ctx);
        const put = await ctx.clients.owner.clone().fetch(`/api/parts/${data(ctx).partId}/markings/${encodeURIComponent(key)}`, json("PUT", DEFAULT_MARKING));
        const version = put.status === 201 ? (await put.json()).marking.version : 1;
        return { path: `/api/parts/${data(ctx).partId}/markings/${encodeURIComponent(key)}?version=${version}` };
      },
      expect: ownerOnly(200),
    },
    {
      method: "POST",
      route: "/api/parts/[partId]/history/undo",
      request: (ctx) => ({ path: `/api/parts/${data(ctx).partId}/history/undo`, init: { method: "POST" } }),
      expect: ownerOnly(200),
    },
    {
      method: "POST",
      route: "/api/parts/[partId]/history/redo",
      request: (ctx) => ({ path: `/api/parts/${data(ctx).partId}/history/redo`, init: { method: "POST" } }),
      expect: ownerOnly(200),
    },
    {
      method: "POST",
      route: "/api/parts/[partId]/suggestions/decisions",
      request: (ctx) => ({
        path: `/api/parts/${data(ctx).partId}/suggestions/decisions`,
        init: json("POST", { noteKey: data(ctx).keys[0], role: "peak", decision: "dismissed" }),
      }),
      expect: ownerOnly(200),
    },
  ],
};
