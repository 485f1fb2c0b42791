/**
 * The marking panel's words for a marking's stored values: every screen, print and message that
 * shows a marking says them the same way (never the stored "immediate" or "top-on-pitch").
 */
import type { MarkingValues } from "./schema";

export const VALUE_WORDS = {
  placement: { centered: "Centred on the pitch", "top-on-pitch": "Top on the pitch" },
  onset: { immediate: "From the start", delayed: "Delayed" },
  shape: { steady: "Steady", growing: "Growing", fading: "Fading" },
} as const satisfies {
  placement: Record<MarkingValues["placement"], string>;
  onset: Record<MarkingValues["onset"], string>;
  shape: Record<MarkingValues["shape"], string>;
};

/** "From the start, steady": onset and shape in one phrase (the first word capitalized only). */
export function onsetAndShape(v: Pick<MarkingValues, "onset" | "shape">): string {
  return `${VALUE_WORDS.onset[v.onset]}, ${VALUE_WORDS.shape[v.shape].toLowerCase()}`;
}

/** Cents are written "¢" right after the number: "25¢". */
export function centsText(cents: string | number): string {
  return `${cents}¢`;
}
