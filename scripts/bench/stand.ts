/**
 * The stand view's page turn, from the key press to the painted frame that shows the next page
 * (the task after the next animation frame), on a 200-bar marked part in a tablet's portrait and
 * landscape sizes. Baseline, in the same page and run: the same key event for a key the stand
 * view ignores, to the same painted frame (what any key press costs there). Goal: under 100 ms.
 */
import type { Page } from "playwright-core";
import type { BenchSection } from "./index";
import { generatePartXml } from "./generate-part";
import { percentile } from "./util";
import { launchContext } from "../../tests/helpers/browser";
import { multipartFile } from "../../tests/helpers/parts";
import { createSignedInUser } from "../../tests/helpers/session";

const APP_URL = process.env.APP_URL ?? "http://127.0.0.1:3000";
const RUNS = Number(process.env.BENCH_RUNS ?? 15);

/** ms from dispatching `key` on the window to the frame painted after it. */
async function keyToPaint(page: Page, key: string): Promise<number> {
  return page.evaluate(
    (k) =>
      new Promise<number>((resolve) => {
        const t0 = performance.now();
        window.dispatchEvent(new KeyboardEvent("keydown", { key: k, bubbles: true, cancelable: true }));
        requestAnimationFrame(() => setTimeout(() => resolve(performance.now() - t0), 0));
      }),
    key,
  );
}

const pageNumber = (page: Page) => page.getByTestId("stand-view").evaluate((el) => Number(el.getAttribute("data-page")));

const section: BenchSection = {
  name: "stand",
  async run() {
    const { client } = await createSignedInUser({ role: "player" });
    const xml = new TextEncoder().encode(generatePartXml({ measures: 200, seed: 5 }));
    const res = await client.fetch("/api/parts", { method: "POST", body: multipartFile("bench-stand-200.musicxml", xml) });
    const { id } = (await res.json()) as { id: string };
    // Every other note marked, as a teacher's long part is.
    const analysis = await (await client.fetch(`/api/parts/${id}/analysis`)).json();
    const keys: string[] = analysis.notes.map((n: { key: string }) => n.key).filter((_: string, i: number) => i % 2 === 0);
    const roles = ["phrase-start", "peak", "tension", "resolution", null];
    for (const [i, noteKey] of keys.entries()) {
      const body = { depthCents: 20 + (i % 5) * 10, speedHz: 5.5, placement: "centered", onset: "immediate", shape: "steady", role: roles[i % 5], comment: "" };
      const put = await client.fetch(`/api/parts/${id}/markings/${encodeURIComponent(noteKey)}`, { method: "PUT", body: JSON.stringify(body), headers: { "content-type": "application/json" } });
      if (!put.ok) throw new Error(`marking a note answered ${put.status}`);
    }

    const rows: Array<Record<string, string | number>> = [];
    for (const size of [
      { name: "portrait 820×1180", width: 820, height: 1180 },
      { name: "landscape 1180×820", width: 1180, height: 820 },
    ]) {
      const context = await launchContext(size);
      await context.addCookies(
        client.cookie.split("; ").filter(Boolean).map((pair) => {
          const [name, ...rest] = pair.split("=");
          return { name, value: rest.join("="), url: APP_URL };
        }),
      );
      await context.addInitScript("window.__name = (fn) => fn;");
      const page = await context.newPage();
      await page.goto(`${APP_URL}/parts/${id}/stand`);
      await page.locator('[data-testid="stand-view"]:not([data-pages="0"])').waitFor({ timeout: 120_000 });
      const pages = await page.getByTestId("stand-view").evaluate((el) => Number(el.getAttribute("data-pages")));
      const turns: number[] = [];
      const idle: number[] = [];
      for (let i = 0; i < RUNS; i++) {
        // Forward until the end, then back: every turn shows a page that was hidden.
        const forward = Math.floor(i / (pages - 1)) % 2 === 0;
        const before = await pageNumber(page);
        idle.push(await keyToPaint(page, "Shift"));
        turns.push(await keyToPaint(page, forward ? "PageDown" : "PageUp"));
        if ((await pageNumber(page)) === before) throw new Error("the page did not turn");
      }
      turns.sort((a, b) => a - b);
      idle.sort((a, b) => a - b);
      rows.push({
        size: size.name,
        pages,
        "turn p50 ms": +percentile(turns, 50).toFixed(1),
        "turn p95 ms": +percentile(turns, 95).toFixed(1),
        "ignored key p50 ms (baseline)": +percentile(idle, 50).toFixed(1),
        "turn ÷ baseline": +(percentile(turns, 50) / percentile(idle, 50)).toFixed(2),
        "under 100 ms": percentile(turns, 95) < 100 ? "yes" : "no",
      });
      await context.close();
    }
    console.table(rows);
  },
};
export default section;
