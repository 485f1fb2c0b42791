import { afterEach, describe, expect, it, vi } from "vitest";

// The development engraving page reads files from samples/ and must not exist in production.
async function loadPage(env: Record<string, string>) {
  for (const [k, v] of Object.entries(env)) vi.stubEnv(k, v);
  vi.resetModules(); // config() caches what it read first
  return (await import("@/app/dev/engrave/page")).default;
}

const search = (sample?: string) => ({ searchParams: Promise.resolve(sample === undefined ? {} : { sample }) });

afterEach(() => {
  vi.unstubAllEnvs();
});

describe("/dev/engrave", () => {
  it("is not found when APP_ENV=production", async () => {
    const Page = await loadPage({
      APP_ENV: "production",
      DATABASE_URL: "postgres://u:p@127.0.0.1:1/db",
      AUTH_SECRET: "x".repeat(40),
      SMTP_URL: "smtp://127.0.0.1:1",
      APP_URL: "https://ondula.example",
    });
    // Next.js marks notFound() with this digest (next/dist/client/components/http-access-fallback).
    await expect(Page(search("harbour-song.musicxml"))).rejects.toMatchObject({ digest: "NEXT_HTTP_ERROR_FALLBACK;404" });
    await expect(Page(search())).rejects.toMatchObject({ digest: "NEXT_HTTP_ERROR_FALLBACK;404" });
  });

  it("hands the normalized partwise text to the browser in development", async () => {
    const Page = await loadPage({ APP_ENV: "development" });
    const element = (await Page(search("willow-round.mxl"))) as { props: { children: Array<{ props: { xml?: string } }> } };
    const xml = element.props.children[1].props.xml ?? "";
    expect(xml).toContain("<score-partwise");
    expect(xml).toContain("Willow Round");
    expect(xml).not.toContain("<!DOCTYPE");
  });

  it("refuses names outside samples/", async () => {
    const Page = await loadPage({ APP_ENV: "development" });
    for (const sample of ["../package.json", "..%2Fpackage.json", "missing.musicxml", "README.md"]) {
      await expect(Page(search(sample))).rejects.toMatchObject({ digest: "NEXT_HTTP_ERROR_FALLBACK;404" });
    }
  });
});
