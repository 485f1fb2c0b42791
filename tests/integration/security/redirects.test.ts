import { beforeAll, describe, expect, it } from "vitest";
import { APP_URL } from "../../helpers/env";
import { ApiClient, createSignedInUser, uniqueAddress } from "../../helpers/session";
import { APP_ORIGIN, countHostileRequests, hostile } from "./hostile";

countHostileRequests("redirects");

// Open-redirect payloads: each would leave the site if a browser followed it as written.
const PAYLOADS = [
  "/%09/evil.example/x",
  "/\t/evil.example/x",
  "//evil.example/x",
  "/\\evil.example/x",
  "/%5Cevil.example",
  "https://evil.example/x",
  "javascript:alert(document.domain)",
  "/%0a/evil.example",
  "\\\\evil.example",
  "https:evil.example",
];

describe("open redirects after sign-in (ASVS 5.1.5)", () => {
  let client: ApiClient;
  beforeAll(async () => {
    ({ client } = await createSignedInUser());
  });

  for (const payload of PAYLOADS) {
    it(`keeps /sign-in?callbackUrl=${JSON.stringify(payload)} on the site`, async () => {
      const res = await hostile(`/sign-in?callbackUrl=${encodeURIComponent(payload)}`, {}, client);
      expect([303, 307, 308]).toContain(res.status);
      const location = res.headers.get("location")!;
      // What a browser would do with the Location header, tabs and newlines stripped included.
      const target = new URL(location.replace(/[\t\n\r]/g, ""), APP_URL);
      expect(target.origin).toBe(APP_ORIGIN); // ASVS 5.1.5
      expect(target.pathname.startsWith("//")).toBe(false);
    });
  }

  it("keeps next-auth's own callbackUrl on the site", async () => {
    const anon = new ApiClient("anon", { "x-forwarded-for": uniqueAddress() });
    const { csrfToken } = (await (await anon.fetch("/api/auth/csrf")).json()) as { csrfToken: string };
    for (const callbackUrl of ["https://evil.example/", "/%09/evil.example/x", "//evil.example"]) {
      const res = await hostile("/api/auth/signin/credentials", {
        method: "POST",
        headers: { "content-type": "application/x-www-form-urlencoded" },
        body: new URLSearchParams({ csrfToken, callbackUrl, json: "true" }),
      }, anon);
      const { url } = (await res.json()) as { url: string };
      expect(new URL(url.replace(/[\t\n\r]/g, ""), APP_URL).origin).toBe(APP_ORIGIN); // ASVS 5.1.5
    }
  });
});
