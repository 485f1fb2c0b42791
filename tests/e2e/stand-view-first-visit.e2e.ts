import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { launchContext, screenshotPath } from "../helpers/browser";
import { APP_URL } from "../helpers/env";
import { SAMPLES_DIR } from "../helpers/parts";

const HINT = "Click a note to mark it; arrow keys move between notes.";

/**
 * A new player's first visit on a tablet held upright: sign up (and land signed in), upload a
 * part, read the hint, mark a note, open the stand view, and open it again without a network.
 * Screenshots: test-results/e2e/first-visit-*.png.
 */
describe("a new player's first visit, from sign-up to the stand", () => {
  let context: BrowserContext;
  let page: Page;

  beforeAll(async () => {
    context = await launchContext({ width: 820, height: 1180 });
    page = await context.newPage();
  });

  afterAll(async () => {
    await context?.close();
  });

  it("signs up, lands signed in, uploads, follows the hint, marks, and takes the part to the stand offline", async () => {
    const name = "Nela Sorrow";
    const email = `e2e-first-visit-${Date.now()}-${Math.floor(Math.random() * 1e6)}@test.ondula.test`;
    await page.goto(`${APP_URL}/sign-up`);
    await page.getByLabel("Name").fill(name);
    await page.getByLabel("E-mail").fill(email);
    await page.getByLabel("Password").fill("long-tones-every-morning");
    await page.getByRole("button", { name: "Create account" }).click();

    // Signed in at once, in the library, with a word of welcome.
    await page.waitForURL((url) => url.pathname === "/parts");
    expect(await page.getByTestId("signed-in-as").textContent()).toContain(name);
    await page.getByTestId("welcome").waitFor();
    await page.screenshot({ path: screenshotPath("first-visit-1-signed-in"), fullPage: true });

    await page.getByLabel("Choose a file").setInputFiles(path.join(SAMPLES_DIR, "harbour-song.musicxml"));
    await page.waitForURL(/\/parts\/[0-9a-f-]{36}$/);
    const partId = new URL(page.url()).pathname.split("/")[2];

    // The empty workspace says how to begin, and shows its keyboard help.
    await page.getByText(HINT).waitFor();
    await page.getByRole("button", { name: "Keyboard help" }).click();
    await page.getByTestId("keyboard-help").waitFor();
    await page.locator('[data-layer="hits"] [data-note-key]').first().waitFor();
    await page.screenshot({ path: screenshotPath("first-visit-2-hint") });

    // Mark the first note as the hint says: click it, set the depth.
    const first = page.locator('[data-layer="hits"] [data-note-key]').first();
    const key = await first.getAttribute("data-note-key");
    await first.click();
    const panel = page.getByTestId("marking-panel");
    await panel.waitFor();
    await panel.getByLabel("Depth", { exact: true }).fill("25");
    await panel.getByLabel("Depth", { exact: true }).press("Enter");
    await page.locator(`[data-glyph="wave"][data-note-key="${key}"]`).waitFor();
    // The hint has done its work once the part carries a marking.
    await page.getByText(HINT).waitFor({ state: "detached", timeout: 15_000 });
    await page.screenshot({ path: screenshotPath("first-visit-3-marked") });

    await page.getByRole("link", { name: "Stand view" }).click();
    await page.waitForURL((url) => url.pathname === `/parts/${partId}/stand`);
    await page
      .locator('[data-testid="stand-view"][data-offline-copy="saved"]')
      .waitFor({ timeout: 60_000 })
      .catch(async (e) => {
        await page.screenshot({ path: screenshotPath("first-visit-4-stand-failed") });
        throw new Error(`${e}\n${await page.getByTestId("stand-view").evaluate((el) => el.outerHTML.slice(0, 400))}`);
      });
    expect(await page.locator(`[data-testid="stand-view-page"]:not([hidden]) [data-glyph="wave"][data-note-key="${key}"]`).count()).toBe(1);
    await page.screenshot({ path: screenshotPath("first-visit-4-stand") });

    await context.setOffline(true);
    try {
      const response = await page.reload();
      expect(response?.fromServiceWorker()).toBe(true);
      await page.locator('[data-testid="stand-view"][data-offline-copy="offline"]').waitFor({ timeout: 30_000 });
      await page.locator('[data-testid="stand-view"]:not([data-pages="0"])').waitFor({ timeout: 30_000 });
      expect(await page.getByText(/Offline · as of/).first().isVisible()).toBe(true);
      expect(await page.locator(`[data-testid="stand-view-page"]:not([hidden]) [data-glyph="wave"][data-note-key="${key}"]`).count()).toBe(1);
      await page.screenshot({ path: screenshotPath("first-visit-5-stand-offline") });
    } finally {
      await context.setOffline(false);
    }
  });
});
