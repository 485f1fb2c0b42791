import { describe, expect, it, vi } from "vitest";
import { z } from "zod";
import { AppError } from "@/lib/errors";
import { clientAddress } from "./client-address";
import { answerOutage, handle, parseJson, parseParams } from "./handler";
import { safeCallbackPath } from "./safe-redirect";

const ctx = { params: Promise.resolve({}) };
const req = (body?: string) => new Request("http://app.test/api/x", { method: "POST", body, headers: body === undefined ? {} : { "content-type": "application/json" } });

describe("handle()", () => {
  it("turns an AppError into its status and { code, message, field }", async () => {
    const res = await handle(async () => {
      throw new AppError("forbidden:part", "Only the owner can do that.", { field: "partId" });
    })(req(), ctx);
    expect(res.status).toBe(403);
    expect(await res.json()).toEqual({ code: "forbidden:part", message: "Only the owner can do that.", field: "partId" });
  });

  it("answers 400 naming the field for a zod error", async () => {
    const res = await handle(async (r) => {
      await parseJson(r, z.object({ title: z.string().min(1, "Give a title.") }));
      return Response.json({});
    })(req(JSON.stringify({ title: "" })), ctx);
    expect(res.status).toBe(400);
    expect(await res.json()).toMatchObject({ code: "bad_request:validation", field: "title", message: "title: Give a title." });
  });

  it("answers 400 for a body that is not JSON", async () => {
    const res = await handle(async (r) => Response.json(await parseJson(r, z.unknown())))(req("{oops"), ctx);
    expect(res.status).toBe(400);
    expect((await res.json()).code).toBe("bad_request:json");
  });

  it("hides unexpected errors behind a generic 500 and logs them", async () => {
    const log = vi.spyOn(console, "error").mockImplementation(() => {});
    const res = await handle(async () => {
      throw new Error("connection string postgres://secret");
    })(req(), ctx);
    expect(res.status).toBe(500);
    expect(JSON.stringify(await res.json())).not.toContain("secret");
    expect(log).toHaveBeenCalled();
    log.mockRestore();
  });

  it("passes Retry-After and other AppError headers through", async () => {
    const res = await handle(async () => {
      throw new AppError("rate_limited:sign_in", "Too many.", { headers: { "Retry-After": "60" } });
    })(req(), ctx);
    expect(res.status).toBe(429);
    expect(res.headers.get("retry-after")).toBe("60");
  });

  it("validates params", async () => {
    await expect(parseParams(Promise.resolve({ partId: "x" }), z.object({ partId: z.string().uuid() }))).rejects.toBeInstanceOf(z.ZodError);
  });
});

describe("clientAddress()", () => {
  const peerHeader = "x-ondula-peer-test";
  it("with no trusted proxy, takes the socket's peer and ignores X-Forwarded-For (common practice: anyone can send the header)", () => {
    const headers = new Headers({ "x-forwarded-for": "198.51.100.2", [peerHeader]: "192.0.2.10" });
    expect(clientAddress(headers, { trustedProxies: 0, peerHeader })).toBe("192.0.2.10");
    expect(clientAddress({ "x-forwarded-for": "198.51.100.2" }, { trustedProxies: 0, peerHeader })).toBe("unknown");
  });

  it("with n trusted proxies, takes the n-th X-Forwarded-For entry from the right (the hop count of Express's trust proxy setting)", () => {
    const headers = new Headers({ "x-forwarded-for": "6.6.6.6, 1.2.3.4, 10.0.0.7", [peerHeader]: "10.0.0.8" });
    expect(clientAddress(headers, { trustedProxies: 1, peerHeader })).toBe("10.0.0.7");
    expect(clientAddress(headers, { trustedProxies: 2, peerHeader })).toBe("1.2.3.4");
    // Fewer entries than proxies: the leftmost; none at all: the peer.
    expect(clientAddress(headers, { trustedProxies: 5, peerHeader })).toBe("6.6.6.6");
    expect(clientAddress(new Headers({ [peerHeader]: "10.0.0.8" }), { trustedProxies: 1, peerHeader })).toBe("10.0.0.8");
  });

  it("gives a spoofed extra entry on the left no new address", () => {
    const honest = clientAddress({ "x-forwarded-for": "203.0.113.5" }, { trustedProxies: 1, peerHeader });
    const spoofed = clientAddress({ "x-forwarded-for": "198.51.100.77, 203.0.113.5" }, { trustedProxies: 1, peerHeader });
    expect(spoofed).toBe(honest);
  });
});

describe("safeCallbackPath()", () => {
  it("keeps same-site paths and refuses other origins", () => {
    expect(safeCallbackPath("/studio?joined=1")).toBe("/studio?joined=1");
    expect(safeCallbackPath("//evil.example/x")).toBe("/parts");
    expect(safeCallbackPath("https://evil.example/")).toBe("/parts");
    expect(safeCallbackPath("/\\evil.example")).toBe("/parts");
    expect(safeCallbackPath(undefined, "")).toBe("");
  });
});

describe("answerOutage()", () => {
  it("answers 503 with Retry-After when the database cannot be reached, and lets anything else through", async () => {
    const log = vi.spyOn(console, "error").mockImplementation(() => {});
    const refused = Object.assign(new Error("connect ECONNREFUSED 127.0.0.1:5432"), { code: "ECONNREFUSED" });
    const res = await answerOutage("test", async () => {
      throw new Error("Failed query: select 1", { cause: refused });
    })();
    expect(res.status).toBe(503);
    expect(Number(res.headers.get("retry-after"))).toBeGreaterThan(0);
    expect(JSON.stringify(await res.json())).not.toMatch(/ECONNREFUSED|5432/);
    await expect(answerOutage("test", async () => {
      throw new Error("a bug");
    })()).rejects.toThrow("a bug");
    log.mockRestore();
  });
});
