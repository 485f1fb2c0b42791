import { spawn, type ChildProcess } from "node:child_process";
import { randomBytes } from "node:crypto";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { APP_URL } from "../../helpers/env";
import { countHostileRequests, hostile } from "./hostile";

countHostileRequests("production");

/**
 * A second server from the same build, with APP_ENV=production, on a port of its own next to
 * the test server's.
 */
const port = Number(new URL(APP_URL).port) + 7;
const base = `http://127.0.0.1:${port}`;
const next = path.resolve("node_modules/next/dist/bin/next");

function startProduction(secret: string): { child: ChildProcess; output: () => string; exited: Promise<number | null> } {
  const env: NodeJS.ProcessEnv = { ...process.env };
  delete env.NOTIFY_FLUSH_SECRET;
  const child = spawn(process.execPath, [next, "start", "-H", "127.0.0.1", "-p", String(port)], {
    env: {
      ...env,
      NODE_ENV: "production",
      APP_ENV: "production",
      AUTH_SECRET: secret,
      NEXTAUTH_SECRET: secret,
      APP_URL: base,
      NEXTAUTH_URL: base,
      SEED_DEMO: "no",
    },
    stdio: ["ignore", "pipe", "pipe"],
  });
  let out = "";
  child.stdout!.on("data", (d) => (out += d));
  child.stderr!.on("data", (d) => (out += d));
  const exited = new Promise<number | null>((resolve) => child.once("exit", (code) => resolve(code)));
  return { child, output: () => out, exited };
}

async function waitUntilUp(timeoutMs = 60_000) {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    try {
      await fetch(`${base}/api/health`);
      return;
    } catch {
      await new Promise((r) => setTimeout(r, 300));
    }
  }
  throw new Error("the production server did not start");
}

describe("APP_ENV=production (ASVS 14.3.2, 14.1.x)", () => {
  let server: ReturnType<typeof startProduction>;

  beforeAll(async () => {
    server = startProduction(randomBytes(48).toString("base64"));
    await waitUntilUp();
  }, 90_000);

  afterAll(async () => {
    server.child.kill("SIGTERM");
    await server.exited;
  });

  it("closes the local mailbox page and API and the unauthenticated notification flush", async () => {
    expect((await hostile(`${base}/dev/mail`)).status).toBe(404); // ASVS 14.3.2
    expect((await hostile(`${base}/api/dev/mail`)).status).toBe(404); // ASVS 14.3.2
    expect((await hostile(`${base}/api/dev/mail?to=player@demo.ondula.test`)).status).toBe(404);
    const flush = await hostile(`${base}/api/internal/flush-notifications`, { method: "POST" });
    expect(flush.status).toBe(404); // ASVS 4.1.1 (no unauthenticated trigger)
    const health = await hostile(`${base}/api/health`);
    expect(await health.json()).toEqual({ status: "ok" }); // ASVS 14.3.3
  });

  it("will not run with a development AUTH_SECRET (ASVS 2.10.4, 6.4.1)", async () => {
    server.child.kill("SIGTERM");
    await server.exited;
    const weak = startProduction("local-production-secret-not-for-production-0123456789");
    // The check runs when the server starts; a request makes sure it has.
    setTimeout(() => void fetch(`${base}/api/health`).catch(() => undefined), 3_000);
    const code = await Promise.race([weak.exited, new Promise<"running">((r) => setTimeout(() => r("running"), 45_000))]);
    if (code === "running") weak.child.kill("SIGKILL");
    expect(code).not.toBe("running");
    expect(code).not.toBe(0);
    expect(weak.output()).toMatch(/AUTH_SECRET: is a development secret/);
    server = weak;
  }, 60_000);
});
