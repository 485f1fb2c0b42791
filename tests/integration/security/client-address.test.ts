import { spawn, type ChildProcess } from "node:child_process";
import http from "node:http";
import { randomInt } from "node:crypto";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { APP_URL } from "../../helpers/env";
import { createUser, uniqueAddress, uniqueEmail } from "../../helpers/session";

/**
 * A second server from the same build with TRUSTED_PROXIES=0 (the default: no proxy in front),
 * reached from two loopback addresses of our choosing (127.0.0.0/8 is all loopback, RFC 1122
 * §3.2.1.3), so the per-address limit can only come from the socket's peer address.
 */
const port = Number(new URL(APP_URL).port) + 8;
const base = `http://127.0.0.1:${port}`;
const next = path.resolve("node_modules/next/dist/bin/next");
const loopback = () => `127.${randomInt(1, 255)}.${randomInt(1, 255)}.${randomInt(2, 255)}`;

interface Answer {
  status: number;
  cookies: string[];
  body: string;
}

/** One request from the local address `from`, carrying `cookie`. */
function request(from: string, pathname: string, { method = "GET", headers = {}, body }: { method?: string; headers?: Record<string, string>; body?: string } = {}): Promise<Answer> {
  return new Promise((resolve, reject) => {
    const req = http.request(`${base}${pathname}`, { method, headers, localAddress: from }, (res) => {
      let text = "";
      res.setEncoding("utf8");
      res.on("data", (d) => (text += d));
      res.on("end", () => resolve({ status: res.statusCode ?? 0, cookies: res.headers["set-cookie"] ?? [], body: text }));
    });
    req.on("error", reject);
    if (body) req.write(body);
    req.end();
  });
}

/** A password sign-in through next-auth's endpoints, from `from`, with a made-up X-Forwarded-For. */
async function attempt(from: string, email: string, password: string): Promise<Answer> {
  const forwarded = { "x-forwarded-for": uniqueAddress() };
  const csrf = await request(from, "/api/auth/csrf", { headers: forwarded });
  const cookie = csrf.cookies.map((c) => c.split(";")[0]).join("; ");
  const { csrfToken } = JSON.parse(csrf.body) as { csrfToken: string };
  return request(from, "/api/auth/callback/credentials", {
    method: "POST",
    headers: { ...forwarded, cookie, "content-type": "application/x-www-form-urlencoded" },
    body: new URLSearchParams({ email, password, csrfToken, callbackUrl: `${base}/`, json: "true" }).toString(),
  });
}

describe("client address with no trusted proxy (ASVS 2.2.1)", () => {
  let child: ChildProcess;

  beforeAll(async () => {
    child = spawn(process.execPath, [next, "start", "-H", "127.0.0.1", "-p", String(port)], {
      env: { ...process.env, NODE_ENV: "production", TRUSTED_PROXIES: "0", APP_URL: base, NEXTAUTH_URL: base },
      stdio: "ignore",
    });
    const deadline = Date.now() + 60_000;
    for (;;) {
      try {
        await fetch(`${base}/api/health`);
        return;
      } catch {
        if (Date.now() > deadline) throw new Error("the second server did not start");
        await new Promise((r) => setTimeout(r, 300));
      }
    }
  }, 90_000);

  afterAll(() => {
    child?.kill();
  });

  it("counts failures by the socket's peer and ignores X-Forwarded-For", async () => {
    const attacker = loopback();
    for (let i = 0; i < 20; i++) {
      expect((await attempt(attacker, uniqueEmail("spray"), "guess-password-1")).status).toBe(401);
    }
    // A fresh X-Forwarded-For on every request did not spread the attempts: the 21st is refused.
    expect((await attempt(attacker, uniqueEmail("spray"), "guess-password-1")).status).toBe(429);
    // Another peer is not affected, so the limit followed the socket's address (not one shared "unknown").
    const user = await createUser();
    const other = await attempt(loopback(), user.email, user.password);
    expect(other.status).toBe(200);
    expect(other.cookies.some((c) => /next-auth\.session-token=[^;]/.test(c))).toBe(true);
  }, 60_000);
});
