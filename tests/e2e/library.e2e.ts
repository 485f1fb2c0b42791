import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { launchContext, screenshotPath } from "../helpers/browser";
import { APP_URL } from "../helpers/env";
import { signUpAndSignIn } from "../helpers/pages";
import { SAMPLES_DIR } from "../helpers/parts";
import { uniqueSuffix } from "../helpers/session";

const rowTitles = (page: Page) => page.locator("tbody tr td:first-child a").allTextContents();

async function backToLibrary(page: Page) {
  await page.goto(`${APP_URL}/parts`);
  await page.locator("tbody tr").first().waitFor();
}

describe("the library in the browser", () => {
  let context: BrowserContext;
  let page: Page;

  beforeAll(async () => {
    context = await launchContext();
    page = await context.newPage();
  });
  afterAll(async () => {
    await context?.close();
  });

  it("a new player signs up, meets the empty library and uploads a file", async () => {
    await signUpAndSignIn(page, {
      name: "Lior Vantane",
      email: `e2e-library-${uniqueSuffix()}@test.ondula.test`,
      password: "reed-and-breath-daily",
      callbackUrl: "/parts",
    });
    await page.getByText("No parts yet.").waitFor();

    await page.getByLabel("Choose a file").setInputFiles(path.join(SAMPLES_DIR, "harbour-song.musicxml"));
    await page.waitForURL(/\/parts\/[0-9a-f-]{36}$/);
    await backToLibrary(page);
    expect(await rowTitles(page)).toHaveLength(1);
  });

  it("shows the reader's message next to a file it cannot use", async () => {
    await page.getByLabel("Choose a file").setInputFiles({ name: "photo.musicxml", mimeType: "image/png", buffer: Buffer.from("89504e470d0a1a0a0000000d49484452", "hex") });
    const alert = page.getByRole("alert").filter({ hasText: "photo.musicxml could not be used" });
    await alert.waitFor();
    // The message speaks of the file; the code is behind "Details".
    expect(await alert.textContent()).toContain("not MusicXML");
    const details = alert.locator("details");
    expect(await details.evaluate((d: HTMLDetailsElement) => d.open)).toBe(false);
    await alert.getByText("Details", { exact: true }).click();
    expect(await details.evaluate((d: HTMLDetailsElement) => d.open)).toBe(true);
    expect(await details.textContent()).toMatch(/Code unsupported:image · HTTP 415/);
  });

  it("brings in samples, sorts, searches, renames and deletes", async () => {
    for (const sample of ["lantern waltz", "morning ferry", "quiet orchard", "evening duet"]) {
      await page.getByLabel("Sample part").selectOption({ label: sample });
      await page.getByRole("button", { name: "Try this sample" }).click();
      if (sample === "evening duet") {
        // A flute-and-piano score asks which part the player plays, the flute chosen first.
        const flute = page.getByRole("radio", { name: /Flute/ });
        await flute.waitFor();
        expect(await flute.isChecked()).toBe(true);
        await page.getByRole("button", { name: "Open this part" }).click();
      }
      await page.waitForURL(/\/parts\/[0-9a-f-]{36}$/);
      await backToLibrary(page);
    }
    expect(await rowTitles(page)).toHaveLength(5);
    await page.screenshot({ path: screenshotPath("library-five-parts"), fullPage: true });

    const byTitle = [...(await rowTitles(page))].sort((a, b) => a.toLowerCase().localeCompare(b.toLowerCase()));
    await page.getByRole("button", { name: /^Title/ }).click();
    await page.locator("table[aria-busy='false'] th[aria-sort='ascending']").waitFor();
    const ascending = await rowTitles(page);
    expect(ascending).toEqual(byTitle);
    await page.getByRole("button", { name: /^Title/ }).click();
    await page.locator("table[aria-busy='false'] th[aria-sort='descending']").waitFor();
    expect(await rowTitles(page)).toEqual([...byTitle].reverse());

    const target = ascending[0];
    await page.getByLabel("Search title or composer").fill(target.split(" ")[0]);
    await page.waitForFunction((n) => document.querySelectorAll("tbody tr").length === n, 1);
    expect(await rowTitles(page)).toEqual([target]);

    // The row's actions are in its menu, opened from the keyboard here and by pointer below.
    const actions = page.getByRole("button", { name: `Actions for ${target}` });
    expect(await actions.getAttribute("aria-haspopup")).toBe("menu");
    await actions.focus();
    await page.keyboard.press("ArrowDown");
    const menu = page.getByRole("menu", { name: `Actions for ${target}` });
    expect(await menu.getByRole("menuitem").allTextContents()).toEqual(["Stand view", "Download the original file", "Rename", "Delete"]);
    expect(await menu.getByRole("menuitem", { name: "Stand view" }).evaluate((el) => el === document.activeElement)).toBe(true);
    await page.keyboard.press("Escape");
    await menu.waitFor({ state: "detached" });
    expect(await actions.evaluate((el) => el === document.activeElement)).toBe(true);
    await actions.click();
    await page.getByRole("menuitem", { name: "Rename" }).click();
    await page.getByLabel("New title").fill("Audition copy");
    await page.getByRole("button", { name: "Save" }).click();
    await page.getByLabel("Search title or composer").fill("");
    await page.getByRole("link", { name: "Audition copy", exact: true }).waitFor();

    await page.getByRole("button", { name: "Actions for Audition copy" }).click();
    await page.getByRole("menuitem", { name: "Delete" }).click();
    await page.getByRole("button", { name: "Delete for good" }).click();
    await page.waitForFunction((n) => document.querySelectorAll("tbody tr").length === n, 4);
    expect(await rowTitles(page)).not.toContain("Audition copy");
  });

  it("tells how many markings came in with an Ondula export, and the library counts them", async () => {
    // A marked part exported as MusicXML, through the same routes the workspace uses.
    const exported = await page.evaluate(async () => {
      const json = (method: string, body: unknown): RequestInit => ({ method, headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
      const source = await (await fetch("/api/parts/samples", json("POST", { name: "harbour-song.musicxml" }))).json();
      const analysis = await (await fetch(`/api/parts/${source.id}/analysis`)).json();
      const keys: string[] = analysis.notes.map((n: { key: string }) => n.key);
      const values = [
        { depthCents: 15, speedHz: 5, placement: "centered", onset: "immediate", shape: "steady", role: "phrase-start", comment: "" },
        { depthCents: 30, speedHz: 6, placement: "centered", onset: "delayed", shape: "growing", role: "peak", comment: "Bloom" },
        { depthCents: 0, speedHz: 5.5, placement: "centered", onset: "immediate", shape: "steady", role: "resolution", comment: "" },
      ];
      for (let i = 0; i < values.length; i++) {
        const res = await fetch(`/api/parts/${source.id}/markings/${encodeURIComponent(keys[i * 3])}`, json("PUT", values[i]));
        if (res.status !== 201) throw new Error(`marking answered ${res.status}`);
      }
      return (await fetch(`/api/parts/${source.id}/export?format=musicxml`)).text();
    });
    expect(exported).toContain("ondula-marking");

    await backToLibrary(page);
    await page.getByLabel("Choose a file").setInputFiles({ name: "harbour-song-marked.musicxml", mimeType: "application/xml", buffer: Buffer.from(exported) });
    const notice = page.getByTestId("import-notice");
    await notice.waitFor();
    expect(await notice.getByText("Imported 3 markings from the file.").count()).toBe(1);
    expect(await page.getByRole("button", { name: "Open the part" }).evaluate((b) => b === document.activeElement)).toBe(true);
    await page.locator("section", { has: notice }).screenshot({ path: screenshotPath("library-import-notice") });

    await page.getByRole("button", { name: "Open the part" }).click();
    await page.waitForURL(/\/parts\/[0-9a-f-]{36}$/);
    const partId = new URL(page.url()).pathname.split("/").pop()!;
    await backToLibrary(page);
    const row = page.locator("tbody tr", { has: page.locator(`a[href="/parts/${partId}"]`) });
    // Columns: title, composer, key, bars, markings.
    expect(await row.locator("td").nth(4).textContent()).toBe("3");
  });
});
