import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { launchContext, screenshotPath } from "../helpers/browser";
import { noteGlyph, noteHit as hit, openWorkspace, signInThroughForm } from "../helpers/pages";
import { createUser } from "../helpers/session";

/**
 * The workspace through an outage: a save the server cannot take (503, or no network at all) is
 * kept on the page, shown as "Not saved yet", sent again by itself, and is there after a reload.
 */
const glyph = (page: Page, key: string) => noteGlyph(page, "wave", key);
const saveState = (page: Page) => page.getByTestId("save-state");

async function setDepth(page: Page, key: string, depth: number) {
  await hit(page, key).click();
  const panel = page.getByTestId("marking-panel");
  await panel.waitFor();
  await panel.getByLabel("Depth", { exact: true }).fill(String(depth));
  await panel.getByLabel("Depth", { exact: true }).press("Enter");
}

const stateOf = (page: Page) => saveState(page).getAttribute("data-state");
const leavingWarns = (page: Page) =>
  page.evaluate(() => {
    const event = new Event("beforeunload", { cancelable: true });
    window.dispatchEvent(event);
    return event.defaultPrevented;
  });
const storedDepth = async (page: Page, partId: string, key: string) => {
  const { markings } = await page.evaluate(async (id) => (await fetch(`/api/parts/${id}/markings`)).json(), partId);
  return (markings as Array<{ noteKey: string; depthCents: number }>).find((m) => m.noteKey === key)?.depthCents;
};

describe("the workspace through an outage", () => {
  let context: BrowserContext;
  let page: Page;
  let partId: string;
  let keys: string[];

  beforeAll(async () => {
    context = await launchContext();
    page = await context.newPage();
    const user = await createUser({ role: "player" });
    await signInThroughForm(page, user.email, user.password, "/parts");
    const created = await page.evaluate(async () => {
      const res = await fetch("/api/parts/samples", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ name: "stone-bridge.musicxml" }) });
      return res.json();
    });
    partId = created.id;
    await openWorkspace(page, partId);
    keys = await page.locator('[data-layer="hits"] [data-note-key]').evaluateAll((els) => els.map((e) => e.getAttribute("data-note-key")!));
  });
  afterAll(async () => {
    await context?.close();
  });

  it("keeps a mark the server answers 503 to, says it is not saved yet, and saves it when the server is back", async () => {
    const key = keys[2];
    let refused = 0;
    const route = "**/api/parts/*/markings/*";
    await page.route(route, (r) => {
      refused++;
      return r.fulfill({ status: 503, headers: { "retry-after": "1" }, contentType: "application/json", body: JSON.stringify({ code: "unavailable:database", message: "Try again in a few seconds." }) });
    });
    await setDepth(page, key, 37);
    await expect.poll(() => stateOf(page), { timeout: 10_000 }).toBe("unsaved");
    expect(await saveState(page).textContent()).toMatch(/Not saved yet · trying again · 1 change/);
    await glyph(page, key).waitFor();
    expect(await leavingWarns(page)).toBe(true);
    await page.screenshot({ path: screenshotPath("workspace-not-saved-yet") });
    // It keeps trying by itself.
    await expect.poll(() => refused, { timeout: 10_000 }).toBeGreaterThanOrEqual(2);
    expect(await storedDepth(page, partId, key)).toBeUndefined();

    await page.unroute(route);
    await expect.poll(() => stateOf(page), { timeout: 20_000 }).toBe("saved");
    expect(await leavingWarns(page)).toBe(false);
    await openWorkspace(page, partId);
    await glyph(page, key).waitFor();
    expect(await storedDepth(page, partId, key)).toBe(37);
  });

  it("keeps marks made offline and saves them when the browser is back online", async () => {
    await context.setOffline(true);
    await setDepth(page, keys[5], 42);
    await setDepth(page, keys[6], 18);
    await expect.poll(() => stateOf(page), { timeout: 10_000 }).toBe("unsaved");
    // The second mark joins the queue a moment after the first has turned the state to "unsaved".
    await expect.poll(() => saveState(page).textContent(), { timeout: 10_000 }).toMatch(/Not saved yet · offline · 2 changes/);
    await glyph(page, keys[5]).waitFor();
    await context.setOffline(false);
    await expect.poll(() => stateOf(page), { timeout: 20_000 }).toBe("saved");
    await openWorkspace(page, partId);
    await glyph(page, keys[6]).waitFor();
    expect(await storedDepth(page, partId, keys[5])).toBe(42);
    expect(await storedDepth(page, partId, keys[6])).toBe(18);
  });
});
