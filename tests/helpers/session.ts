import { randomBytes } from "node:crypto";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { users } from "@/db/schema";
import { hashPassword } from "@/lib/auth/password";
import type { Role } from "@/lib/auth/types";
import { APP_URL } from "./env";

/**
 * A small HTTP client that keeps cookies like a browser would (per client), for tests and
 * scripts that talk to the running app.
 */
export class ApiClient {
  private jar = new Map<string, string>();

  constructor(readonly label = "anonymous", private headers: Record<string, string> = {}) {}

  /** The Cookie header this client sends. */
  get cookie(): string {
    return [...this.jar].map(([k, v]) => `${k}=${v}`).join("; ");
  }

  /** A client with the same cookies whose later responses do not touch this one's jar. */
  clone(label = this.label): ApiClient {
    const c = new ApiClient(label, { ...this.headers });
    for (const [k, v] of this.jar) c.jar.set(k, v);
    return c;
  }

  /** Fetches a path of the app with this client's cookies, keeping any cookies it sets. */
  async fetch(path: string, init: RequestInit = {}): Promise<Response> {
    const headers = new Headers(init.headers);
    for (const [k, v] of Object.entries(this.headers)) if (!headers.has(k)) headers.set(k, v);
    if (this.jar.size) headers.set("cookie", this.cookie);
    const res = await fetch(new URL(path, APP_URL), { redirect: "manual", ...init, headers });
    this.store(res);
    return res;
  }

  private store(res: Response) {
    for (const line of res.headers.getSetCookie()) {
      const [pair, ...attrs] = line.split(";");
      const i = pair.indexOf("=");
      const name = pair.slice(0, i).trim();
      const value = pair.slice(i + 1).trim();
      const expired = attrs.some((a) => /^\s*max-age=0\s*$/i.test(a)) || attrs.some((a) => {
        const m = /^\s*expires=(.*)$/i.exec(a);
        return m ? new Date(m[1]).getTime() < Date.now() : false;
      });
      if (expired || value === "") this.jar.delete(name);
      else this.jar.set(name, value);
    }
  }

  hasSession(): boolean {
    return [...this.jar.keys()].some((k) => k.endsWith("next-auth.session-token"));
  }
}

export interface SignInAttempt {
  client: ApiClient;
  response: Response;
  body: { url?: string; code?: string; message?: string };
}

/**
 * Posts e-mail and password through next-auth's standard endpoints: GET /api/auth/csrf, then
 * POST /api/auth/callback/credentials with form fields. `address` sets X-Forwarded-For, so a
 * test has its own per-address abuse counter.
 */
export async function attemptSignIn(email: string, password: string, opts: { address?: string } = {}): Promise<SignInAttempt> {
  const client = new ApiClient(email, opts.address ? { "x-forwarded-for": opts.address } : {});
  const csrf = (await (await client.fetch("/api/auth/csrf")).json()) as { csrfToken: string };
  const response = await client.fetch("/api/auth/callback/credentials", {
    method: "POST",
    headers: { "content-type": "application/x-www-form-urlencoded" },
    body: new URLSearchParams({ email, password, csrfToken: csrf.csrfToken, callbackUrl: `${APP_URL}/`, json: "true" }),
  });
  const body = (await response.json().catch(() => ({}))) as SignInAttempt["body"];
  return { client, response, body };
}

/**
 * Uses an e-mailed sign-in link the way the link page's button does: GET /api/auth/csrf, then
 * POST /api/auth/callback/sign-in-link with the token.
 */
export async function attemptLinkSignIn(
  token: string,
  opts: { address?: string; callbackUrl?: string; client?: ApiClient } = {},
): Promise<SignInAttempt> {
  const client = opts.client ?? new ApiClient("link", { "x-forwarded-for": opts.address ?? uniqueAddress() });
  const csrf = (await (await client.fetch("/api/auth/csrf")).json()) as { csrfToken: string };
  const response = await client.fetch("/api/auth/callback/sign-in-link", {
    method: "POST",
    headers: { "content-type": "application/x-www-form-urlencoded" },
    body: new URLSearchParams({ token, csrfToken: csrf.csrfToken, callbackUrl: opts.callbackUrl ?? "/parts", json: "true" }),
  });
  const body = (await response.json().catch(() => ({}))) as SignInAttempt["body"];
  return { client, response, body };
}

/** Signs in and returns a client holding the session cookie; throws when sign-in fails. */
export async function signIn(email: string, password: string, opts: { address?: string } = {}): Promise<ApiClient> {
  const { client, response, body } = await attemptSignIn(email, password, opts);
  if (!response.ok || !client.hasSession()) {
    throw new Error(`sign-in as ${email} failed: ${response.status} ${JSON.stringify(body)}`);
  }
  return client;
}

/** Unique per call, so tests never depend on a clean database. */
export function uniqueSuffix(): string {
  return `${Date.now().toString(36)}${randomBytes(4).toString("hex")}`;
}

export function uniqueEmail(prefix = "user"): string {
  return `${prefix}-${uniqueSuffix()}@test.ondula.test`;
}

/** A made-up client address from the documentation range (RFC 5737), unique per call. */
export function uniqueAddress(): string {
  const b = randomBytes(2);
  return `203.0.${b[0]}.${b[1]}`;
}

export const TEST_PASSWORD = "a-test-passphrase-for-ondula";

let hashed: Promise<string> | undefined;

export interface TestUser {
  id: string;
  email: string;
  name: string;
  role: Role;
  password: string;
}

/**
 * A fresh, uniquely named account written straight to the database (fast); the sign-up flow
 * through the real form and mailbox is exercised in tests/integration/accounts.test.ts.
 */
export async function createUser({ role = "player", verified = true, name }: { role?: Role; verified?: boolean; name?: string } = {}): Promise<TestUser> {
  hashed ??= hashPassword(TEST_PASSWORD);
  const email = uniqueEmail(role);
  const [row] = await db()
    .insert(users)
    .values({ email, name: name ?? `Test ${role} ${email.slice(role.length + 1, role.length + 7)}`, role, passwordHash: await hashed, emailVerifiedAt: verified ? new Date() : null })
    .returning();
  return { id: row.id, email, name: row.name, role, password: TEST_PASSWORD };
}

/** createUser, then signIn. */
export async function createSignedInUser(opts: Parameters<typeof createUser>[0] = {}): Promise<{ user: TestUser; client: ApiClient }> {
  const user = await createUser(opts);
  return { user, client: await signIn(user.email, user.password) };
}

export async function getUserRow(userId: string) {
  const [row] = await db().select().from(users).where(eq(users.id, userId));
  return row;
}
