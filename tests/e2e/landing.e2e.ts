import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext } from "playwright-core";
import { launchContext, screenshotPath } from "../helpers/browser";
import { APP_URL } from "../helpers/env";

describe("landing page", () => {
  let context: BrowserContext;
  beforeAll(async () => {
    context = await launchContext();
  });
  afterAll(async () => {
    await context?.close();
  });

  it("says what Ondula is and links to sign-up", async () => {
    const page = await context.newPage();
    await page.goto(APP_URL);
    await expect(page.getByRole("heading", { level: 1 }).textContent()).resolves.toContain("phrase");
    expect(await page.getByText(/flutists first/).count()).toBe(1);
    const signUp = page.getByRole("link", { name: "Create an account" });
    expect(await signUp.getAttribute("href")).toBe("/sign-up");
    // The local font is served by the app itself, not fetched from anywhere else.
    const family = await page.evaluate(() => getComputedStyle(document.body).fontFamily);
    expect(family.toLowerCase()).toContain("sans");
    await page.screenshot({ path: screenshotPath("landing"), fullPage: true });
  });
});
