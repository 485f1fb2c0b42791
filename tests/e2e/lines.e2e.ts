import fs from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { launchContext, screenshotPath } from "../helpers/browser";
import { APP_URL } from "../helpers/env";
import { signInThroughForm, uploadInPage } from "../helpers/pages";
import { REAL_DIR } from "../helpers/real-corpus";
import { createUser } from "../helpers/session";

// Our two-flute sample written in two voices (tests/fixtures/real/ours): flute 1 starts on F♯5,
// flute 2 a third below on D5 and alone falls G5 → F♯5 in bar 2; bars 3–4 are a2.
const FILE = path.join(REAL_DIR, "ours/two-flutes-voices.musicxml");

const suggestionsText = (page: Page) => page.getByTestId("suggestions-panel").innerText();

describe("choosing the line of a staff with two players", () => {
  let context: BrowserContext;
  let page: Page;
  let partId: string;

  beforeAll(async () => {
    context = await launchContext({ width: 1280, height: 860 });
    page = await context.newPage();
    const user = await createUser({ role: "player" });
    await signInThroughForm(page, user.email, user.password, "/parts");
    const made = await uploadInPage(page, "two-flutes-voices.musicxml", fs.readFileSync(FILE, "utf8"));
    expect(made.status).toBe(201);
    partId = made.body.id;
  });
  afterAll(async () => {
    await context?.close();
  });

  it("offers Upper and Lower beside the part, and the suggestions follow the line", async () => {
    await page.goto(`${APP_URL}/parts/${partId}`);
    await page.locator('[data-score-status="ready"]').waitFor({ timeout: 60_000 });
    const group = page.getByRole("radiogroup", { name: "Line:" });
    await group.waitFor({ timeout: 30_000 });
    expect(await group.getByRole("radio", { name: "Upper" }).isChecked()).toBe(true);
    expect(await page.getByTestId("line-choice").innerText()).toMatch(/Two players share this staff, written in two voices/);
    await expect.poll(() => suggestionsText(page)).toMatch(/A phrase begins on F♯ in bar 1/);
    expect(await suggestionsText(page)).not.toMatch(/G is the subdominant/);

    // Each choice is a target of at least 44 × 44 px (the brief's size for touch).
    for (const name of ["Upper", "Lower"]) {
      const box = (await group.locator("label", { hasText: name }).boundingBox())!;
      expect(box.height).toBeGreaterThanOrEqual(44);
      expect(box.width).toBeGreaterThanOrEqual(44);
    }

    await group.locator("label", { hasText: "Lower" }).click();
    await expect.poll(() => suggestionsText(page), { timeout: 20_000 }).toMatch(/A phrase begins on D in bar 1/);
    expect(await suggestionsText(page)).toMatch(/G is the subdominant \(fourth degree\) of D major; it falls a half step to F♯ in bar 2/);
    expect(await group.getByRole("radio", { name: "Lower" }).isChecked()).toBe(true);
    await page.screenshot({ path: screenshotPath("lines-lower"), fullPage: false });

    // Kept: the page opened again is on the lower line.
    await page.reload();
    await page.getByRole("radiogroup", { name: "Line:" }).waitFor({ timeout: 60_000 });
    expect(await page.getByRole("radiogroup", { name: "Line:" }).getByRole("radio", { name: "Lower" }).isChecked()).toBe(true);
  });

  it("gives the practice page the lower line's notes, and the upper line's once chosen again", async () => {
    await page.goto(`${APP_URL}/parts/${partId}/practice`);
    await page.getByTestId("practice-room").waitFor();
    expect(await page.getByTestId("practice-line").innerText()).toMatch(/the lower line/);
    const options = () => page.getByLabel("Note to practise").locator("option").evaluateAll((els) => els.map((e) => (e as HTMLOptionElement).value));
    // Flute 2's D5 in voice 2 opens the list; flute 1's F♯5 is not there.
    expect((await options())[0]).toBe("P1:m0:s1:v2:0/1:74");
    expect(await options()).not.toContain("P1:m0:s1:v1:0/1:78");

    await page.goto(`${APP_URL}/parts/${partId}`);
    const group = page.getByRole("radiogroup", { name: "Line:" });
    await group.waitFor({ timeout: 60_000 });
    await group.locator("label", { hasText: "Upper" }).click();
    await expect.poll(() => suggestionsText(page), { timeout: 20_000 }).toMatch(/A phrase begins on F♯ in bar 1/);
    await page.goto(`${APP_URL}/parts/${partId}/practice`);
    await page.getByTestId("practice-room").waitFor();
    expect((await options())[0]).toBe("P1:m0:s1:v1:0/1:78");
    expect(await page.getByTestId("practice-line").innerText()).toMatch(/the upper line/);
  });
});
