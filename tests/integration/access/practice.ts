import { db } from "@/db/client";
import { shares } from "@/db/schema";
import { statuses, type AccessModule, type MatrixContext } from "../../helpers/access-matrix";
import { sampleFiles, uploadSample } from "../../helpers/parts";

/** The practice log and takes: the owner writes, the owner's teacher with access reads. */

interface PracticeData {
  partId: string;
  noteKey: string;
}

const data = (ctx: MatrixContext) => ctx.data.practice as PracticeData;
const json = (body: unknown): RequestInit => ({ method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
const read = statuses(404, { anonymous: 401, owner: 200, teacherWithAccess: 200 });
const write = statuses(404, { anonymous: 401, owner: 201, teacherWithAccess: 403 });

export const accessModule: AccessModule = {
  async setup(ctx) {
    const owner = ctx.clients.owner.clone();
    const created = await uploadSample(owner, sampleFiles().find((n) => n.endsWith(".musicxml"))!);
    const analysis = await (await owner.fetch(`/api/parts/${created.id}/analysis`)).json();
    await db().insert(shares).values({
      partId: created.id,
      email: ctx.users.teacherWithAccess.email,
      permission: "comment",
      tokenHash: `matrix-practice-${created.id}`,
      invitedBy: ctx.users.owner.id,
      userId: ctx.users.teacherWithAccess.id,
      acceptedAt: new Date(),
      expiresAt: new Date(Date.now() + 86_400_000),
    });
    ctx.data.practice = { partId: created.id, noteKey: analysis.notes[0].key } satisfies PracticeData;
  },
  routes: [
    { method: "GET", route: "/api/parts/[partId]/practice", request: (ctx) => ({ path: `/api/parts/${data(ctx).partId}/practice` }), expect: read },
    {
      method: "POST",
      route: "/api/parts/[partId]/practice",
      request: (ctx) => ({ path: `/api/parts/${data(ctx).partId}/practice`, init: json({ kind: "free", minutes: 5, notes: "Matrix" }) }),
      expect: write,
    },
    { method: "GET", route: "/api/parts/[partId]/takes", request: (ctx) => ({ path: `/api/parts/${data(ctx).partId}/takes` }), expect: read },
    {
      method: "POST",
      route: "/api/parts/[partId]/takes",
      request: (ctx) => ({
        path: `/api/parts/${data(ctx).partId}/takes`,
        init: json({ noteKey: data(ctx).noteKey, speedHz: 6, depthCents: 20, offsetCents: -3, voicedFraction: 0.9, toneSeconds: 2 }),
      }),
      expect: write,
    },
  ],
};
