import type { Page } from "playwright-core";
import { APP_URL } from "./env";

/** Page objects shared by the end-to-end suites: what a person sees and does, by role and label. */

export async function signInThroughForm(page: Page, email: string, password: string, callbackUrl: string) {
  await page.goto(`${APP_URL}/sign-in?callbackUrl=${encodeURIComponent(callbackUrl)}`);
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((url) => url.pathname === callbackUrl.split("?")[0]);
}

export async function openMailLink(page: Page, to: string, subject: RegExp, path: string) {
  await page.goto(`${APP_URL}/dev/mail`);
  const message = page.locator("article").filter({ hasText: to }).filter({ has: page.getByRole("heading", { name: subject }) }).first();
  await message.getByRole("link", { name: new RegExp(`${path}\\?token=`) }).click();
  await page.waitForURL((url) => url.pathname === path);
}

/** Signs up through the form, confirms the address from the local mailbox and signs in. */
export async function signUpAndSignIn(page: Page, o: { name: string; email: string; password: string; callbackUrl: string }) {
  await page.goto(`${APP_URL}/sign-up`);
  await page.getByLabel("Name").fill(o.name);
  await page.getByLabel("E-mail").fill(o.email);
  await page.getByLabel("Password").fill(o.password);
  await page.getByRole("button", { name: "Create account" }).click();
  await page.waitForURL((url) => url.pathname === "/sign-in");
  await openMailLink(page, o.email, /Confirm your e-mail address/, "/verify-email");
  await page.getByRole("button", { name: "Confirm my e-mail address" }).click();
  await page.getByText("Your e-mail address is confirmed.").waitFor();
  await signInThroughForm(page, o.email, o.password, o.callbackUrl);
}
