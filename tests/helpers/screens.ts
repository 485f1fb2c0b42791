import fs from "node:fs";
import path from "node:path";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { APP_URL, DEMO_PASSWORD } from "./env";
import { signInThroughForm } from "./pages";

/** Who looks at a page: nobody signed in, or one of the seeded demo accounts. */
export type Viewer = "anonymous" | "player" | "teacher" | "admin";

export interface ScreenPage {
  /** A short name for reports and screenshot files. */
  name: string;
  path: string;
  /** Resolves when the page shows what it is for (the engraving drawn, the list loaded…). */
  ready: (page: Page) => Promise<void>;
}

const heading = (page: Page) => page.getByRole("heading", { level: 1 }).first().waitFor();

/** The pages of the app a viewer can open; part pages use `partId`. */
export function pagesFor(viewer: Viewer, partId: string | null): ScreenPage[] {
  const part = (suffix: string) => `/parts/${partId}${suffix}`;
  const common: ScreenPage[] = [{ name: "landing", path: "/", ready: heading }];
  if (viewer === "anonymous") {
    return [...common, { name: "sign-up", path: "/sign-up", ready: heading }, { name: "sign-in", path: "/sign-in", ready: heading }];
  }
  const account: ScreenPage[] = [{ name: "settings", path: "/settings", ready: heading }];
  if (viewer === "admin") return [...common, { name: "accounts", path: "/admin/users", ready: (p) => p.locator("table tbody tr").first().waitFor() }, ...account];
  const parts: ScreenPage[] = [
    { name: "library", path: "/parts", ready: (p) => p.locator("tbody tr").first().waitFor() },
    {
      name: "workspace",
      path: part(""),
      // Drawn, and the analysis (asked for once the score is drawn) in: the phrase map shows.
      ready: async (p) => {
        await p.locator('[data-layout="drawn"]').waitFor();
        await p.getByTestId("phrase-map").waitFor();
      },
    },
    { name: "stand-copy", path: part("/print"), ready: (p) => p.locator('[data-stand-score="ready"]').waitFor() },
    { name: "practice", path: part("/practice"), ready: (p) => p.getByTestId("practice-room").waitFor() },
  ];
  // The stand view, once the app has it.
  if (fs.existsSync(path.resolve("app", "(workspace)", "parts", "[partId]", "stand", "page.tsx"))) {
    parts.push({ name: "stand-view", path: part("/stand"), ready: heading });
  }
  return [...common, ...parts, { name: "studio", path: "/studio", ready: heading }, ...account];
}

/** A context signed in as the viewer, and the demo part it can open (the player's, shared with the teacher). */
export async function viewerContext(browser: Browser, viewer: Viewer): Promise<{ context: BrowserContext; page: Page; partId: string | null }> {
  const context = await browser.newContext({ viewport: { width: 1280, height: 860 } });
  const page = await context.newPage();
  if (viewer === "anonymous") return { context, page, partId: null };
  await signInThroughForm(page, `${viewer}@demo.ondula.test`, DEMO_PASSWORD, "/settings");
  if (viewer === "admin") return { context, page, partId: null };
  const partId = await page.evaluate(async () => {
    const list = (await (await fetch("/api/parts?query=Harbour")).json()) as { items: { id: string; title: string }[] };
    return list.items.find((p) => p.title === "Harbour Song")?.id ?? null;
  });
  if (!partId) throw new Error(`the demo ${viewer} sees no Harbour Song: is the demo seeded?`);
  return { context, page, partId };
}

/** Opens a page and waits until it shows its content, with the fonts in place. */
export async function openScreen(page: Page, screen: ScreenPage): Promise<void> {
  await page.goto(`${APP_URL}${screen.path}`);
  await screen.ready(page);
  await page.evaluate(() => document.fonts.ready.then(() => undefined));
}
