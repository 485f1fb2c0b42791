import { execFileSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { launchContext, OUTPUT_DIR, screenshotPath } from "../helpers/browser";
import { APP_URL } from "../helpers/env";
import { signInThroughForm, uploadInPage } from "../helpers/pages";
import { createUser } from "../helpers/session";

/**
 * The stand copy on paper: a tension tone that ends a system and resolves at the start of the
 * next keeps its arc, cut at the line break, and every text is at least 7 pt at print size, in
 * the browser's print and in the PDF.
 *
 * The sample is `lantern-waltz`: its hand-written answer key names the leading tone C♯5 in bar 14
 * resolving to D5 in bar 15 and B♭4 in bar 7 falling to A4 in bar 8; at A4 and Letter width the
 * engraving breaks the line between each pair (the test checks that rather than assuming it).
 */
const SAMPLE = "lantern-waltz";
const answers = JSON.parse(fs.readFileSync(path.resolve("samples", `${SAMPLE}.answers.json`), "utf8")) as {
  tensions: { measure: string; onset: string; pitch: string; resolvesTo: { measure: string; onset: string; pitch: string } | null }[];
};

/** CSS fixes 96 px and 72 pt to the inch (CSS Values and Units Level 3, "absolute lengths"). */
const PX_PER_PT = 96 / 72;
const MIN_PT = 7;

interface AnalysisNote {
  key: string;
  measure: string;
  onset: string;
  pitch: string;
}

interface MeasuredText {
  text: string;
  fontPt: number;
  boxPt: number;
  rect: { left: number; top: number; right: number; bottom: number };
  kind: "glyph" | "engraving" | "page";
}

const overlaps = (a: MeasuredText["rect"], b: MeasuredText["rect"], slack = 0.5) =>
  a.left < b.right - slack && b.left < a.right - slack && a.top < b.bottom - slack && b.top < a.bottom - slack;

/** Every text on the stand copy: its font size and box in points at print scale (1 CSS px = 0.75 pt). */
async function measureTexts(page: Page): Promise<MeasuredText[]> {
  return page.evaluate((pxPerPt) => {
    const out: MeasuredText[] = [];
    const article = document.querySelector("article.stand-page")!;
    const walker = document.createTreeWalker(article, NodeFilter.SHOW_TEXT);
    for (let n = walker.nextNode(); n; n = walker.nextNode()) {
      const text = (n.textContent ?? "").trim();
      const el = n.parentElement;
      // The off-screen engraving the systems are cut from is not printed.
      if (!text || !el || el.closest("[inert]")) continue;
      const style = getComputedStyle(el);
      if (style.display === "none" || style.visibility === "hidden") continue;
      const rect = el.getBoundingClientRect();
      if (rect.width === 0 && rect.height === 0) continue;
      // SVG text is drawn through its element's transform: scale its font by the screen matrix.
      const ctm = el instanceof SVGGraphicsElement ? el.getScreenCTM() : null;
      const scale = ctm ? Math.hypot(ctm.a, ctm.b) : 1;
      // For HTML text the box of one line is the range's; for SVG text the element's.
      const range = document.createRange();
      range.selectNodeContents(n);
      const lines = el instanceof SVGElement ? [rect] : Array.from(range.getClientRects());
      const box = lines.reduce((m, r) => Math.min(m, r.height), Infinity);
      out.push({
        text,
        fontPt: (parseFloat(style.fontSize) * scale) / pxPerPt,
        boxPt: box / pxPerPt,
        rect: { left: rect.left, top: rect.top, right: rect.right, bottom: rect.bottom },
        kind: el.closest("[data-glyph-text]") ? "glyph" : el.closest(".stand-system") ? "engraving" : "page",
      });
    }
    return out;
  }, PX_PER_PT);
}

/** Words of a PDF page with their boxes in points (poppler's `pdftotext -bbox`). */
function pdfWords(file: string): { page: number; text: string; xMin: number; yMin: number; xMax: number; yMax: number }[] {
  const html = execFileSync("pdftotext", ["-bbox", file, "-"], { encoding: "utf8" });
  const out: ReturnType<typeof pdfWords> = [];
  let page = 0;
  for (const line of html.split("\n")) {
    if (line.includes("<page ")) page += 1;
    const m = /<word xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">(.*)<\/word>/.exec(line);
    if (m) out.push({ page, text: m[5], xMin: Number(m[1]), yMin: Number(m[2]), xMax: Number(m[3]), yMax: Number(m[4]) });
  }
  return out;
}

describe("the stand copy on paper", () => {
  let context: BrowserContext;
  let page: Page;
  let partId: string;
  const arcs: { tension: string; resolution: string }[] = [];

  beforeAll(async () => {
    fs.mkdirSync(OUTPUT_DIR, { recursive: true });
    context = await launchContext({ width: 1280, height: 900 });
    page = await context.newPage();
    const user = await createUser({ role: "player" });
    await signInThroughForm(page, user.email, user.password, "/parts");
    partId = (
      await page.evaluate(async (name) => {
        const res = await fetch("/api/parts/samples", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ name }) });
        return res.json();
      }, `${SAMPLE}.musicxml`)
    ).id;
    const analysis = (await page.evaluate(async (id) => (await fetch(`/api/parts/${id}/analysis`)).json(), partId)) as { notes: AnalysisNote[] };
    const onset = (o: string) => (o === "0" ? "0/1" : o);
    const find = (ref: { measure: string; onset: string; pitch: string }) =>
      analysis.notes.find((n) => n.measure === ref.measure && n.onset === onset(ref.onset) && n.pitch.replace("♯", "#").replace("♭", "b") === ref.pitch);
    // The two resolutions across a line break named by the answer key (bars 7→8 and 14→15).
    for (const t of answers.tensions.filter((t) => (t.measure === "7" || t.measure === "14") && t.resolvesTo)) {
      const tension = find(t);
      const resolution = find(t.resolvesTo!);
      expect(tension, JSON.stringify(t)).toBeDefined();
      expect(resolution, JSON.stringify(t.resolvesTo)).toBeDefined();
      arcs.push({ tension: tension!.key, resolution: resolution!.key });
    }
    expect(arcs).toHaveLength(2);
    const put = (key: string, body: Record<string, unknown>) =>
      page.evaluate(
        async ({ id, key, body }) => (await fetch(`/api/parts/${id}/markings/${encodeURIComponent(key)}`, { method: "PUT", headers: { "content-type": "application/json" }, body: JSON.stringify(body) })).status,
        { id: partId, key, body: { depthCents: 25, speedHz: 5.5, placement: "centered", onset: "immediate", shape: "steady", comment: "", role: null, ...body } },
      );
    for (const { tension, resolution } of arcs) {
      expect(await put(tension, { role: "tension", comment: "Lean on it" })).toBe(201);
      expect(await put(resolution, { role: "resolution", depthCents: 0 })).toBe(201);
    }
    // A run of marked neighbours (bars 2–4), so numbers under the waves crowd each other.
    const crowd = analysis.notes.filter((n) => ["2", "3", "4"].includes(n.measure)).slice(0, 7);
    for (const [i, n] of crowd.entries()) expect(await put(n.key, { depthCents: 15 + i * 5, speedHz: 5 + i * 0.25, role: i === 0 ? "phrase-start" : null })).toBe(201);
  });

  afterAll(async () => {
    await context?.close();
  });

  for (const paper of ["a4", "letter"] as const) {
    it(`cuts the arc at the line break on ${paper}: leaving to the right margin, arriving from the left, each inside its system`, async () => {
      await page.goto(`${APP_URL}/parts/${partId}/print?paper=${paper}`);
      await page.locator('[data-stand-score="ready"]').waitFor({ state: "attached", timeout: 60_000 });
      for (const { tension } of arcs) {
        const pieces = await page.evaluate((key) => {
          return Array.from(document.querySelectorAll(`.stand-system [data-glyph="arc"][data-note-key="${key}"]`)).map((el) => {
            const svg = el.closest("svg.stand-system") as SVGSVGElement;
            const box = svg.getBoundingClientRect();
            const r = el.getBoundingClientRect();
            // The system's staff lines: the long, hairline-thin strokes of the engraving.
            const staves = Array.from(svg.querySelectorAll("path, line, rect"))
              .map((s) => s.getBoundingClientRect())
              .filter((s) => s.height < 2 && s.width > 60);
            const staffLeft = Math.min(...staves.map((s) => s.left));
            const staffRight = Math.max(...staves.map((s) => s.right));
            return {
              kind: el.getAttribute("data-piece"),
              slice: Number(svg.getAttribute("data-system")),
              drawnOn: Number(el.getAttribute("data-system")),
              inside: r.left >= box.left - 0.5 && r.right <= box.right + 0.5 && r.top >= box.top - 0.5 && r.bottom <= box.bottom + 0.5,
              width: r.width,
              fromStaffLeft: r.left - staffLeft,
              toStaffRight: staffRight - r.right,
            };
          });
        }, tension);
        // Exactly two pieces, each in one slice only: leaving on system k, arriving on system k + 1.
        expect(pieces.map((p) => p.kind)).toEqual(["leaving", "arriving"]);
        const [leaving, arriving] = pieces;
        expect(arriving.slice).toBe(leaving.slice + 1);
        for (const p of pieces) {
          expect(p.drawnOn).toBe(p.slice);
          expect(p.inside).toBe(true);
          expect(p.width).toBeGreaterThan(5);
        }
        // Out to the right margin and in from the left one: the ends of the staff lines, to 2 px.
        expect(Math.abs(leaving.toStaffRight)).toBeLessThan(2);
        expect(Math.abs(arriving.fromStaffLeft)).toBeLessThan(2);
      }
      await page.emulateMedia({ media: "print" });
      try {
        await page.addStyleTag({ content: "html { filter: grayscale(1); }" });
        await page.screenshot({ path: screenshotPath(`stand-copy-paper-${paper}-print-grayscale`), fullPage: true });
      } finally {
        await page.emulateMedia({ media: "screen" });
      }
    });

    it(`prints every text at ${MIN_PT} pt or more on ${paper}, glyph numbers clear of noteheads and of each other`, async () => {
      await page.goto(`${APP_URL}/parts/${partId}/print?paper=${paper}`);
      await page.locator('[data-stand-score="ready"]').waitFor({ state: "attached", timeout: 60_000 });
      await page.emulateMedia({ media: "print" });
      try {
        // Print scale: the page's content box is the paper's printable width in CSS px (96 px to the inch).
        const widthPx = await page.locator("article.stand-page").evaluate((el) => {
          const s = getComputedStyle(el);
          return el.getBoundingClientRect().width - parseFloat(s.paddingLeft) - parseFloat(s.paddingRight);
        });
        // ISO 216 A4 210 mm with 12 mm margins; Letter 8.5 in with 0.5 in margins.
        const contentMm = paper === "a4" ? 210 - 24 : 8.5 * 25.4 - 25.4;
        expect(Math.abs(widthPx - (contentMm / 25.4) * 96)).toBeLessThan(1.5);

        const texts = await measureTexts(page);
        const glyphs = texts.filter((t) => t.kind === "glyph");
        expect(glyphs.length).toBeGreaterThanOrEqual(6);
        expect(texts.filter((t) => t.kind === "engraving").length).toBeGreaterThanOrEqual(3);
        for (const t of texts) {
          expect(t.fontPt, `${t.kind} "${t.text}"`).toBeGreaterThanOrEqual(MIN_PT);
          // The box the browser drew the text in is at least that tall too (an em box is ≥ 1 em).
          expect(t.boxPt, `${t.kind} "${t.text}"`).toBeGreaterThanOrEqual(MIN_PT);
        }
        const heads = await page.evaluate(() =>
          Array.from(document.querySelectorAll(".stand-system .vf-notehead")).map((h) => {
            const r = h.getBoundingClientRect();
            return { left: r.left, top: r.top, right: r.right, bottom: r.bottom };
          }),
        );
        expect(heads.length).toBeGreaterThan(20);
        const engraved = texts.filter((t) => t.kind === "engraving");
        for (const g of glyphs) {
          for (const h of heads) expect(overlaps(g.rect, h), `"${g.text}" over a notehead`).toBe(false);
          for (const e of engraved) expect(overlaps(g.rect, e.rect), `"${g.text}" over "${e.text}"`).toBe(false);
          for (const o of glyphs) if (o !== g) expect(overlaps(g.rect, o.rect), `"${g.text}" over "${o.text}"`).toBe(false);
        }
      } finally {
        await page.emulateMedia({ media: "screen" });
      }
    });

    it(`makes a PDF on ${paper} whose words are all ${MIN_PT} pt or more and never overlap`, async () => {
      await page.goto(`${APP_URL}/parts/${partId}/print?paper=${paper}`);
      await page.locator('[data-stand-score="ready"]').waitFor({ state: "attached", timeout: 60_000 });
      const download = page.waitForEvent("download");
      await page.getByRole("button", { name: "Download PDF" }).click();
      const file = path.join(OUTPUT_DIR, `stand-copy-paper-${paper}.pdf`);
      await (await download).saveAs(file);
      const words = pdfWords(file);
      expect(words.length).toBeGreaterThan(100);
      expect(words.some((w) => w.text === "5.5")).toBe(true);
      for (const w of words) {
        // jsPDF writes with the standard Helvetica and Times; poppler boxes a word from the font's
        // ascender to its descender: 718 + 207 = 0.925 em for Helvetica, 683 + 217 = 0.9 em for
        // Times (Adobe's Core 14 AFM metrics, from memory). So the size is at least height / 0.925.
        expect((w.yMax - w.yMin) / 0.925, `"${w.text}" on page ${w.page}`).toBeGreaterThanOrEqual(MIN_PT - 0.01);
      }
      for (const a of words) {
        for (const b of words) {
          if (a === b || a.page !== b.page) continue;
          const hit = a.xMin < b.xMax - 0.3 && b.xMin < a.xMax - 0.3 && a.yMin < b.yMax - 0.3 && b.yMin < a.yMax - 0.3;
          expect(hit, `"${a.text}" and "${b.text}" overlap on page ${a.page}`).toBe(false);
        }
      }
      // A picture to look at: the first page in grayscale.
      execFileSync("pdftoppm", ["-gray", "-png", "-r", "110", "-f", "1", "-l", "1", "-singlefile", file, path.join(OUTPUT_DIR, `stand-copy-paper-${paper}-pdf-page1`)]);
    });
  }
});

/** A grayscale page from pdftoppm (poppler-utils) as PGM: width, height and one byte per pixel. */
function pgmPage(pdf: string, pageNo: number, dpi: number, stem: string) {
  execFileSync("pdftoppm", ["-gray", "-r", String(dpi), "-f", String(pageNo), "-l", String(pageNo), "-singlefile", pdf, stem]);
  const bytes = fs.readFileSync(`${stem}.pgm`);
  const header = /^P5\s+(\d+)\s+(\d+)\s+255\s/.exec(bytes.subarray(0, 64).toString("latin1"))!;
  const width = Number(header[1]);
  const pixels = bytes.subarray(header[0].length);
  /** Dark pixels (below mid-grey) inside a box given in points. */
  return (box: { x1: number; y1: number; x2: number; y2: number }) => {
    const k = dpi / 72;
    let dark = 0;
    for (let y = Math.floor(box.y1 * k); y < Math.ceil(box.y2 * k); y++)
      for (let x = Math.floor(box.x1 * k); x < Math.ceil(box.x2 * k); x++) if (pixels[y * width + x] < 128) dark++;
    return dark;
  };
}

describe("the stand copy across a page break", () => {
  let context: BrowserContext;
  let page: Page;
  let partId: string;

  beforeAll(async () => {
    context = await launchContext({ width: 1280, height: 900 });
    page = await context.newPage();
    const user = await createUser({ role: "player" });
    await signInThroughForm(page, user.email, user.password, "/parts");
    // A part long enough for two pages of music: the sample's sixteen bars five times over.
    const xml = fs.readFileSync(path.resolve("samples", `${SAMPLE}.musicxml`), "utf8");
    const first = xml.indexOf("<measure ");
    const last = xml.lastIndexOf("</measure>") + "</measure>".length;
    const measures = xml.slice(first, last).match(/<measure number="\d+"[\s\S]*?<\/measure>/g)!;
    expect(measures).toHaveLength(16);
    const body = [0, 1, 2, 3, 4].flatMap((copy) => measures.map((m, i) => m.replace(/<measure number="\d+"/, `<measure number="${copy * 16 + i + 1}"`))).join("\n    ");
    const long = xml.slice(0, first) + body + xml.slice(last);
    const made = await uploadInPage(page, "lantern-waltz-five-times.musicxml", long);
    if (made.status !== 201) throw new Error(`upload answered ${made.status}: ${JSON.stringify(made.body)}`);
    partId = made.body.id;
  });

  afterAll(async () => {
    await context?.close();
  });

  const downloadPdf = async (name: string) => {
    await page.goto(`${APP_URL}/parts/${partId}/print?paper=a4&comments=0`);
    await page.locator('[data-stand-score="ready"]').waitFor({ state: "attached", timeout: 60_000 });
    const download = page.waitForEvent("download");
    await page.getByRole("button", { name: "Download PDF" }).click();
    const file = path.join(OUTPUT_DIR, name);
    await (await download).saveAs(file);
    return file;
  };

  /** The bar number that opens each system, and where it stands in its system (px from the left). */
  const systemNumbers = () =>
    page.evaluate(() =>
      Array.from(document.querySelectorAll("svg.stand-system")).flatMap((svg) => {
        const box = svg.getBoundingClientRect();
        const t = Array.from(svg.querySelectorAll("text")).find((e) => /^\d+$/.test(e.textContent ?? "") && e.getBoundingClientRect().left - box.left < 80);
        return t ? [{ bar: t.textContent!, x: t.getBoundingClientRect().left - box.left }] : [];
      }),
    );

  /** Those bar numbers as the PDF prints them, by page, top first. */
  const systemStarts = async (file: string) => {
    const numbers = await systemNumbers();
    // Every system but the first opens with its bar number.
    expect(numbers.length).toBeGreaterThanOrEqual(6);
    const margin = 12 * (72 / 25.4);
    return pdfWords(file)
      .filter((w) => numbers.some((n) => n.bar === w.text && Math.abs(w.xMin - (margin + n.x * 0.75)) < 4))
      .sort((a, b) => a.page - b.page || a.yMin - b.yMin);
  };

  it("draws the arc's leaving piece on the page's last system and its arriving piece on the next page's first", async () => {
    const put = (key: string, role: string, version?: number) =>
      page.evaluate(
        async ({ id, key, body }) => (await fetch(`/api/parts/${id}/markings/${encodeURIComponent(key)}`, { method: "PUT", headers: { "content-type": "application/json" }, body: JSON.stringify(body) })).status,
        { id: partId, key, body: { depthCents: 25, speedHz: 5.5, placement: "centered", onset: "immediate", shape: "steady", comment: "", role, version } },
      );
    // Every bar's last note is marked a peak and its first a resolution, so every system carries
    // glyphs of the same sizes; then the page break is found and the note before it becomes a
    // tension tone. The two PDFs differ by the arc alone, and the break stays where it was.
    const analysis = (await page.evaluate(async (id) => (await fetch(`/api/parts/${id}/analysis`)).json(), partId)) as { notes: AnalysisNote[] };
    const bars = [...new Set(analysis.notes.map((n) => n.measure))];
    const lastOf = (bar: string) => analysis.notes.filter((n) => n.measure === bar).at(-1)!;
    const firstOf = (bar: string) => analysis.notes.find((n) => n.measure === bar)!;
    for (const bar of bars) {
      expect(await put(lastOf(bar).key, "peak")).toBe(201);
      if (firstOf(bar).key !== lastOf(bar).key) expect(await put(firstOf(bar).key, "resolution")).toBe(201);
    }
    const before = await downloadPdf("stand-copy-page-break-without-arc.pdf");
    const bar = (await systemStarts(before)).find((w) => w.page === 2)?.text;
    expect(bar, "the music runs onto a second page").toBeDefined();
    const tension = lastOf(String(Number(bar) - 1));
    expect(await page.locator(`.stand-system [data-glyph="arc"][data-note-key="${tension.key}"]`).count()).toBe(0);
    expect(await put(tension.key, "tension", 1)).toBe(200);
    const after = await downloadPdf("stand-copy-page-break.pdf");
    // The break has not moved: the same bar opens page 2.
    expect((await systemStarts(after)).find((w) => w.page === 2)?.text).toBe(bar);

    // Where the pieces are in their systems (px from the slice's top left), and where that
    // system's bar number is, to place them on the PDF page (1 px = 0.75 pt at print size).
    const pieces = await page.evaluate((key) => {
      return Array.from(document.querySelectorAll(`.stand-system [data-glyph="arc"][data-note-key="${key}"]`)).map((el) => {
        const svg = el.closest("svg.stand-system") as SVGSVGElement;
        const box = svg.getBoundingClientRect();
        const r = el.getBoundingClientRect();
        const number = Array.from(svg.querySelectorAll("text")).find((t) => /^\d+$/.test(t.textContent ?? "") && t.getBoundingClientRect().left - box.left < 80);
        const n = number?.getBoundingClientRect();
        return {
          kind: el.getAttribute("data-piece"),
          left: r.left - box.left,
          right: r.right - box.left,
          top: r.top - box.top,
          bottom: r.bottom - box.top,
          numberTop: n ? n.top - box.top : null,
          bar: number?.textContent ?? null,
        };
      });
    }, tension.key);
    expect(pieces.map((p) => p.kind)).toEqual(["leaving", "arriving"]);
    expect(pieces[1].bar).toBe(bar);

    const afterWords = await systemStarts(after);
    const lastOnPage1 = afterWords.filter((w) => w.page === 1).at(-1)!;
    const firstOnPage2After = afterWords.find((w) => w.page === 2)!;
    const dpi = 150;
    const pages = {
      before: [pgmPage(before, 1, dpi, path.join(OUTPUT_DIR, "break-before-1")), pgmPage(before, 2, dpi, path.join(OUTPUT_DIR, "break-before-2"))],
      after: [pgmPage(after, 1, dpi, path.join(OUTPUT_DIR, "break-after-1")), pgmPage(after, 2, dpi, path.join(OUTPUT_DIR, "break-after-2"))],
    };
    const PT = 0.75;
    const margin = 12 * (72 / 25.4);
    // Each piece's outer half (toward the margin), where nothing but the arc is drawn; placed on
    // the page through its system's bar number (PDF and browser agree on it to a few points).
    const region = (p: (typeof pieces)[number], number: { yMin: number }, outer: "right" | "left") => {
      const dy = number.yMin - p.numberTop! * PT;
      const mid = (p.left + p.right) / 2;
      const [x1, x2] = outer === "right" ? [mid, p.right] : [p.left, mid];
      return { x1: margin + x1 * PT - 1, x2: margin + x2 * PT + 1, y1: dy + p.top * PT - 4, y2: dy + p.bottom * PT + 4 };
    };
    const leaving = region(pieces[0], lastOnPage1, "right");
    const arriving = region(pieces[1], firstOnPage2After, "left");
    // Ink appears there only once the arc is drawn: on page 1 toward the right margin, on page 2 from the left.
    expect(pages.after[0](leaving) - pages.before[0](leaving)).toBeGreaterThan(4);
    expect(pages.after[1](arriving) - pages.before[1](arriving)).toBeGreaterThan(4);
  });
});

