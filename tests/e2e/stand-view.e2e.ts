import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { generatePartXml } from "../../scripts/bench/generate-part";
import { launchContext, screenshotPath } from "../helpers/browser";
import { APP_URL } from "../helpers/env";
import { signInThroughForm, uploadInPage } from "../helpers/pages";
import { createUser } from "../helpers/session";

/** Uploads a part long enough to need several pages on a tablet, and marks a few of its notes. */
async function uploadLongPart(page: Page): Promise<string> {
  const xml = generatePartXml({ measures: 64, seed: 11 });
  const id = (await uploadInPage(page, "stand-long.musicxml", xml)).body.id;
  const analysis = await page.evaluate(async (partId) => (await fetch(`/api/parts/${partId}/analysis`)).json(), id);
  const keys: string[] = analysis.notes.map((n: { key: string }) => n.key);
  for (const [i, role] of [[0, "phrase-start"], [5, "peak"], [keys.length - 3, "resolution"]] as const) {
    const status = await page.evaluate(
      async ({ partId, key, body }) => (await fetch(`/api/parts/${partId}/markings/${encodeURIComponent(key)}`, { method: "PUT", headers: { "content-type": "application/json" }, body: JSON.stringify(body) })).status,
      { partId: id, key: keys[i], body: { depthCents: 30, speedHz: 5.5, placement: "centered", onset: "immediate", shape: "steady", role, comment: "" } },
    );
    expect(status).toBeLessThan(300);
  }
  return id;
}

async function pageState(page: Page) {
  return page.getByTestId("stand-view").evaluate((el) => ({ page: Number(el.getAttribute("data-page")), pages: Number(el.getAttribute("data-pages")) }));
}

async function waitForPage(page: Page, n: number) {
  await page.waitForFunction((want) => document.querySelector('[data-testid="stand-view"]')?.getAttribute("data-page") === String(want), n, { timeout: 5_000 });
}

/** The page shown: its systems and the screen area they take. */
async function shownPage(page: Page) {
  return page.evaluate(() => {
    const shown = [...document.querySelectorAll<HTMLElement>('[data-testid="stand-view-page"]')].find((p) => !p.hidden)!;
    const systems = [...shown.querySelectorAll<SVGSVGElement>("svg.stand-system")];
    const boxes = systems.map((s) => s.getBoundingClientRect());
    return {
      systems: systems.length,
      firstBar: Number(systems[0]?.getAttribute("data-first-bar")),
      left: Math.min(...boxes.map((b) => b.left)),
      right: Math.max(...boxes.map((b) => b.right)),
      bottom: Math.max(...boxes.map((b) => b.bottom)),
      glyphs: shown.querySelectorAll('[data-layer="glyphs"] > *').length,
    };
  });
}

for (const size of [
  { name: "portrait", width: 820, height: 1180 },
  { name: "landscape", width: 1180, height: 820 },
]) {
  describe(`the stand view on a tablet, ${size.name} (${size.width}×${size.height})`, () => {
    let context: BrowserContext;
    let page: Page;
    let partId: string;

    beforeAll(async () => {
      context = await launchContext({ width: size.width, height: size.height });
      page = await context.newPage();
      const user = await createUser({ role: "player" });
      await signInThroughForm(page, user.email, user.password, "/parts");
      partId = await uploadLongPart(page);
    });

    afterAll(async () => {
      await context?.close();
    });

    it("shows the marked part sized to the screen, a page at a time, and keeps it for offline", async () => {
      await page.goto(`${APP_URL}/parts/${partId}`);
      await page.getByRole("link", { name: "Stand view" }).click();
      await page.waitForURL((url) => url.pathname === `/parts/${partId}/stand`);
      await page.locator('[data-testid="stand-view"][data-offline-copy="saved"]').waitFor({ timeout: 60_000 });
      const { pages } = await pageState(page);
      expect(pages).toBeGreaterThan(1);
      const shown = await shownPage(page);
      expect(shown.systems).toBeGreaterThan(0);
      // The music fills the width and stays on the screen.
      expect(shown.left).toBeGreaterThanOrEqual(0);
      expect(shown.right).toBeLessThanOrEqual(size.width);
      expect(shown.right - shown.left).toBeGreaterThan(size.width * 0.85);
      expect(shown.bottom).toBeLessThanOrEqual(size.height);
      // The first bars carry two of the markings.
      expect(shown.glyphs).toBeGreaterThan(0);
      await page.screenshot({ path: screenshotPath(`stand-view-${size.name}`) });
    });

    it("turns pages by key (arrows, PageDown/PageUp as pedals send) and by tap and swipe, and edits nothing", async () => {
      await waitForPage(page, 1);
      const firstBar = (await shownPage(page)).firstBar;
      await page.keyboard.press("PageDown");
      await waitForPage(page, 2);
      expect((await shownPage(page)).firstBar).toBeGreaterThan(firstBar);
      await page.keyboard.press("PageUp");
      await waitForPage(page, 1);
      await page.keyboard.press("ArrowRight");
      await waitForPage(page, 2);
      await page.keyboard.press("ArrowLeft");
      await waitForPage(page, 1);

      // Tap zones: the right two thirds go on, the left third goes back.
      await page.mouse.click(size.width * 0.8, size.height * 0.5);
      await waitForPage(page, 2);
      await page.mouse.click(size.width * 0.1, size.height * 0.5);
      await waitForPage(page, 1);

      // A swipe to the left goes on, to the right goes back.
      const y = size.height * 0.6;
      await page.mouse.move(size.width * 0.7, y);
      await page.mouse.down();
      await page.mouse.move(size.width * 0.3, y, { steps: 5 });
      await page.mouse.up();
      await waitForPage(page, 2);
      await page.mouse.move(size.width * 0.3, y);
      await page.mouse.down();
      await page.mouse.move(size.width * 0.7, y, { steps: 5 });
      await page.mouse.up();
      await waitForPage(page, 1);

      // Read-only: no marking panel, no selection, and the markings are as they were.
      expect(await page.getByRole("region", { name: /marking/i }).count()).toBe(0);
      const markings = await page.evaluate(async (id) => (await (await fetch(`/api/parts/${id}/markings`)).json()).markings.length, partId);
      expect(markings).toBe(3);
    });

    it("opens again with the network cut, from the kept copy, and says as of when", async () => {
      await context.setOffline(true);
      const problems: string[] = [];
      page.on("console", (m) => m.type() === "error" && problems.push(`console: ${m.text()}`));
      page.on("requestfailed", (r) => problems.push(`failed: ${r.url()} ${r.failure()?.errorText}`));
      try {
        const response = await page.reload();
        expect(response?.fromServiceWorker()).toBe(true);
        await page
          .locator('[data-testid="stand-view"][data-offline-copy="offline"]')
          .waitFor({ timeout: 30_000 })
          .catch(async (e) => {
            await page.screenshot({ path: screenshotPath(`stand-view-${size.name}-offline-failed`) });
            throw new Error(`${e}\n${problems.join("\n")}\n${await page.getByTestId("stand-view").evaluate((el) => el.outerHTML.slice(0, 300)).catch(() => "no stand view")}`);
          });
        await page.locator('[data-testid="stand-view"][data-pages]:not([data-pages="0"])').waitFor({ timeout: 30_000 });
        await expect(page.getByText(/Offline · as of/).first().isVisible()).resolves.toBe(true);
        expect((await shownPage(page)).glyphs).toBeGreaterThan(0);
        await page.keyboard.press("PageDown");
        await waitForPage(page, 2);
        await page.screenshot({ path: screenshotPath(`stand-view-${size.name}-offline`) });
      } finally {
        await context.setOffline(false);
      }
    });
  });
}
