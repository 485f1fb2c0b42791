import { execFileSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { db } from "@/db/client";
import { commentThreads, comments } from "@/db/schema";
import { launchContext, OUTPUT_DIR, screenshotPath } from "../helpers/browser";
import { APP_URL } from "../helpers/env";
import { signInThroughForm } from "../helpers/pages";
import { createUser } from "../helpers/session";

/** A grayscale PGM page from pdftoppm (poppler-utils): width, height and one byte per pixel. */
function readPgm(file: string): { width: number; height: number; pixels: Uint8Array } {
  const bytes = fs.readFileSync(file);
  const header = /^P5\s+(\d+)\s+(\d+)\s+(\d+)\s/.exec(bytes.subarray(0, 64).toString("latin1"));
  if (!header) throw new Error(`${file} is not a binary PGM`);
  const [, w, h, max] = header;
  expect(Number(max)).toBe(255);
  return { width: Number(w), height: Number(h), pixels: bytes.subarray(header[0].length) };
}

/** Dark pixels (below mid-grey) per row band of the page, as fractions. */
function darkness(pgm: ReturnType<typeof readPgm>) {
  let dark = 0;
  const rows: number[] = [];
  for (let y = 0; y < pgm.height; y++) {
    let row = 0;
    for (let x = 0; x < pgm.width; x++) if (pgm.pixels[y * pgm.width + x] < 128) row++;
    rows.push(row);
    dark += row;
  }
  return { total: dark / (pgm.width * pgm.height), rows };
}

function pdfInfo(file: string): { pages: number; width: number; height: number } {
  const info = execFileSync("pdfinfo", [file], { encoding: "utf8" });
  const [, w, h] = /Page size:\s+([\d.]+) x ([\d.]+) pts/.exec(info)!;
  return { pages: Number(/Pages:\s+(\d+)/.exec(info)![1]), width: Number(w), height: Number(h) };
}

/** Page size in points, to the point (Chromium rounds its own print to its internal units). */
const pageSize = (file: string) => {
  const { width, height } = pdfInfo(file);
  return [Math.round(width), Math.round(height)];
};

describe("the stand copy", () => {
  let context: BrowserContext;
  let page: Page;
  let partId: string;
  let playerName: string;
  const markedKeys: string[] = [];

  beforeAll(async () => {
    fs.mkdirSync(OUTPUT_DIR, { recursive: true });
    context = await launchContext({ width: 1280, height: 900 });
    page = await context.newPage();
    const user = await createUser({ role: "player" });
    playerName = user.name;
    await signInThroughForm(page, user.email, user.password, "/parts");
    partId = (
      await page.evaluate(async () => {
        const res = await fetch("/api/parts/samples", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ name: "stone-bridge.musicxml" }) });
        return res.json();
      })
    ).id;
    const analysis = await page.evaluate(async (id) => (await fetch(`/api/parts/${id}/analysis`)).json(), partId);
    const keys: string[] = analysis.notes.map((n: { key: string }) => n.key);
    const plan = [
      { at: 1, depthCents: 15, speedHz: 5, role: "phrase-start", placement: "centered", shape: "steady", comment: "" },
      { at: 6, depthCents: 40, speedHz: 6.5, role: "peak", placement: "top-on-pitch", shape: "growing", comment: "Open the sound here" },
      { at: 11, depthCents: 25, speedHz: 5.5, role: "tension", placement: "centered", shape: "fading", comment: "" },
      { at: 12, depthCents: 0, speedHz: 5, role: "resolution", placement: "centered", shape: "steady", comment: "" },
      { at: keys.length - 8, depthCents: 30, speedHz: 6, role: null, placement: "centered", shape: "steady", comment: "" },
    ];
    for (const { at, ...m } of plan) {
      const status = await page.evaluate(
        async ({ id, key, body }) => (await fetch(`/api/parts/${id}/markings/${encodeURIComponent(key)}`, { method: "PUT", headers: { "content-type": "application/json" }, body: JSON.stringify(body) })).status,
        { id: partId, key: keys[at], body: { ...m, onset: "immediate" } },
      );
      expect(status).toBe(201);
      markedKeys.push(keys[at]);
    }
    // A teacher's comment on a note (written straight to the tables the sharing screens use).
    const teacher = await createUser({ role: "teacher", name: "Teacher Ilse Varrow" });
    const [thread] = await db().insert(commentThreads).values({ partId, threadKey: keys[6] }).returning();
    await db().insert(comments).values({ threadId: thread.id, partId, authorId: teacher.id, body: "Less vibrato on the way up, more at the top." });
  });

  afterAll(async () => {
    await context?.close();
  });

  it("is reached from the workspace's export menu, next to audition with its caution", async () => {
    await page.goto(`${APP_URL}/parts/${partId}`);
    await page.locator('[data-score-status="ready"][data-layout="drawn"]').waitFor({ timeout: 60_000 });
    await expect(page.getByTestId("audition-caution").textContent()).resolves.toContain("Audio starts quiet; keep headphone volume moderate.");
    await page.locator(`[data-layer="hits"] [data-note-key="${markedKeys[1]}"]`).click();
    await page.getByRole("button", { name: "Listen to the selected note" }).click();
    await page.getByRole("button", { name: /Stop/ }).and(page.locator(":enabled")).waitFor();
    await page.getByRole("button", { name: /Stop/ }).click();

    await page.getByText("Export ▾").click();
    const menu = page.getByTestId("export-menu");
    expect(await menu.getByRole("link", { name: "MusicXML with markings" }).getAttribute("href")).toBe(`/api/parts/${partId}/export?format=musicxml`);
    expect(await menu.getByRole("link", { name: "MIDI with vibrato" }).getAttribute("href")).toBe(`/api/parts/${partId}/export?format=midi`);
    await menu.getByRole("link", { name: "Stand copy (print, PDF)" }).click();
    await page.waitForURL((url) => url.pathname === `/parts/${partId}/print`);
    await page.locator('[data-stand-score="ready"]').waitFor({ state: "attached", timeout: 60_000 });
  });

  it("prints clean pages: every system whole, glyphs above the notes, legend and table, no app chrome", async () => {
    const systems = page.locator(".stand-system");
    expect(await systems.count()).toBeGreaterThanOrEqual(2);
    // Every marked note's wave is drawn in some system.
    for (const key of markedKeys) expect(await page.locator(`.stand-system [data-glyph="wave"][data-note-key="${key}"]`).count()).toBeGreaterThanOrEqual(1);
    expect(await page.locator('.stand-system [data-glyph="role"]').count()).toBeGreaterThanOrEqual(4);
    await expect(page.getByTestId("stand-meta").textContent()).resolves.toContain(`Player: ${playerName}`);
    const rows = page.locator('[data-testid="marked-notes"] tbody tr');
    expect(await rows.count()).toBe(markedKeys.length);
    expect(await rows.nth(1).textContent()).toContain("Open the sound here");
    await expect(page.getByRole("heading", { name: "Legend" }).isVisible()).resolves.toBe(true);
    await expect(page.getByText("Less vibrato on the way up, more at the top.").isVisible()).resolves.toBe(true);

    await page.emulateMedia({ media: "print", colorScheme: "light" });
    expect(await page.getByRole("navigation", { name: "Main" }).isVisible()).toBe(false);
    expect(await page.getByRole("button", { name: "Download PDF" }).isVisible()).toBe(false);
    expect(await systems.first().evaluate((el) => getComputedStyle(el).breakInside)).toBe("avoid");

    // Chromium's own print of the page: A4 as the @page rule asks (ISO 216: 210 × 297 mm = 595.28 × 841.89 pt).
    const printed = path.join(OUTPUT_DIR, "stand-copy-browser-print.pdf");
    await page.pdf({ path: printed, preferCSSPageSize: true, printBackground: false });
    try {
      expect(pageSize(printed)).toEqual([595, 842]);
      await page.addStyleTag({ content: "html { filter: grayscale(1); }" });
      await page.screenshot({ path: screenshotPath("stand-copy-print-grayscale"), fullPage: true });
    } finally {
      await page.emulateMedia({ media: "screen" });
      await page.reload();
      await page.locator('[data-stand-score="ready"]').waitFor({ state: "attached", timeout: 60_000 });
    }
  });

  it("downloads a PDF whose first page shows the title and the engraved, marked part", async () => {
    const download = page.waitForEvent("download");
    await page.getByRole("button", { name: "Download PDF" }).click();
    const file = path.join(OUTPUT_DIR, "stand-copy.pdf");
    await (await download).saveAs(file);
    await expect(page.getByTestId("pdf-status").textContent()).resolves.toContain("downloaded");

    // jsPDF's A4: 595.28 × 841.89 pt.
    expect(pageSize(file)).toEqual([595, 842]);
    const text = execFileSync("pdftotext", ["-layout", file, "-"], { encoding: "utf8" });
    expect(text).toContain("The Stone Bridge");
    expect(text).toContain(`Player: ${playerName}`);
    expect(text).toContain("Marked notes");
    expect(text).toContain("Open the sound here");
    expect(text).toContain("Less vibrato on the way up");

    // Rasterize the first page (poppler's pdftoppm) and look: ink on the page, spread over it.
    const stem = path.join(OUTPUT_DIR, "stand-copy-page");
    execFileSync("pdftoppm", ["-gray", "-r", "80", "-f", "1", "-l", "1", "-singlefile", file, stem]);
    execFileSync("pdftoppm", ["-png", "-r", "80", "-f", "1", "-l", "1", "-singlefile", file, stem]);
    const pgm = readPgm(`${stem}.pgm`);
    // A4 at 80 dpi: 210 / 25.4 × 80 ≈ 661 by 297 / 25.4 × 80 ≈ 935 pixels.
    expect(Math.abs(pgm.width - 661)).toBeLessThanOrEqual(1);
    expect(Math.abs(pgm.height - 935)).toBeLessThanOrEqual(1);
    const { total, rows } = darkness(pgm);
    expect(total).toBeGreaterThan(0.01);
    expect(total).toBeLessThan(0.3);
    // Staff lines: full-width dark rows (five per staff), at least two systems on the first page.
    const staffRows = rows.filter((r) => r > pgm.width * 0.6).length;
    expect(staffRows).toBeGreaterThanOrEqual(10);
  });

  it("switches to Letter paper", async () => {
    // The choice navigates (the radio follows the address), so a click rather than a check.
    await page.getByRole("radio", { name: "Letter" }).click();
    await page.waitForURL((url) => url.searchParams.get("paper") === "letter");
    await page.locator('[data-testid="stand-copy"][data-paper="letter"] [data-stand-score="ready"]').waitFor({ state: "attached", timeout: 60_000 });
    // Engraved at Letter's printable width: 7.5 in × 96 px.
    expect(await page.locator(".stand-system").first().getAttribute("width")).toBe("720");
    const download = page.waitForEvent("download");
    await page.getByRole("button", { name: "Download PDF" }).click();
    const file = path.join(OUTPUT_DIR, "stand-copy-letter.pdf");
    await (await download).saveAs(file);
    // US Letter: 8.5 × 11 in = 612 × 792 pt.
    expect(pageSize(file)).toEqual([612, 792]);
  });

  it("says the part is not here when the viewer may not see it", async () => {
    await page.goto(`${APP_URL}/parts/00000000-0000-4000-8000-000000000000/print`);
    await page.getByRole("heading", { name: "This part is not here" }).waitFor();
    expect(await page.getByTestId("stand-copy").count()).toBe(0);
  });
});
