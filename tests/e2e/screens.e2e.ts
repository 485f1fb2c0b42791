import fs from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { axeViolations, type AxeViolation } from "../helpers/axe";
import { launchBrowser, OUTPUT_DIR } from "../helpers/browser";
import { measureLayout, MIN_TARGET, PLAYING_TARGET, VIEWPORTS } from "../helpers/layout";
import { openScreen, pagesFor, viewerContext, type Viewer } from "../helpers/screens";

/**
 * Every page on a phone and a tablet, both ways up, and an accessibility scan of every page for
 * each kind of account. Checked against WCAG 2.2 SC 1.4.10 Reflow (no sideways scrolling),
 * SC 2.5.8 Target Size (Minimum, 24 px), SC 2.5.5 Target Size (Enhanced, 44 px) for what is
 * used while playing, and axe-core's WCAG 2.1 A and AA rules.
 */

const LAYOUT_DIR = path.join(OUTPUT_DIR, "layout");

/** Controls used with the instrument in hand must take a fingertip: 44 px both ways. */
async function smallPlayingControls(page: Page, name: string): Promise<string[]> {
  const selector =
    name === "practice"
      ? '[data-testid="practice-room"] section button'
      : name === "workspace"
        ? '[data-testid="audition"] button'
        : name === "stand-view"
          ? // The view's own controls (page turns, legend); the site's header is not played from.
            '[data-testid="stand-view"] button'
          : null;
  if (!selector) return [];
  return page.locator(selector).evaluateAll(
    (els, min) =>
      els
        .filter((el) => (el as HTMLElement).offsetParent !== null)
        .map((el) => ({ el, r: el.getBoundingClientRect() }))
        .filter(({ r }) => r.width < min - 0.01 || r.height < min - 0.01)
        .map(({ el, r }) => `"${(el.textContent ?? "").trim().slice(0, 40)}" ${Math.round(r.width)}×${Math.round(r.height)}`),
    PLAYING_TARGET,
  );
}

/**
 * Note hit areas: 44 px tall, and 44 px wide unless a neighbouring note is closer, in which case
 * the two areas meet half-way (wider would take the neighbour's taps).
 */
async function smallNoteTargets(page: Page): Promise<string[]> {
  return page.locator('[data-layer="hits"] rect[data-note-key]').evaluateAll((els, min) => {
    const boxes = els.map((el) => ({ key: el.getAttribute("data-note-key") ?? "", r: el.getBoundingClientRect() }));
    const rows = new Map<number, typeof boxes>();
    for (const b of boxes) {
      const row = Math.round(b.r.top);
      rows.set(row, [...(rows.get(row) ?? []), b]);
    }
    const out: string[] = [];
    for (const row of rows.values()) {
      row.sort((a, b) => a.r.left - b.r.left);
      row.forEach((b, i) => {
        // Narrower than 44 px only where it meets (or, among crowded notes, overlaps) a neighbour.
        const meetsLeft = i > 0 && row[i - 1].r.right >= b.r.left - 0.5;
        const meetsRight = i < row.length - 1 && row[i + 1].r.left <= b.r.right + 0.5;
        if (b.r.height < min - 0.5 || (b.r.width < min - 0.5 && !meetsLeft && !meetsRight)) out.push(`${b.key} ${Math.round(b.r.width)}×${Math.round(b.r.height)}`);
      });
    }
    return out;
  }, PLAYING_TARGET);
}

describe("every page fits a phone and a tablet", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
    fs.mkdirSync(LAYOUT_DIR, { recursive: true });
  });
  afterAll(async () => {
    await browser?.close();
  });

  it(
    "has no sideways scrolling and no control under 24 px at 390×844, 844×390, 820×1180 and 1180×820",
    async () => {
      const problems: string[] = [];
      const table: string[] = [];
      // Each page once, seen by who uses it: the sign-in pages signed out, the accounts page as
      // admin; the studio also as the teacher, whose studio lists the students' parts.
      const plan: Array<[Viewer, string[]]> = [
        ["anonymous", ["landing", "sign-up", "sign-in"]],
        ["player", ["library", "workspace", "stand-copy", "practice", "stand-view", "studio", "settings"]],
        ["teacher", ["studio"]],
        ["admin", ["accounts"]],
      ];
      for (const [viewer, names] of plan) {
        const { context, page, partId } = await viewerContext(browser, viewer);
        const screens = pagesFor(viewer, partId).filter((s) => names.includes(s.name));
        for (const viewport of VIEWPORTS) {
          await page.setViewportSize(viewport);
          for (const screen of screens) {
            await openScreen(page, screen);
            const where = `${viewer === "teacher" ? "teacher's " : ""}${screen.name} at ${viewport.width}×${viewport.height}`;
            const m = await measureLayout(page, MIN_TARGET);
            if (viewport.name === "phone-portrait") table.push(`| ${viewer === "teacher" ? "teacher's " : ""}${screen.path.replace(partId ?? "\0", "[partId]")} | ${m.documentWidth} | ${m.small.length} |`);
            if (m.documentWidth > m.viewportWidth) problems.push(`${where}: the document is ${m.documentWidth} px wide (${m.overflowing.join("; ")})`);
            for (const s of m.sidewaysScrollers) problems.push(`${where}: ${s}`);
            for (const s of m.small) problems.push(`${where}: ${s.name} is ${s.width}×${s.height} px`);
            for (const s of await smallPlayingControls(page, screen.name)) problems.push(`${where}: a control used while playing is under 44 px: ${s}`);
            if (screen.name === "workspace" && viewport.name.startsWith("tablet")) {
              for (const s of await smallNoteTargets(page)) problems.push(`${where}: note hit area too small: ${s}`);
            }
            // The workspace fills the screen and scrolls inside: its screenshot is what the screen shows.
            const fullPage = screen.name !== "workspace";
            await page.screenshot({ path: path.join(LAYOUT_DIR, `${viewer === "teacher" ? "teacher-" : ""}${screen.name}-${viewport.width}x${viewport.height}.png`), fullPage });
          }
        }
        await context.close();
      }
      console.log(["At 390×844:", "| page | document width | controls under 24 px |", "|---|---|---|", ...table].join("\n"));
      expect(problems).toEqual([]);
    },
    600_000,
  );
});

describe("every page passes axe-core's WCAG 2.1 A and AA rules", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it(
    "for someone signed out, a player, a teacher and an admin",
    async () => {
      const found: Record<string, AxeViolation[]> = {};
      const counts: string[] = [];
      for (const viewer of ["anonymous", "player", "teacher", "admin"] as const) {
        const { context, page, partId } = await viewerContext(browser, viewer);
        for (const screen of pagesFor(viewer, partId)) {
          await openScreen(page, screen);
          const violations = await axeViolations(page);
          // The states a page spends most time in beyond its first view: a note chosen in the
          // workspace (the marking panel), a row's menu open in the library.
          if (screen.name === "workspace") {
            await page.locator('[data-layer="hits"] rect[data-note-key]').nth(2).click();
            await page.waitForFunction(() => !document.querySelector('[data-testid="note-announcer"]')?.textContent?.startsWith("No note"));
            violations.push(...(await axeViolations(page)));
          }
          if (screen.name === "library") {
            await page.getByRole("button", { name: /^Actions for / }).first().click();
            await page.getByRole("menu").waitFor();
            violations.push(...(await axeViolations(page)));
            await page.keyboard.press("Escape");
          }
          counts.push(`${viewer} ${screen.path.replace(partId ?? "\0", "[partId]")}: ${violations.reduce((n, v) => n + v.targets.length, 0)}`);
          if (violations.length) found[`${viewer} ${screen.name}`] = violations;
        }
        await context.close();
      }
      console.log(["axe-core violations (nodes) per page:", ...counts].join("\n"));
      expect(found).toEqual({});
    },
    600_000,
  );
});
