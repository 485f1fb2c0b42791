import { db } from "@/db/client";
import { shares } from "@/db/schema";
import { statuses, type AccessModule, type MatrixContext } from "../../helpers/access-matrix";
import { sampleFiles, uploadSample } from "../../helpers/parts";

/** Practice assignments: the teacher with access sets and changes them, the owner ticks them done. */

interface AssignmentsData {
  partId: string;
  noteKey: string;
}

const data = (ctx: MatrixContext) => ctx.data.assignments as AssignmentsData;
const json = (method: string, body: unknown): RequestInit => ({ method, headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
const base = (ctx: MatrixContext) => `/api/parts/${data(ctx).partId}/assignments`;

/** A fresh assignment by the teacher with access, so every cell starts from version 1. */
async function fresh(ctx: MatrixContext): Promise<string> {
  const res = await ctx.clients.teacherWithAccess.clone().fetch(base(ctx), json("POST", { drill: "hold-ladder", noteKey: data(ctx).noteKey, instructions: "Matrix" }));
  if (res.status !== 201) throw new Error(`assignment answered ${res.status}: ${await res.text()}`);
  return (await res.json()).id;
}

const byTeacher = (ok: number) => statuses(404, { anonymous: 401, owner: 403, teacherWithAccess: ok });

export const accessModule: AccessModule = {
  async setup(ctx) {
    const owner = ctx.clients.owner.clone();
    const created = await uploadSample(owner, sampleFiles().find((n) => n.endsWith(".musicxml"))!);
    const analysis = await (await owner.fetch(`/api/parts/${created.id}/analysis`)).json();
    await db().insert(shares).values({
      partId: created.id,
      email: ctx.users.teacherWithAccess.email,
      permission: "comment",
      tokenHash: `matrix-assignments-${created.id}`,
      invitedBy: ctx.users.owner.id,
      userId: ctx.users.teacherWithAccess.id,
      acceptedAt: new Date(),
      expiresAt: new Date(Date.now() + 86_400_000),
    });
    ctx.data.assignments = { partId: created.id, noteKey: analysis.notes[1].key } satisfies AssignmentsData;
  },
  routes: [
    {
      method: "GET",
      route: "/api/parts/[partId]/assignments",
      request: (ctx) => ({ path: base(ctx) }),
      expect: statuses(404, { anonymous: 401, owner: 200, teacherWithAccess: 200 }),
    },
    {
      method: "POST",
      route: "/api/parts/[partId]/assignments",
      request: (ctx) => ({ path: base(ctx), init: json("POST", { drill: "pulse-trainer", noteKey: data(ctx).noteKey, minutesPerDay: 10 }) }),
      expect: byTeacher(201),
    },
    {
      method: "PATCH",
      route: "/api/parts/[partId]/assignments/[assignmentId]",
      label: "teacher's fields",
      request: async (ctx) => ({ path: `${base(ctx)}/${await fresh(ctx)}`, init: json("PATCH", { version: 1, instructions: "Slower first." }) }),
      expect: byTeacher(200),
    },
    {
      method: "PATCH",
      route: "/api/parts/[partId]/assignments/[assignmentId]",
      label: "done",
      request: async (ctx) => ({ path: `${base(ctx)}/${await fresh(ctx)}`, init: json("PATCH", { version: 1, done: true }) }),
      expect: statuses(404, { anonymous: 401, owner: 200, teacherWithAccess: 403 }),
    },
    {
      method: "DELETE",
      route: "/api/parts/[partId]/assignments/[assignmentId]",
      request: async (ctx) => ({ path: `${base(ctx)}/${await fresh(ctx)}?version=1` }),
      expect: byTeacher(200),
    },
  ],
};
