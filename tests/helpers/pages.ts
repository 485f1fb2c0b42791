import { waitForMail } from "./mailbox";
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
  // Account mail is sent after the action has answered: wait for it before opening the mailbox.
  await waitForMail(to, subject);
  await page.goto(`${APP_URL}/dev/mail`);
  const message = page.locator("article").filter({ hasText: to }).filter({ has: page.getByRole("heading", { name: subject }) }).first();
  await message.getByRole("link", { name: new RegExp(`${path}\\?token=`) }).click();
  await page.waitForURL((url) => url.pathname === path);
}

/** Signs up through the form (which signs in), confirms the address from the local mailbox, opens `callbackUrl`. */
export async function signUpAndSignIn(page: Page, o: { name: string; email: string; password: string; callbackUrl: string }) {
  await page.goto(`${APP_URL}/sign-up`);
  await page.getByLabel("Name").fill(o.name);
  await page.getByLabel("E-mail").fill(o.email);
  await page.getByLabel("Password").fill(o.password);
  await page.getByRole("button", { name: "Create account" }).click();
  // A new account is signed in at once and lands in the library.
  await page.waitForURL((url) => url.pathname === "/parts" && url.searchParams.get("welcome") === "1");
  await openMailLink(page, o.email, /Confirm your e-mail address/, "/verify-email");
  await page.getByRole("button", { name: "Confirm my e-mail address" }).click();
  await page.getByText("Your e-mail address is confirmed.").waitFor();
  await page.goto(`${APP_URL}${o.callbackUrl}`);
  await page.waitForURL((url) => url.pathname === o.callbackUrl.split("?")[0]);
}

export interface SideTabsLayout {
  labels: string[];
  /** Every tab on the same line, none taller than one 44 px row. */
  oneLine: boolean;
  /** Tabs whose label and count do not fit inside them, and whether the row itself overflows. */
  clipped: string[];
  rowOverflows: boolean;
}

/** Measures the workspace's side-panel tabs as laid out in the browser. */
export async function measureSideTabs(page: Page): Promise<SideTabsLayout> {
  return page.getByRole("tablist", { name: "Side panel" }).evaluate((list) => {
    const tabs = [...list.querySelectorAll<HTMLElement>('[role="tab"]')];
    const boxes = tabs.map((t) => t.getBoundingClientRect());
    return {
      labels: tabs.map((t) => t.textContent ?? ""),
      oneLine: boxes.every((b) => Math.abs(b.top - boxes[0].top) < 1 && b.height <= 45),
      clipped: tabs.filter((t) => t.scrollWidth > t.clientWidth + 0.5).map((t) => t.textContent ?? ""),
      rowOverflows: list.scrollWidth > list.clientWidth + 0.5,
    };
  });
}

/**
 * Puts the widest counts the badges can show ("99+") on the Suggestions and Discussion tabs, so a
 * layout check covers the worst case without making a hundred of each.
 */
export async function widestTabCounts(page: Page): Promise<void> {
  await page.getByRole("tablist", { name: "Side panel" }).evaluate((list) => {
    const [, discussion, suggestions] = [...list.querySelectorAll<HTMLElement>('[role="tab"]')];
    const count = suggestions.querySelector<HTMLElement>('[data-testid="count-badge"]');
    if (!count) throw new Error("no count badge on the Suggestions tab");
    count.textContent = "99+";
    let unread = discussion.querySelector<HTMLElement>('[data-testid="unread-badge"]');
    if (!unread) {
      unread = document.createElement("span");
      // The unread badge's own classes (components/sharing/unread-badge.tsx).
      unread.className = "ml-1 inline-flex min-w-5 items-center justify-center rounded-full bg-ink px-1.5 text-xs font-semibold leading-5 text-paper";
      unread.dataset.testid = "unread-badge";
      discussion.append(unread);
    }
    unread.textContent = "99+";
  });
}

/** A note's click target in the workspace's overlay. */
export const noteHit = (page: Page, key: string) => page.locator(`[data-layer="hits"] [data-note-key="${key}"]`);

/** One of a note's drawn marking glyphs ("wave", "role", "numbers", …). */
export const noteGlyph = (page: Page, kind: string, key: string) => page.locator(`[data-glyph="${kind}"][data-note-key="${key}"]`);

/** Opens a part in the workspace and waits until its score is drawn and its notes take clicks. */
export async function openWorkspace(page: Page, partId: string): Promise<void> {
  await page.goto(`${APP_URL}/parts/${partId}`);
  await page.locator('[data-score-status="ready"][data-layout="drawn"]').waitFor({ timeout: 60_000 });
  await page.locator('[data-layer="hits"] [data-note-key]').first().waitFor();
}

/**
 * Uploads a file as the signed-in person in the page would (the page's own session cookie, a
 * multipart POST to /api/parts) and gives the answer's status and body.
 */
export async function uploadInPage(page: Page, fileName: string, content: string | Uint8Array): Promise<{ status: number; body: { id: string; chosenPart?: string } & Record<string, unknown> }> {
  const base64 = Buffer.from(typeof content === "string" ? new TextEncoder().encode(content) : content).toString("base64");
  return page.evaluate(
    async ({ name, data }) => {
      const bytes = Uint8Array.from(atob(data), (c) => c.charCodeAt(0));
      const form = new FormData();
      form.append("file", new Blob([bytes]), name);
      const res = await fetch("/api/parts", { method: "POST", body: form });
      return { status: res.status, body: await res.json() };
    },
    { name: fileName, data: base64 },
  );
}
