import { beforeAll, describe, expect, it } from "vitest";
import { callAction } from "../helpers/actions";
import {
  buildContext, listApiRoutes, listServerActions, PERSONAS, type AccessModule, type MatrixContext,
} from "../helpers/access-matrix";

/**
 * Every API route and server action, as anonymous, another player, the owner, a teacher with
 * access, a teacher without, and an admin. Rows live in tests/integration/access/*.ts, one module
 * per area, each exporting `accessModule`.
 */
const modules = Object.entries(import.meta.glob<{ accessModule: AccessModule }>("./access/*.ts", { eager: true }))
  .map(([file, mod]) => {
    if (!mod.accessModule) throw new Error(`${file} must export an accessModule`);
    return mod.accessModule;
  });
const routeRows = modules.flatMap((m) => m.routes ?? []);
const actionRows = modules.flatMap((m) => m.actions ?? []);

let ctx: MatrixContext;

beforeAll(async () => {
  ctx = await buildContext();
  for (const m of modules) await m.setup?.(ctx);
});

describe("access matrix: coverage", () => {
  it("has a row for every method of every app/api route", () => {
    const covered = new Set(routeRows.map((r) => `${r.method} ${r.route}`));
    const missing = listApiRoutes().filter((r) => !covered.has(r));
    expect(missing, "add rows for these routes in tests/integration/access/").toEqual([]);
  });

  it("has a row for every exported server action", () => {
    const covered = new Set(actionRows.map((r) => r.action));
    const missing = listServerActions().filter((a) => !covered.has(a));
    expect(missing, "add rows for these server actions in tests/integration/access/").toEqual([]);
  });

  it("has no row for a route or action that does not exist", () => {
    const routes = new Set(listApiRoutes());
    const actions = new Set(listServerActions());
    expect(routeRows.map((r) => `${r.method} ${r.route}`).filter((r) => !routes.has(r))).toEqual([]);
    expect(actionRows.map((r) => r.action).filter((a) => !actions.has(a))).toEqual([]);
  });
});

describe("access matrix: API routes", () => {
  for (const row of routeRows) {
    for (const persona of PERSONAS) {
      it(`${row.method} ${row.route}${row.label ? ` (${row.label})` : ""} as ${persona} → ${row.expect[persona]}`, async () => {
        const client = ctx.clients[persona].clone();
        const { path, init } = await row.request(ctx, persona, client);
        const res = await client.fetch(path, { method: row.method, ...init });
        const body = await res.text();
        expect(res.status, body.slice(0, 300)).toBe(row.expect[persona]);
        if (res.status >= 400) {
          // Every refusal speaks the one error vocabulary.
          const json = JSON.parse(body) as { code: string; message: string };
          expect(json.code).toMatch(/^[a-z_]+:[a-z_]+$/);
          expect(json.message.length).toBeGreaterThan(0);
        }
      });
    }
  }
});

describe("access matrix: server actions", () => {
  for (const row of actionRows) {
    const [file, exportName] = row.action.split("#");
    for (const persona of PERSONAS) {
      it(`${exportName} (${file})${row.label ? ` — ${row.label}` : ""} as ${persona} → ${row.expect[persona]}`, async () => {
        const client = ctx.clients[persona].clone();
        const result = await callAction(client, file, exportName, await row.fields(ctx, persona), { headers: row.headers });
        expect(result.status, JSON.stringify(result.state ?? result.redirect)).toBe(row.expect[persona]);
      });
    }
  }
});
