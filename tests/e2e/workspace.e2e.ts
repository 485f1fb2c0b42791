import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { launchContext, screenshotPath } from "../helpers/browser";
import { measureSideTabs, noteGlyph as glyph, noteHit as hit, openWorkspace, signInThroughForm, widestTabCounts } from "../helpers/pages";
import { createUser } from "../helpers/session";


async function saved(page: Page) {
  await page.waitForFunction(() => document.querySelector('[data-testid="save-state"]')?.getAttribute("data-state") === "saved");
}

/** Marks one note through the panel: depth and speed typed, role chosen. */
async function markNote(page: Page, key: string, m: { depth: number; speed: number; role: string }) {
  await hit(page, key).click();
  const panel = page.getByTestId("marking-panel");
  await panel.waitFor();
  await panel.getByLabel("Depth", { exact: true }).fill(String(m.depth));
  await panel.getByLabel("Depth", { exact: true }).press("Enter");
  await panel.getByLabel("Speed", { exact: true }).fill(String(m.speed));
  await panel.getByLabel("Speed", { exact: true }).press("Enter");
  // The radio itself is visually hidden behind its label, as people click the label.
  await panel.locator("fieldset", { hasText: "Role in the phrase" }).locator("label", { hasText: m.role }).click();
  await expect.poll(() => panel.getByRole("radio", { name: m.role }).isChecked()).toBe(true);
  await glyph(page, "wave", key).waitFor();
  await saved(page);
}

describe("the marking workspace", () => {
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
    expect(keys.length).toBeGreaterThan(10);
  });
  afterAll(async () => {
    await context?.close();
  });

  it("marks three notes, and after a reload they are there, drawn above their notes", async () => {
    const chosen = [keys[1], keys[4], keys[8]];
    const values = [
      { depth: 12, speed: 5, role: "Phrase start" },
      { depth: 35, speed: 6.5, role: "Peak" },
      { depth: 0, speed: 5.5, role: "Resolution" },
    ];
    for (let i = 0; i < 3; i++) await markNote(page, chosen[i], values[i]);
    await page.screenshot({ path: screenshotPath("workspace-desktop"), fullPage: false });

    await openWorkspace(page, partId);
    const markings = (await page.evaluate(async (id) => (await fetch(`/api/parts/${id}/markings`)).json(), partId)).markings as Array<{ noteKey: string; depthCents: number; speedHz: number; role: string }>;
    for (let i = 0; i < 3; i++) {
      const m = markings.find((x) => x.noteKey === chosen[i])!;
      expect(m).toMatchObject({ depthCents: values[i].depth, speedHz: values[i].speed, role: values[i].role.toLowerCase().replace(" ", "-") });
      const note = (await hit(page, chosen[i]).boundingBox())!;
      const wave = (await glyph(page, "wave", chosen[i]).boundingBox())!;
      const role = (await glyph(page, "role", chosen[i]).boundingBox())!;
      // The touch target may reach further towards one neighbour than the other: the note's own
      // centre is where the overlay says it lies within its target.
      const noteCentre = note.x + note.width * Number(await hit(page, chosen[i]).getAttribute("data-centre-at"));
      // Glyphs sit over their own note (horizontally centred on it) and above the notehead.
      expect(Math.abs(wave.x + wave.width / 2 - noteCentre)).toBeLessThan(note.width / 2 + 2);
      expect(Math.abs(role.x + role.width / 2 - noteCentre)).toBeLessThan(note.width / 2 + 2);
      expect(wave.y + wave.height).toBeLessThan(note.y + note.height - 8);
      // And independently of our own measuring: the engraved notehead itself lies right under them.
      const heads = await page.locator("svg .vf-notehead").evaluateAll((els) =>
        els.map((e) => {
          const r = e.getBoundingClientRect();
          return { x: r.x + r.width / 2, top: r.y };
        }),
      );
      const under = heads.filter((h) => Math.abs(h.x - noteCentre) < 3 && h.top > wave.y + wave.height && h.top - (wave.y + wave.height) < 120);
      expect(under.length, `a notehead under the wave of ${chosen[i]}`).toBeGreaterThan(0);
    }
    // Depth 0 is drawn as a flat line: "deliberately none".
    expect(await glyph(page, "wave", chosen[2]).getAttribute("data-kind")).toMatch(/none|flat/);
  });

  it("accepts a suggested leading tone and undoes it", async () => {
    await page.getByRole("button", { name: "Suggestions" }).click();
    const item = page.getByTestId("suggestions-panel").locator('li[data-role="tension"]', { hasText: "leading tone" }).first();
    await item.waitFor();
    const suggested = (await item.getAttribute("data-suggestion"))!;
    const accept = item.getByRole("button", { name: /^Accept tension tone at / });
    await page.getByRole("complementary", { name: "Marking and suggestions" }).screenshot({ path: screenshotPath("workspace-suggestions") });
    const markingsNow = async () =>
      (await page.evaluate(async (id) => (await fetch(`/api/parts/${id}/markings`)).json(), partId)).markings as Array<{ noteKey: string; role: string | null }>;
    expect((await markingsNow()).some((m) => m.role === "tension")).toBe(false);
    await accept.click();
    await expect.poll(async () => (await markingsNow()).filter((m) => m.role === "tension").length, { timeout: 15_000 }).toBe(1);
    const accepted = (await markingsNow()).find((m) => m.role === "tension")!;
    expect(accepted.noteKey).toBe(suggested);
    await glyph(page, "role", accepted.noteKey).waitFor();

    await page.keyboard.press("Control+z");
    await glyph(page, "role", accepted.noteKey).waitFor({ state: "detached" });
    await expect.poll(async () => (await markingsNow()).some((m) => m.noteKey === accepted.noteKey), { timeout: 15_000 }).toBe(false);
  });

  it("shows the conflict prompt to the second of two tabs editing the same note", async () => {
    const key = keys[12];
    await markNote(page, key, { depth: 20, speed: 5, role: "Peak" });
    const second = await context.newPage();
    await openWorkspace(second, partId);
    // The first tab changes the note; the second still holds the older version.
    await markNote(page, key, { depth: 25, speed: 5, role: "Peak" });
    await hit(second, key).click();
    const panel = second.getByTestId("marking-panel");
    await panel.getByLabel("Depth", { exact: true }).fill("40");
    await panel.getByLabel("Depth", { exact: true }).press("Enter");
    const prompt = second.getByTestId("conflict-prompt");
    await prompt.waitFor();
    expect(await prompt.textContent()).toContain("Mine");
    expect(await prompt.textContent()).toContain("Current");
    await second.screenshot({ path: screenshotPath("workspace-conflict") });
    await prompt.getByRole("button", { name: "Take current" }).click();
    await second.close();
  });

  it("keeps the side panel's tab labels and counts on one line on laptops and tablets", async () => {
    // 1280 px: a common laptop; 1024 px: a tablet held landscape (the narrowest width with the side rail).
    for (const [width, height] of [[1280, 860], [1024, 768]]) {
      await page.setViewportSize({ width, height });
      await openWorkspace(page, partId);
      const tab = page.getByRole("tab", { name: /^Suggestions \d+ to decide$/ });
      await tab.waitFor();
      const layout = await measureSideTabs(page);
      expect(layout, `at ${width} px`).toMatchObject({ oneLine: true, clipped: [], rowOverflows: false });
      expect(layout.labels[2]).toMatch(/^Suggestions\s*\d+$/);
      await widestTabCounts(page);
      expect(await measureSideTabs(page), `at ${width} px with 99+ on both`).toMatchObject({ oneLine: true, clipped: [], rowOverflows: false });
      await page.getByRole("complementary", { name: "Marking and suggestions" }).screenshot({ path: screenshotPath(`workspace-side-tabs-${width}`) });
    }
  });

  it("fits a tablet", async () => {
    await page.setViewportSize({ width: 820, height: 1180 });
    await openWorkspace(page, partId);
    await hit(page, keys[4]).click();
    await page.getByTestId("marking-panel").waitFor();
    // Held upright the side panel is a sheet across the whole width: the tabs fit with room to spare.
    expect(await measureSideTabs(page)).toMatchObject({ oneLine: true, clipped: [], rowOverflows: false });
    await page.screenshot({ path: screenshotPath("workspace-tablet") });
  });
});
