import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext } from "playwright-core";
import { launchContext, screenshotPath } from "../helpers/browser";
import { APP_URL } from "../helpers/env";
import { waitForMail } from "../helpers/mailbox";
import { openMailLink } from "../helpers/pages";
import { createUser } from "../helpers/session";

describe("sign-in links in the browser", () => {
  let browser: BrowserContext;
  let other: BrowserContext;

  beforeAll(async () => {
    browser = await launchContext();
    other = await launchContext();
  });
  afterAll(async () => {
    await browser?.close();
    await other?.close();
  });

  it("asks for a link on /sign-in, opens it from the mailbox, signs in with its button and lands on the library", async () => {
    const user = await createUser({ role: "player", name: "Nadia Quillon", verified: false });
    const page = await browser.newPage();
    await page.goto(`${APP_URL}/sign-in`);
    await page.screenshot({ path: screenshotPath("sign-in"), fullPage: true });

    await page.getByRole("link", { name: "E-mail me a sign-in link" }).click();
    await page.waitForURL((url) => url.searchParams.get("method") === "link");
    await page.getByLabel("E-mail").fill(user.email);
    await page.getByRole("button", { name: "E-mail me a link" }).click();
    await page.getByText("If an account uses this address, we sent it a sign-in link.").waitFor();
    await page.screenshot({ path: screenshotPath("sign-in-link-request"), fullPage: true });

    // The mail leaves after the answer; wait for it before opening the mailbox page.
    await waitForMail(user.email, /Your Ondula sign-in link/);
    await openMailLink(page, user.email, /Your Ondula sign-in link/, "/sign-in/link");
    const linkUrl = page.url();
    const button = page.getByRole("button", { name: `Sign in as ${user.email}` });
    await button.waitFor();
    await page.screenshot({ path: screenshotPath("sign-in-link-page"), fullPage: true });
    await button.click();
    await page.waitForURL((url) => url.pathname === "/parts");
    expect(await page.getByTestId("signed-in-as").textContent()).toContain("Nadia Quillon");
    // Following the link confirmed the address: no banner asking to confirm it.
    expect(await page.getByRole("button", { name: "Send it again" }).count()).toBe(0);

    // Opened again in another browser, the used link says so and offers a new one.
    const second = await other.newPage();
    await second.goto(linkUrl);
    await second.getByRole("heading", { name: "This sign-in link has been used" }).waitFor();
    await second.screenshot({ path: screenshotPath("sign-in-link-used"), fullPage: true });
    await second.getByRole("link", { name: "E-mail me a new link" }).click();
    await second.waitForURL((url) => url.pathname === "/sign-in" && url.searchParams.get("method") === "link");
    expect(await second.getByLabel("E-mail").inputValue()).toBe(user.email);
  });
});
