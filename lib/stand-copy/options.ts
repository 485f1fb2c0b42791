import { z } from "zod";

/**
 * The stand copy's paper and what it shows. Sizes are the ISO 216 A4 sheet (210 × 297 mm) and
 * the US Letter sheet (8.5 × 11 in = 215.9 × 279.4 mm), the two sizes CSS `@page size` names.
 */
export const PAPERS = {
  a4: { label: "A4", cssSize: "A4", widthMm: 210, heightMm: 297, marginMm: 12 },
  letter: { label: "Letter", cssSize: "letter", widthMm: 215.9, heightMm: 279.4, marginMm: 12.7 },
} as const;

export type PaperName = keyof typeof PAPERS;
export type Paper = (typeof PAPERS)[PaperName];

/** CSS pixels per millimetre (CSS fixes 96 px to the inch). */
export const PX_PER_MM = 96 / 25.4;
/** PDF points per millimetre (72 pt to the inch). */
export const PT_PER_MM = 72 / 25.4;

/** CSS pixels per point at print size (96 px and 72 pt to the inch). */
export const PX_PER_PT = 96 / 72;

/** The smallest text on the stand copy, in points: what a player can still read at the stand. */
export const MIN_PRINT_TEXT_PT = 7;

/**
 * The size of the glyphs' numbers and counts on paper: half a point above the minimum, so
 * rounding in the browser or the PDF never takes them under it.
 */
export const GLYPH_TEXT_PX = (MIN_PRINT_TEXT_PT + 0.5) * PX_PER_PT;

/** The printable width and height inside the margins, in millimetres. */
export function contentSizeMm(paper: Paper): { width: number; height: number } {
  return { width: paper.widthMm - 2 * paper.marginMm, height: paper.heightMm - 2 * paper.marginMm };
}

/** The printable width in CSS pixels: the score is engraved at this width so print is 1:1. */
export function contentWidthPx(paper: Paper): number {
  return Math.floor(contentSizeMm(paper).width * PX_PER_MM);
}

const flag = (fallback: boolean) =>
  z
    .enum(["1", "0"])
    .optional()
    .catch(undefined)
    .transform((v) => (v === undefined ? fallback : v === "1"));

/** Query of /parts/[partId]/print. A value we do not know falls back to the default, never errs. */
export const standCopyQuery = z.object({
  paper: z.enum(["a4", "letter"]).optional().catch(undefined).transform((v): PaperName => v ?? "a4"),
  comments: flag(true),
  suggestions: flag(false),
});

export type StandCopyOptions = z.output<typeof standCopyQuery>;

export function parseStandCopyOptions(params: Record<string, string | string[] | undefined>): StandCopyOptions {
  const one = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v);
  return standCopyQuery.parse({ paper: one(params.paper), comments: one(params.comments), suggestions: one(params.suggestions) });
}

export function standCopyHref(partId: string, o: StandCopyOptions): string {
  const q = new URLSearchParams({ paper: o.paper, comments: o.comments ? "1" : "0", suggestions: o.suggestions ? "1" : "0" });
  return `/parts/${partId}/print?${q}`;
}
