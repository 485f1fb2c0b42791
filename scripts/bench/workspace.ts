/**
 * The workspace in Chromium: for parts of 10, 100, 300 and 1,000 bars, the time from navigation until
 * the score is drawn and its notes are selectable, next to a bare page that only engraves the
 * same text (measured in the same run); the time from a click on a note to the marking panel
 * showing it; and the bytes of JavaScript the page loads besides the engraving library.
 */
import zlib from "node:zlib";
import type { BrowserContext, Page } from "playwright-core";
import type { BenchSection } from "./index";
import { profileLoad } from "./cpu-profile";
import { generatePartXml } from "./generate-part";
import { launchContext } from "../../tests/helpers/browser";
import { multipartFile } from "../../tests/helpers/parts";
import { createSignedInUser } from "../../tests/helpers/session";
import { DEFAULT_MARKING } from "../../lib/markings/schema";

type SignedInClient = Awaited<ReturnType<typeof createSignedInUser>>["client"];

const APP_URL = process.env.APP_URL ?? "http://127.0.0.1:3000";
const RUNS = Number(process.env.BENCH_RUNS ?? 7);
/** The part sizes to time (`BENCH_BARS=1000` times only the long part, e.g. to repeat its runs). */
const SIZES = (process.env.BENCH_BARS ?? "10,100,300,1000").split(",").map(Number);

/**
 * Records, inside the page, the moment (ms since navigation start) a condition first holds in the
 * DOM, and the moment the frame showing it has been painted (the task after the next animation
 * frame): "drawn" means on the screen, which for both pages includes the browser's layout of the
 * engraving.
 */
const READY_PROBE = `
  (() => {
    const check = () => {
      // A long part's opening is selectable first; the whole part follows when the page is idle.
      if (!window.__benchWholeAt && document.querySelector('[data-score-status="ready"][data-engraved="whole"]')) {
        requestAnimationFrame(() => setTimeout(() => { window.__benchWholeAt ??= performance.now(); }, 0));
      }
      if (window.__benchInDomAt) return;
      const workspace = document.querySelector('[data-score-status="ready"]') && document.querySelector('[data-layer="hits"] [data-note-key]');
      const bare = document.querySelector('[data-bare-ready="true"] svg');
      if (!workspace && !bare) return;
      window.__benchInDomAt = performance.now();
      requestAnimationFrame(() => setTimeout(() => { window.__benchReadyAt = performance.now(); }, 0));
    };
    new MutationObserver(check).observe(document, { subtree: true, childList: true, attributes: true });
  })();
`;

interface Ready {
  /** Painted: the score on screen and its notes selectable (for a long part, its opening). */
  drawn: number;
  /** Painted with the whole part drawn (the bare page: the same as drawn). */
  whole: number;
  /** The same condition first true in the DOM, before the browser's layout and paint. */
  inDom: number;
}

/**
 * Leaves the page for a blank one and has the browser collect the garbage of what was shown, so
 * that no timed load pays for collecting the page before it (a player reaches a part from the
 * library, not from another engraving of a thousand bars). Both pages get the same treatment.
 */
async function clearHeap(page: Page): Promise<void> {
  await page.goto("about:blank");
  const cdp = await page.context().newCDPSession(page);
  try {
    await cdp.send("HeapProfiler.collectGarbage");
  } finally {
    await cdp.detach();
  }
}

async function timeToReady(page: Page, url: string): Promise<Ready> {
  if (!process.env.BENCH_KEEP_HEAP) await clearHeap(page);
  await page.goto(url, { waitUntil: "commit" });
  await page.waitForFunction(() => (window as unknown as { __benchReadyAt?: number }).__benchReadyAt !== undefined, null, { timeout: 120_000 });
  const isBare = url.includes("/dev/bare-score/");
  if (!isBare) await page.waitForFunction(() => (window as unknown as { __benchWholeAt?: number }).__benchWholeAt !== undefined, null, { timeout: 120_000 });
  return page.evaluate((bare) => {
    const w = window as unknown as { __benchReadyAt: number; __benchInDomAt: number; __benchWholeAt?: number };
    return { drawn: w.__benchReadyAt, inDom: w.__benchInDomAt, whole: bare ? w.__benchReadyAt : (w.__benchWholeAt ?? Number.NaN) };
  }, isBare);
}

/** In the page: click a note and wait for the panel to name it, then for the next frame. */
async function clickToPanel(page: Page, index: number): Promise<number> {
  return page.evaluate(async (i) => {
    const hits = [...document.querySelectorAll('[data-layer="hits"] [data-note-key]')];
    const target = hits[i % hits.length] as SVGElement;
    const panelNames = () => document.querySelector('[data-testid="marking-panel"] h2')?.textContent ?? null;
    const before = panelNames();
    const t0 = performance.now();
    target.dispatchEvent(new MouseEvent("click", { bubbles: true }));
    // Two notes can share a label (same pitch in a bar): such a click is not counted.
    const changed = await new Promise<boolean>((resolve) => {
      const done = () => (panelNames() !== before ? resolve(true) : performance.now() - t0 > 1000 ? resolve(false) : requestAnimationFrame(done));
      done();
    });
    if (!changed) return Number.NaN;
    await new Promise((r) => requestAnimationFrame(() => r(null)));
    return performance.now() - t0;
  }, index);
}

/** The page's navigation timings and our stage marks (the last of each name), ms since navigation. */
function stagesOf(page: Page) {
  return page.evaluate(() => {
    const nav = performance.getEntriesByType("navigation")[0] as PerformanceNavigationTiming;
    const marks = performance.getEntriesByType("mark").filter((m) => m.name.startsWith("ondula:"));
    return {
      firstByte: Math.round(nav.responseStart),
      html: Math.round(nav.responseEnd),
      domReady: Math.round(nav.domContentLoadedEventEnd),
      ...Object.fromEntries(marks.map((m) => [m.name.slice(7), Math.round(m.startTime)])),
      ...Object.fromEntries(marks.filter((m) => m.name === "ondula:notes-selectable").slice(0, 1).map((m) => ["first notes-selectable", Math.round(m.startTime)])),
    };
  });
}

/** The median and range of workspace ÷ bare over runs taken one after the other. */
function pairedRatios(bare: Ready[], workspace: Ready[]): string {
  const ratios = workspace.map((w, i) => w.drawn / bare[i].drawn).sort((a, b) => a - b);
  return `${median(ratios).toFixed(2)} (${ratios[0].toFixed(2)}–${ratios[ratios.length - 1].toFixed(2)})`;
}

/** Fifteen clicks on notes spread over the part, each timed to the panel naming its note. */
async function timeClicks(page: Page): Promise<number[]> {
  const clicks: number[] = [];
  for (let i = 0; i < 15; i++) {
    const ms = await clickToPanel(page, i * 7 + 1);
    if (Number.isFinite(ms)) clicks.push(ms);
  }
  return clicks;
}

/**
 * A teacher's long part is marked all over: every other note gets a marking (some with a role),
 * and clicks are timed again, since each marked note draws its own glyphs.
 */
async function clicksOnAMarkedPart(client: SignedInClient, context: BrowserContext, partId: string): Promise<number[]> {
  const analysis = (await (await client.fetch(`/api/parts/${partId}/analysis`)).json()) as { notes: { key: string }[] };
  const roles = [null, "phrase-start", null, "peak", null, "tension", null, "resolution"] as const;
  const keys = analysis.notes.map((n) => n.key).filter((_, i) => i % 2 === 0);
  for (const [i, key] of keys.entries()) {
    const body = { ...DEFAULT_MARKING, depthCents: 10 + (i % 5) * 10, speedHz: 4.5 + (i % 4) * 0.5, role: roles[i % roles.length] };
    const res = await client.fetch(`/api/parts/${partId}/markings/${encodeURIComponent(key)}`, { method: "PUT", body: JSON.stringify(body), headers: { "content-type": "application/json" } });
    if (!res.ok) throw new Error(`marking ${key}: ${res.status} ${await res.text()}`);
  }
  const page = await context.newPage();
  await timeToReady(page, `${APP_URL}/parts/${partId}`);
  await page.waitForFunction(() => document.querySelectorAll('[data-glyph="wave"]').length > 0);
  const clicks = await timeClicks(page);
  if (process.env.BENCH_PROFILE) await profileLoad(page, async () => void (await timeClicks(page)), "workspace-300-marked-clicks");
  if (process.env.BENCH_TRACE) {
    console.log("15 clicks on the marked part, main-thread time by trace event (ms):", JSON.stringify(await traceTimes(page, () => timeClicks(page))));
  }
  await page.close();
  return clicks;
}

/** What the page has fetched, by file name, with when each request started and ended (ms since
 * navigation): where a load waits on the network. */
function scriptNames(page: Page): Promise<string> {
  return page.evaluate(() =>
    (performance.getEntriesByType("resource") as PerformanceResourceTiming[])
      .map((r) => `${r.initiatorType} ${r.name.split("/").pop()?.slice(0, 40)} ${Math.round(r.startTime)}–${Math.round(r.responseEnd)}`)
      .join("\n  "),
  );
}

/** Main-thread time by trace event (paint, layout, script…) while `work` runs, largest first, ms. */
async function traceTimes(page: Page, work: () => Promise<unknown>): Promise<Record<string, number>> {
  const browser = page.context().browser()!;
  await browser.startTracing(page, { categories: ["devtools.timeline"] });
  await work();
  const trace = JSON.parse((await browser.stopTracing()).toString("utf8")) as { traceEvents: { name: string; ph: string; dur?: number }[] };
  const byName = new Map<string, number>();
  for (const e of trace.traceEvents) if (e.ph === "X" && e.dur) byName.set(e.name, (byName.get(e.name) ?? 0) + e.dur / 1000);
  return Object.fromEntries([...byName].sort((a, b) => b[1] - a[1]).slice(0, 16).map(([k, v]) => [k, Math.round(v)]));
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

async function scriptBytes(context: BrowserContext, url: string) {
  const page = await context.newPage();
  const bodies: Array<{ url: string; gz: number; osmd: boolean }> = [];
  page.on("response", async (res) => {
    if (res.request().resourceType() !== "script") return;
    try {
      const body = await res.body();
      const text = body.toString("utf8");
      bodies.push({ url: res.url(), gz: zlib.gzipSync(body).length, osmd: /OpenSheetMusicDisplay|VexFlow|Vex\.Flow/.test(text) && body.length > 300_000 });
    } catch {
      /* a redirected or aborted script has no body */
    }
  });
  await timeToReady(page, url);
  await page.waitForLoadState("networkidle");
  await page.close();
  const own = bodies.filter((b) => !b.osmd).reduce((a, b) => a + b.gz, 0);
  const engraving = bodies.filter((b) => b.osmd).reduce((a, b) => a + b.gz, 0);
  return { own, engraving, files: bodies.length };
}

const section: BenchSection = {
  name: "workspace",
  async run() {
    const { client } = await createSignedInUser({ role: "player" });
    const context = await launchContext({ width: 1280, height: 900 });
    await context.addCookies(
      client.cookie.split("; ").filter(Boolean).map((pair) => {
        const [name, ...rest] = pair.split("=");
        return { name, value: rest.join("="), url: APP_URL };
      }),
    );
    // tsx names functions with an `__name` helper that does not exist inside the page.
    await context.addInitScript("window.__name = (fn) => fn;");
    await context.addInitScript(READY_PROBE);
    const rows: Array<Record<string, string | number>> = [];
    let firstPartId = "";
    let markedClicks: number[] = [];
    for (const bars of SIZES) {
      const xml = new TextEncoder().encode(generatePartXml({ measures: bars, seed: bars }));
      const res = await client.fetch("/api/parts", { method: "POST", body: multipartFile(`bench-${bars}.musicxml`, xml) });
      const { id } = (await res.json()) as { id: string };
      firstPartId ||= id;
      const page = await context.newPage();
      // Warm both pages once (server caches, compiled chunks), then alternate runs.
      await timeToReady(page, `${APP_URL}/dev/bare-score/${id}`);
      await timeToReady(page, `${APP_URL}/parts/${id}`);
      const bare: Ready[] = [];
      const workspace: Ready[] = [];
      for (let i = 0; i < RUNS; i++) {
        bare.push(await timeToReady(page, `${APP_URL}/dev/bare-score/${id}`));
        workspace.push(await timeToReady(page, `${APP_URL}/parts/${id}`));
        if (process.env.BENCH_STAGES) console.log(`${bars} bars, workspace run ${i + 1}:`, JSON.stringify(await stagesOf(page)), `bare ${Math.round(bare[i].drawn)}`);
      }
      console.log(`${bars} bars, workspace ÷ bare run by run:`, workspace.map((w, i) => (w.drawn / bare[i].drawn).toFixed(2)).join(" "));
      if (process.env.BENCH_PROFILE) {
        await profileLoad(page, async () => void (await timeToReady(page, `${APP_URL}/parts/${id}`)), `workspace-${bars}`);
        await profileLoad(page, async () => void (await timeToReady(page, `${APP_URL}/dev/bare-score/${id}`)), `bare-${bars}`);
        await timeToReady(page, `${APP_URL}/parts/${id}`);
      }
      const lastWorkspace = workspace[workspace.length - 1];
      console.log(`${bars} bars, last workspace run, ms since navigation:`, JSON.stringify(await stagesOf(page)), `in DOM ${Math.round(lastWorkspace.inDom)}, drawn ${Math.round(lastWorkspace.drawn)}`);
      if (process.env.BENCH_RESOURCES) console.log("workspace scripts:", await scriptNames(page));
      const bareRun = await timeToReady(page, `${APP_URL}/dev/bare-score/${id}`);
      console.log(`${bars} bars, a bare run, ms since navigation:`, JSON.stringify(await stagesOf(page)), `in DOM ${Math.round(bareRun.inDom)}, drawn ${Math.round(bareRun.drawn)}`);
      if (process.env.BENCH_RESOURCES) console.log("bare page scripts:", await scriptNames(page));
      await timeToReady(page, `${APP_URL}/parts/${id}`);
      const htmlBytes = async (url: string) => (await (await context.request.get(url)).body()).length;
      console.log(`${bars} bars, HTML bytes: workspace ${await htmlBytes(`${APP_URL}/parts/${id}`)}, bare ${await htmlBytes(`${APP_URL}/dev/bare-score/${id}`)}, MusicXML ${xml.length}`);
      const clicks = await timeClicks(page);
      await page.close();
      if (bars === 300) markedClicks = await clicksOnAMarkedPart(client, context, id);
      const drawn = (xs: Ready[]) => median(xs.map((r) => r.drawn));
      const inDom = (xs: Ready[]) => median(xs.map((r) => r.inDom));
      rows.push({
        bars,
        "bare OSMD page ms": Math.round(drawn(bare)),
        "workspace ms": Math.round(drawn(workspace)),
        "workspace ÷ bare": +(drawn(workspace) / drawn(bare)).toFixed(2),
        // Each workspace run against the bare run just before it: steadier on a shared machine.
        "paired ÷ (median, range)": pairedRatios(bare, workspace),
        "in DOM, before paint: ÷": +(inDom(workspace) / inDom(bare)).toFixed(2),
        // A long part is selectable from its opening on before the whole is drawn (goal at 1,000
        // bars: under 0.3 of the bare page's time for the whole part).
        "whole part drawn ms": Math.round(median(workspace.map((r) => r.whole))),
        "click → panel ms (median)": +median(clicks).toFixed(1),
        "click → panel ms (max)": +Math.max(...clicks).toFixed(1),
      });
    }
    console.table(rows);
    if (markedClicks.length) {
      console.log(`300 bars with every other note marked: click → panel median ${median(markedClicks).toFixed(1)} ms, max ${Math.max(...markedClicks).toFixed(1)} ms (goal: median under 50 ms).`);
    }
    const js = await scriptBytes(context, `${APP_URL}/parts/${firstPartId}`);
    console.log(
      `JavaScript loaded by the workspace page (gzipped): ours ${(js.own / 1024).toFixed(0)} KB, engraving library ${(js.engraving / 1024).toFixed(0)} KB, ${js.files} files (goal: ours under 250 KB).`,
    );
    await context.close();
  },
};

export default section;
