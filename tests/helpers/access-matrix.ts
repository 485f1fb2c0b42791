import fs from "node:fs";
import path from "node:path";
import { db } from "@/db/client";
import { studioMembers } from "@/db/schema";
import { ensureStudioForTeacher } from "@/db/studios";
import { ApiClient, createUser, signIn, uniqueAddress, type TestUser } from "./session";

/**
 * The access matrix: every API route and server action, called as each of six people, with the
 * status expected for each. Each area adds a module in tests/integration/access/ exporting an
 * `AccessModule`; the matrix test collects them all and fails for a route or action no row covers.
 */

export const PERSONAS = ["anonymous", "otherPlayer", "owner", "teacherWithAccess", "teacherWithout", "admin"] as const;
export type Persona = (typeof PERSONAS)[number];
export type SignedInPersona = Exclude<Persona, "anonymous">;

/** The status each persona must get. 303 stands for "the action redirected". */
export type Expectation = Record<Persona, number>;

export interface MatrixContext {
  /**
   * owner: a player, member of teacherWithAccess's studio, owner of the parts later areas create;
   * teacherWithAccess: the owner's teacher (studio, and the shares later areas create);
   * otherPlayer, teacherWithout: no link to the owner; admin: manages accounts.
   */
  users: Record<SignedInPersona, TestUser>;
  /** Signed-in clients; each cell works on a clone, so no cell changes another's cookies. */
  clients: Record<Persona, ApiClient>;
  /** The studio of teacherWithAccess, with owner as a member. */
  studioId: string;
  /** What area modules prepare in their `setup`, under their own key. */
  data: Record<string, unknown>;
}

export interface RouteRow {
  method: "GET" | "HEAD" | "POST" | "PUT" | "PATCH" | "DELETE" | "OPTIONS";
  /** The route's file-system pattern under app/, e.g. "/api/admin/users/[userId]". */
  route: string;
  /** What this row exercises when one route serves several things (e.g. "sign out"). */
  label?: string;
  /**
   * Builds the request for one cell; may create fresh data so cells stay independent, and may
   * use the cell's client first (e.g. to fetch a CSRF token).
   */
  request: (ctx: MatrixContext, persona: Persona, client: ApiClient) => Promise<{ path: string; init?: RequestInit }> | { path: string; init?: RequestInit };
  expect: Expectation;
}

export interface ActionRow {
  /** "file#exportName", e.g. "app/(account)/studio/actions.ts#inviteAction". */
  action: string;
  label?: string;
  fields: (ctx: MatrixContext, persona: Persona) => Promise<Record<string, string>> | Record<string, string>;
  headers?: Record<string, string>;
  expect: Expectation;
}

export interface AccessModule {
  setup?: (ctx: MatrixContext) => Promise<void>;
  routes?: RouteRow[];
  actions?: ActionRow[];
}

/** Same status for every persona except those listed. */
export function statuses(base: number, except: Partial<Expectation> = {}): Expectation {
  return { ...Object.fromEntries(PERSONAS.map((p) => [p, base])), ...except } as Expectation;
}

export async function buildContext(): Promise<MatrixContext> {
  const [owner, otherPlayer, teacherWithAccess, teacherWithout, admin] = await Promise.all([
    createUser({ role: "player", name: "Matrix owner" }),
    createUser({ role: "player", name: "Matrix other player" }),
    createUser({ role: "teacher", name: "Matrix teacher with access" }),
    createUser({ role: "teacher", name: "Matrix teacher without" }),
    createUser({ role: "admin", name: "Matrix admin" }),
  ]);
  const users = { owner, otherPlayer, teacherWithAccess, teacherWithout, admin };
  const studio = await ensureStudioForTeacher({ teacherId: teacherWithAccess.id, teacherName: teacherWithAccess.name });
  await db().insert(studioMembers).values({ studioId: studio.id, playerId: owner.id }).onConflictDoNothing();
  const clients = { anonymous: new ApiClient("anonymous") } as Record<Persona, ApiClient>;
  // Each persona signs in from an address of its own, so the matrix's many sign-ins never meet a per-address limit.
  for (const [persona, user] of Object.entries(users)) clients[persona as Persona] = await signIn(user.email, user.password, { address: uniqueAddress() });
  return { users, clients, studioId: studio.id, data: {} };
}

// ------------------------------------------------------------------ what exists in the code

const HTTP_METHODS = ["GET", "HEAD", "POST", "PUT", "PATCH", "DELETE", "OPTIONS"];

function walk(dir: string, out: string[] = []): string[] {
  if (!fs.existsSync(dir)) return out;
  for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
    if (entry.name === "node_modules" || entry.name.startsWith(".")) continue;
    const p = path.join(dir, entry.name);
    if (entry.isDirectory()) walk(p, out);
    else out.push(p);
  }
  return out;
}

/** Route groups "(name)" do not appear in URLs. */
const urlPattern = (dir: string) => `/${dir.split(path.sep).filter((s) => !/^\(.*\)$/.test(s)).join("/")}`;

/** Every `app/api/**\/route.ts` with the HTTP methods it exports: "PATCH /api/admin/users/[userId]". */
export function listApiRoutes(root = process.cwd()): string[] {
  const appDir = path.join(root, "app");
  const found: string[] = [];
  for (const file of walk(path.join(appDir, "api"))) {
    if (!/[\\/]route\.(ts|tsx|js)$/.test(file)) continue;
    const source = fs.readFileSync(file, "utf8");
    const methods = new Set<string>();
    for (const m of source.matchAll(/export\s+(?:async\s+)?(?:function|const|let)\s+([A-Z]+)\b/g)) methods.add(m[1]);
    for (const m of source.matchAll(/export\s*\{([^}]*)\}/g)) {
      for (const part of m[1].split(",")) methods.add(part.trim().split(/\s+as\s+/).pop()!.trim());
    }
    const route = urlPattern(path.relative(appDir, path.dirname(file)));
    for (const method of methods) if (HTTP_METHODS.includes(method)) found.push(`${method} ${route}`);
  }
  return found.sort();
}

/** Every export of every file that starts with "use server": "app/(auth)/actions.ts#signUpAction". */
export function listServerActions(root = process.cwd()): string[] {
  const found: string[] = [];
  for (const top of ["app", "components", "lib", "db"]) {
    for (const file of walk(path.join(root, top))) {
      if (!/\.(ts|tsx)$/.test(file) || /\.test\.tsx?$/.test(file)) continue;
      const source = fs.readFileSync(file, "utf8");
      if (!/^\s*(?:\/\/[^\n]*\n|\/\*[\s\S]*?\*\/\s*)*["']use server["']/.test(source)) continue;
      const rel = path.relative(root, file).split(path.sep).join("/");
      for (const m of source.matchAll(/export\s+(?:async\s+function|function|const|let)\s+(\w+)/g)) found.push(`${rel}#${m[1]}`);
    }
  }
  return found.sort();
}
