import { describe, expect, it } from "vitest";
import { createSignedInUser } from "../../helpers/session";
import { countHostileRequests, hostile } from "./hostile";

countHostileRequests("headers");

/** The directives of a Content-Security-Policy header as name → sources. */
function directives(csp: string | null): Map<string, string[]> {
  const out = new Map<string, string[]>();
  for (const part of (csp ?? "").split(";")) {
    const [name, ...sources] = part.trim().split(/\s+/);
    if (name) out.set(name.toLowerCase(), sources);
  }
  return out;
}

function expectCommonHeaders(res: Response) {
  expect(res.headers.get("x-content-type-options")).toBe("nosniff"); // ASVS 14.4.4
  expect(res.headers.get("referrer-policy")).toMatch(/^(no-referrer|strict-origin|strict-origin-when-cross-origin|same-origin)$/); // ASVS 14.4.6
  expect(res.headers.get("permissions-policy")).toContain("microphone=(self)"); // ASVS 14.4 (least privilege for browser features)
  expect(res.headers.get("x-powered-by")).toBeNull(); // ASVS 14.3.3
  const csp = directives(res.headers.get("content-security-policy"));
  expect(csp.get("frame-ancestors")).toEqual(["'none'"]); // ASVS 14.4.7
}

describe("security headers on every response", () => {
  it("pages carry a nonce-based CSP without unsafe-eval or unsafe-inline scripts (ASVS 14.4.3)", async () => {
    const res = await hostile("/sign-in");
    expect(res.status).toBe(200);
    expectCommonHeaders(res);
    const csp = directives(res.headers.get("content-security-policy"));
    const scripts = csp.get("script-src") ?? [];
    expect(scripts).not.toContain("'unsafe-eval'"); // ASVS 14.4.3
    expect(scripts).not.toContain("'unsafe-inline'"); // ASVS 14.4.3
    expect(scripts.some((s) => /^'nonce-[A-Za-z0-9+/=]{16,}'$/.test(s))).toBe(true);
    expect(csp.get("object-src")).toEqual(["'none'"]); // ASVS 14.4.3
    expect(csp.get("base-uri")).toEqual(["'none'"]); // ASVS 14.4.3
    // Every script the page carries has the nonce of this response's policy.
    const nonce = scripts.find((s) => s.startsWith("'nonce-"))!.slice(7, -1);
    const html = await res.text();
    const tags = html.match(/<script\b[^>]*>/g) ?? [];
    expect(tags.length).toBeGreaterThan(0);
    for (const tag of tags) expect(tag).toContain(`nonce="${nonce}"`);
  });

  it("gives each page response a fresh nonce (ASVS 14.4.3)", async () => {
    const [a, b] = await Promise.all([hostile("/sign-in"), hostile("/sign-in")]);
    const nonce = (r: Response) => directives(r.headers.get("content-security-policy")).get("script-src")!.find((s) => s.startsWith("'nonce-"));
    expect(nonce(a)).toBeTruthy();
    expect(nonce(a)).not.toBe(nonce(b));
  });

  it("covers signed-in pages, redirects and the not-found page", async () => {
    const { client } = await createSignedInUser();
    for (const path of ["/parts", "/account", "/no-such-page-here"]) {
      const res = await hostile(path, {}, client);
      expectCommonHeaders(res);
    }
    // Signed in, the sign-in page redirects onwards: the redirect carries the headers too.
    const redirect = await hostile("/sign-in", {}, client);
    expect([303, 307, 308]).toContain(redirect.status);
    expectCommonHeaders(redirect);
  });

  it("API answers forbid rendering and framing (ASVS 14.4.3, 14.4.7)", async () => {
    for (const path of ["/api/me", "/api/parts", "/api/health"]) {
      const res = await hostile(path);
      expectCommonHeaders(res);
      const csp = directives(res.headers.get("content-security-policy"));
      expect(csp.get("default-src")).toEqual(["'none'"]);
      expect(csp.has("sandbox")).toBe(true);
    }
  });

  it("static files are not sniffed (ASVS 14.4.4)", async () => {
    const html = await (await hostile("/sign-in")).text();
    const asset = /\/_next\/static\/[^"']+\.js/.exec(html)?.[0];
    expect(asset).toBeTruthy();
    const res = await hostile(asset!);
    expect(res.status).toBe(200);
    expect(res.headers.get("x-content-type-options")).toBe("nosniff"); // ASVS 14.4.4
  });
});
