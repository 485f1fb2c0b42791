/**
 * The stand copy as a PDF, built in the browser with jsPDF and svg2pdf.js: each system's SVG (the
 * engraving plus our glyphs) drawn as vectors, then the legend and the table of marked notes.
 * Text uses jsPDF's built-in Helvetica and Times, so nothing is downloaded; those fonts speak
 * Windows-1252 only, hence `winAnsi` on every string.
 */
import type { jsPDF as JsPdf } from "jspdf";
import { contentSizeMm, type Paper, PX_PER_MM } from "@/lib/stand-copy/options";
import { paginate, type Block } from "@/lib/stand-copy/paginate";
import { winAnsi } from "@/lib/stand-copy/pdf-text";
import type { MarkedNoteRow } from "@/lib/stand-copy/table";

export interface StandCopyPdfInput {
  paper: Paper;
  paperName: "a4" | "letter";
  title: string;
  /** Lines under the title: composer, then key · tempo · player. */
  subtitle: string[];
  systems: SVGSVGElement[];
  /** The rendered legend (its headings, items and their small SVGs are copied). */
  legend: HTMLElement | null;
  rows: MarkedNoteRow[];
  /** null: comments left out; []: none written. */
  comments: { where: string; author: string; body: string }[] | null;
}

interface PdfBlock extends Block {
  draw: (doc: JsPdf, x: number, y: number, scale: number) => Promise<void> | void;
  /** A table row: the column heads are repeated above it when it starts a page. */
  tableRow?: boolean;
  withHead?: boolean;
}

const MM_PER_PX = 1 / PX_PER_MM;
const INK: [number, number, number] = [27, 26, 23];
const GRAPHITE: [number, number, number] = [74, 71, 64];
const LINE_MM = 3.6;

const COLUMNS: { key: keyof MarkedNoteRow; head: string; share: number }[] = [
  { key: "bar", head: "Bar", share: 0.055 },
  { key: "note", head: "Note", share: 0.075 },
  { key: "role", head: "Role", share: 0.12 },
  { key: "depth", head: "Depth", share: 0.075 },
  { key: "speed", head: "Speed", share: 0.15 },
  { key: "placement", head: "Placement", share: 0.105 },
  { key: "onsetShape", head: "Onset, shape", share: 0.15 },
  { key: "comment", head: "Comment", share: 0.27 },
];

function italicNote(d: JsPdf, lines: string[], x: number, y: number) {
  d.setFont("helvetica", "italic");
  d.setFontSize(9);
  d.setTextColor(...GRAPHITE);
  d.text(lines, x, y, { baseline: "top" });
}

/** Copies an SVG with text the PDF fonts can encode (music signs spelled out). */
function pdfReadySvg(svg: SVGSVGElement): SVGSVGElement {
  const copy = svg.cloneNode(true) as SVGSVGElement;
  for (const t of Array.from(copy.querySelectorAll("text, tspan"))) {
    if (t.children.length === 0 && t.textContent) t.textContent = winAnsi(t.textContent);
    // Our glyphs' numbers inherit the page's sans on screen; svg2pdf would fall back to Times.
    if (t.hasAttribute("data-glyph-text") || t.closest("[data-legend-icon]")) t.setAttribute("font-family", "helvetica");
    // svg2pdf reads font sizes as user units; the engraving writes some in points.
    const size = /^([\d.]+)pt$/.exec(t.getAttribute("font-size") ?? "");
    if (size) t.setAttribute("font-size", String((Number(size[1]) * 4) / 3));
  }
  return copy;
}

export async function buildStandCopyPdf(input: StandCopyPdfInput): Promise<Blob> {
  const [{ jsPDF }, { svg2pdf }] = await Promise.all([import("jspdf"), import("svg2pdf.js")]);
  const doc = new jsPDF({ unit: "mm", format: input.paperName, orientation: "portrait", compress: true });
  const margin = input.paper.marginMm;
  const content = contentSizeMm(input.paper);
  const width = content.width;

  // svg2pdf draws from the live document tree; a hidden holder keeps the copies out of sight.
  const holder = document.createElement("div");
  holder.style.cssText = "position:absolute;left:-100000px;top:0;width:0;height:0;overflow:hidden";
  document.body.appendChild(holder);

  const drawSvg = async (svg: SVGSVGElement, x: number, y: number, w: number, h: number) => {
    const copy = pdfReadySvg(svg);
    holder.appendChild(copy);
    try {
      await svg2pdf(copy, doc, { x, y, width: w, height: h });
    } finally {
      copy.remove();
    }
  };

  const blocks: PdfBlock[] = [];
  const text = (s: string, size: number, font: "helvetica" | "times", style: "normal" | "bold" | "italic", maxWidth: number) => {
    doc.setFont(font, style);
    doc.setFontSize(size);
    return doc.splitTextToSize(winAnsi(s), maxWidth) as string[];
  };
  const lineHeight = (size: number) => size * 0.3528 * 1.25;

  // ——— header ———
  const titleLines = text(input.title, 20, "times", "bold", width);
  const subLines = input.subtitle.flatMap((s) => text(s, 10.5, "helvetica", "normal", width));
  blocks.push({
    height: titleLines.length * lineHeight(20) + subLines.length * lineHeight(10.5) + 3,
    draw: (d, x, y) => {
      d.setTextColor(...INK);
      d.setFont("times", "bold");
      d.setFontSize(20);
      d.text(titleLines, x, y, { baseline: "top", lineHeightFactor: 1.25 });
      d.setFont("helvetica", "normal");
      d.setFontSize(10.5);
      d.setTextColor(...GRAPHITE);
      d.text(subLines, x, y + titleLines.length * lineHeight(20) + 1, { baseline: "top", lineHeightFactor: 1.25 });
      d.setDrawColor(...GRAPHITE);
      d.setLineWidth(0.2);
      const rule = y + titleLines.length * lineHeight(20) + subLines.length * lineHeight(10.5) + 2.5;
      d.line(x, rule, x + width, rule);
    },
  });

  // ——— systems, at print scale (the engraving was laid out at the printable width) ———
  for (const svg of input.systems) {
    const wPx = Number(svg.getAttribute("width"));
    const hPx = Number(svg.getAttribute("height"));
    const fit = Math.min(1, width / (wPx * MM_PER_PX));
    const w = wPx * MM_PER_PX * fit;
    const h = hPx * MM_PER_PX * fit;
    blocks.push({ height: h, gapBefore: 1, draw: (_d, x, y, scale) => drawSvg(svg, x, y, w * scale, h * scale) });
  }

  // ——— legend ———
  const heading = (label: string, size: number, breakBefore = false): PdfBlock => {
    const lines = text(label, size, "times", "bold", width);
    return {
      height: lines.length * lineHeight(size),
      gapBefore: 5,
      breakBefore,
      draw: (d, x, y) => {
        d.setTextColor(...INK);
        d.setFont("times", "bold");
        d.setFontSize(size);
        d.text(lines, x, y, { baseline: "top" });
      },
    };
  };
  if (input.legend) {
    blocks.push(heading("Legend", 14));
    for (const el of Array.from(input.legend.querySelectorAll("h3, li, p"))) {
      if (el.tagName === "H3") {
        const lines = text(el.textContent ?? "", 9, "helvetica", "bold", width);
        blocks.push({
          height: lines.length * lineHeight(9),
          gapBefore: 2.5,
          draw: (d, x, y) => {
            d.setTextColor(...GRAPHITE);
            d.setFont("helvetica", "bold");
            d.setFontSize(9);
            d.text(lines, x, y, { baseline: "top" });
          },
        });
        continue;
      }
      const svg = el.tagName === "LI" ? el.querySelector("svg") : null;
      // A row whose icon is words ("solid · dashed") prints them in the icon column.
      const iconWords = el.tagName === "LI" && !svg ? el.querySelector("[data-legend-icon-text]") : null;
      const iconW = svg ? Number(svg.getAttribute("width")) * MM_PER_PX : 0;
      const iconH = svg ? Number(svg.getAttribute("height")) * MM_PER_PX : 0;
      const textX = svg ? iconW + 3 : el.tagName === "LI" ? 19 : 0;
      // The words only (an icon's own text, like a comment count, stays in its icon).
      const words = Array.from(el.childNodes)
        .filter((n) => n.nodeName.toLowerCase() !== "svg" && n !== iconWords)
        .map((n) => n.textContent ?? "")
        .join(" ");
      const lines = text(words.replace(/\s+/g, " ").trim(), 8.5, "helvetica", "normal", width - textX);
      const iconLines = iconWords ? text(iconWords.textContent ?? "", 7.5, "helvetica", "normal", textX - 2) : [];
      const h = Math.max(iconH, lines.length * lineHeight(8.5), iconLines.length * lineHeight(7.5));
      blocks.push({
        height: h,
        gapBefore: 0.8,
        draw: async (d, x, y) => {
          if (svg) await drawSvg(svg as SVGSVGElement, x, y, iconW, iconH);
          if (iconLines.length) {
            d.setTextColor(...GRAPHITE);
            d.setFont("helvetica", "normal");
            d.setFontSize(7.5);
            d.text(iconLines, x, y + (h - iconLines.length * lineHeight(7.5)) / 2, { baseline: "top", lineHeightFactor: 1.25 });
          }
          d.setTextColor(...INK);
          d.setFont("helvetica", "normal");
          d.setFontSize(8.5);
          d.text(lines, x + textX, y + (h - lines.length * lineHeight(8.5)) / 2, { baseline: "top", lineHeightFactor: 1.25 });
        },
      });
    }
  }

  // ——— table of marked notes ———
  blocks.push(heading("Marked notes", 14));
  const colWidths = COLUMNS.map((c) => c.share * width);
  const headHeight = LINE_MM + 1.6;
  const drawHead = (d: JsPdf, x: number, y: number) => {
    d.setFont("helvetica", "bold");
    d.setFontSize(8);
    d.setTextColor(...INK);
    let cx = x;
    COLUMNS.forEach((c, i) => {
      d.text(c.head, cx + 0.8, y + 0.6, { baseline: "top" });
      cx += colWidths[i];
    });
    d.setDrawColor(...INK);
    d.setLineWidth(0.3);
    d.line(x, y + headHeight, x + width, y + headHeight);
  };
  if (input.rows.length === 0) {
    const lines = text("No note is marked yet.", 9, "helvetica", "italic", width);
    blocks.push({ height: lines.length * lineHeight(9), gapBefore: 2, draw: (d, x, y) => italicNote(d, lines, x, y) });
  }
  input.rows.forEach((row, r) => {
    const cells = COLUMNS.map((c, i) => text(row[c.key], 8, "helvetica", "normal", colWidths[i] - 1.6));
    const rowHeight = Math.max(1, ...cells.map((c) => c.length)) * LINE_MM + 1.4;
    blocks.push({
      height: rowHeight + (r === 0 ? headHeight : 0),
      gapBefore: r === 0 ? 2 : 0,
      tableRow: true,
      withHead: r === 0,
      draw: (d, x, y) => {
        const top = y;
        d.setFont("helvetica", "normal");
        d.setFontSize(8);
        d.setTextColor(...INK);
        let cx = x;
        cells.forEach((lines, i) => {
          d.text(lines, cx + 0.8, top + 0.7, { baseline: "top", lineHeightFactor: 1.25 });
          cx += colWidths[i];
        });
        d.setDrawColor(...GRAPHITE);
        d.setLineWidth(0.1);
        d.line(x, top + rowHeight, x + width, top + rowHeight);
      },
    });
  });

  // ——— comments ———
  if (input.comments) {
    blocks.push(heading("Comments", 14));
    if (input.comments.length === 0) {
      const lines = text("There are no comments on this part.", 9, "helvetica", "italic", width);
      blocks.push({ height: lines.length * lineHeight(9), gapBefore: 2, draw: (d, x, y) => italicNote(d, lines, x, y) });
    }
    for (const c of input.comments) {
      const lines = text(`${c.where} — ${c.author}: ${c.body}`, 8.5, "helvetica", "normal", width);
      blocks.push({
        height: lines.length * lineHeight(8.5),
        gapBefore: 1.2,
        draw: (d, x, y) => {
          d.setFont("helvetica", "normal");
          d.setFontSize(8.5);
          d.setTextColor(...INK);
          d.text(lines, x, y, { baseline: "top", lineHeightFactor: 1.25 });
        },
      });
    }
  }

  try {
    const placed = placeWithHeads(blocks, content.height, headHeight);
    let page = 0;
    for (let i = 0; i < blocks.length; i++) {
      const p = placed[i];
      while (page < p.page) {
        doc.addPage(input.paperName, "portrait");
        page += 1;
      }
      let y = margin + p.y;
      if (blocks[i].tableRow && p.head) {
        drawHead(doc, margin, y);
        y += headHeight;
      }
      await blocks[i].draw(doc, margin, y, p.scale);
    }
    const pages = doc.getNumberOfPages();
    for (let n = 1; n <= pages; n++) {
      doc.setPage(n);
      doc.setFont("helvetica", "normal");
      doc.setFontSize(7.5);
      doc.setTextColor(...GRAPHITE);
      doc.text(winAnsi(`${input.title} — page ${n} of ${pages}`), margin + width, input.paper.heightMm - margin / 2, { align: "right", baseline: "middle" });
    }
    return doc.output("blob");
  } finally {
    holder.remove();
  }
}

/**
 * Paginates, then repeats the table's column heads above a row that starts a page; the extra
 * height can push later blocks on, so this settles in a few rounds.
 */
function placeWithHeads(blocks: PdfBlock[], pageHeight: number, headHeight: number) {
  const heads = new Set<number>(blocks.flatMap((b, i) => (b.withHead ? [i] : [])));
  for (let round = 0; round < 8; round++) {
    const sized = blocks.map((b, i) => ({ ...b, height: b.height + (heads.has(i) && !b.withHead ? headHeight : 0) }));
    const placed = paginate(sized, pageHeight);
    let changed = false;
    placed.forEach((p, i) => {
      if (blocks[i].tableRow && p.y === 0 && i > 0 && !heads.has(i)) {
        heads.add(i);
        changed = true;
      }
    });
    if (!changed) return placed.map((p, i) => ({ ...p, head: heads.has(i) }));
  }
  return paginate(blocks, pageHeight).map((p) => ({ ...p, head: false }));
}
