import { describe, expect, it } from "vitest";
import { APP_URL } from "../helpers/env";
import { createSignedInUser } from "../helpers/session";

describe("GET /api/health", () => {
  it("tells an anonymous caller the status only", async () => {
    const res = await fetch(`${APP_URL}/api/health`);
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ status: "ok" });
  });

  it("reports the database reachable and migrated, and the mail server up, to an administrator", async () => {
    const { client } = await createSignedInUser({ role: "admin" });
    const res = await client.fetch("/api/health");
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.status).toBe("ok");
    expect(body.database.ok).toBe(true);
    expect(body.database.migration.count).toBeGreaterThanOrEqual(1);
    expect(body.mail.ok).toBe(true);
    // The outbox's counts, for an operator to see mail piling up or given up on.
    expect(body.mail.outbox).toEqual({ waiting: expect.any(Number), active: expect.any(Number), failed: expect.any(Number) });
    expect(typeof body.version).toBe("string");
  });
});
