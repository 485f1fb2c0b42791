import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext } from "playwright-core";
import { launchContext, screenshotPath } from "../helpers/browser";
import { APP_URL, DEMO_PASSWORD } from "../helpers/env";
import { openMailLink, signInThroughForm } from "../helpers/pages";
import { uniqueSuffix } from "../helpers/session";

describe("accounts in the browser", () => {
  let player: BrowserContext;
  let teacher: BrowserContext;
  const email = `e2e-player-${uniqueSuffix()}@test.ondula.test`;
  const password = "flute-evening-practice";
  const name = "Ines Morlaix";

  beforeAll(async () => {
    player = await launchContext();
    teacher = await launchContext();
  });
  afterAll(async () => {
    await player?.close();
    await teacher?.close();
  });

  it("signs up as a player, confirms the address from /dev/mail and signs in", async () => {
    const page = await player.newPage();
    await page.goto(`${APP_URL}/sign-up`);
    await page.getByLabel("Name").fill(name);
    await page.getByLabel("E-mail").fill(email);
    // A common password is refused next to the field, and what was typed stays.
    await page.getByLabel("Password").fill("password123");
    await page.getByRole("button", { name: "Create account" }).click();
    await expect(page.getByText("This password is on a list of common passwords").textContent()).resolves.toBeTruthy();
    expect(await page.getByLabel("Name").inputValue()).toBe(name);
    expect(await page.getByLabel("Password").getAttribute("aria-invalid")).toBe("true");
    await page.screenshot({ path: screenshotPath("sign-up"), fullPage: true });

    await page.getByLabel("Password").fill(password);
    expect(await page.getByRole("radio", { name: /Player/ }).isChecked()).toBe(true);
    await page.getByRole("button", { name: "Create account" }).click();
    // Signed in at once, in the library.
    await page.waitForURL((url) => url.pathname === "/parts" && url.searchParams.get("welcome") === "1");
    expect(await page.getByTestId("signed-in-as").textContent()).toContain(name);

    await openMailLink(page, email, /Confirm your e-mail address/, "/verify-email");
    await page.getByRole("button", { name: "Confirm my e-mail address" }).click();
    await page.getByText("Your e-mail address is confirmed.").waitFor();

    await page.goto(`${APP_URL}/studio`);
    const header = page.getByTestId("signed-in-as");
    expect(await header.textContent()).toContain(name);
    expect(await header.textContent()).toContain("Player");
    expect(await page.getByText("You are not in a studio yet").count()).toBe(1);
  });

  it("the demo teacher invites the player, who joins through the link in the mailbox", async () => {
    const tPage = await teacher.newPage();
    await signInThroughForm(tPage, "teacher@demo.ondula.test", DEMO_PASSWORD, "/studio");
    await tPage.getByLabel("Student's e-mail").fill(email);
    await tPage.getByRole("button", { name: "Send invitation" }).click();
    await tPage.getByText(`Invitation sent to ${email}.`).waitFor();

    const page = await player.newPage();
    await openMailLink(page, email, /invites you to their Ondula studio/, "/studio/join");
    await page.getByRole("button", { name: /^Join / }).click();
    await page.waitForURL((url) => url.pathname === "/studio" && url.searchParams.get("joined") === "1");
    await page.getByText("You joined the studio.").waitFor();
    expect(await page.getByText("Teacher: Teo Barral").count()).toBe(1);

    await tPage.reload();
    const members = tPage.getByRole("table", { name: "Studio members" });
    expect(await members.getByRole("cell", { name, exact: true }).count()).toBe(1);
    expect(await tPage.getByTestId("signed-in-as").textContent()).toContain("Teacher");
    await tPage.screenshot({ path: screenshotPath("studio-teacher"), fullPage: true });
  });

  it("an admin sees the account in /admin/users and a player is refused the page", async () => {
    const page = await player.newPage();
    const refused = await page.goto(`${APP_URL}/admin/users`);
    expect(refused?.status()).toBe(404);

    const admin = await launchContext();
    try {
      const aPage = await admin.newPage();
      await signInThroughForm(aPage, "admin@demo.ondula.test", DEMO_PASSWORD, "/admin/users");
      await aPage.getByLabel("Search by name or e-mail").fill("demo.ondula.test");
      await aPage.getByRole("button", { name: "Search" }).click();
      await aPage.waitForURL((url) => url.searchParams.get("q") === "demo.ondula.test");
      expect(await aPage.getByRole("cell", { name: "player@demo.ondula.test" }).count()).toBe(1);
      await aPage.screenshot({ path: screenshotPath("admin-users"), fullPage: true });
    } finally {
      await admin.close();
    }
  });
});
