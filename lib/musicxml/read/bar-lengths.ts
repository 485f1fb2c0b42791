import type { Fraction, Measure, ReadNotice } from "../model";
import { barName, writtenBars } from "../bar-names";

/**
 * Part of step 5 (the model): bars whose notes last more or less than their time signature. They
 * are read as written — a cadenza is often one long bar, a hymn may have an unmeasured bar, an
 * export may carry a wrong signature — and named so the player knows why the count looks odd.
 */

interface PartBars {
  measures: Measure[];
  /** Content length reached per measure index (whole notes). */
  reached: Fraction[];
  implicit: Set<number>;
}

const value = (f: Fraction | undefined) => (f ? f.num / f.den : 0);

function beatsText(beats: number): string {
  const rounded = Math.round(beats * 100) / 100;
  return `${rounded} beat${rounded === 1 ? "" : "s"}`;
}

/**
 * One notice per bar of the score's shared grid (the longest part decides its length, as for the
 * timeline). Not named: empty bars (a part resting without rests), a short first bar (a pickup)
 * and a short last bar (it completes the pickup), bars marked `implicit`, and short bars beside a
 * repeat barline (a bar split around a repeat, counted as one by players).
 */
export function barLengthNotices(parts: PartBars[]): ReadNotice[] {
  const notices: ReadNotice[] = [];
  const count = Math.max(0, ...parts.map((p) => p.measures.length));
  for (let i = 0; i < count; i++) {
    let reached = 0;
    let measure: Measure | null = null;
    let owner: PartBars | null = null;
    let implicit = false;
    let besideRepeat = false;
    for (const p of parts) {
      const m = p.measures[i];
      if (!m) continue;
      reached = Math.max(reached, value(p.reached[i]));
      if (!measure && m.time) {
        measure = m;
        owner = p;
      }
      implicit ||= p.implicit.has(i);
      const next = p.measures[i + 1];
      besideRepeat ||= m.barlineRight === "repeat-end" || m.barlineLeft === "repeat-start" || next?.barlineLeft === "repeat-start";
    }
    if (!measure?.time || reached === 0 || implicit) continue;
    const written = value(measure.length);
    // Exact enough: lengths are sums of reduced fractions, equal ones compare equal as numbers.
    if (Math.abs(reached - written) < 1e-9) continue;
    const longer = reached > written;
    if (!longer && (i === 0 || i === count - 1 || besideRepeat)) continue;
    const { beats, beatType } = measure.time;
    notices.push({
      code: longer ? "bar_longer" : "bar_shorter",
      measureIndex: i,
      measureNumber: measure.number,
      message: `${barName(writtenBars(owner!.measures), i)} lasts ${beatsText(reached * beatType)} in ${beats}/${beatType} — read as written`,
    });
  }
  return notices;
}

/** At most this many bars are named one by one in a summary; the rest are counted. */
const NAMED = 5;

/** The notices as one sentence for an upload answer or a library entry, or null when there are none. */
export function describeNotices(messages: readonly string[]): string | null {
  if (messages.length === 0) return null;
  const named = messages.slice(0, NAMED);
  const more = messages.length - named.length;
  const text = named.join("; ") + (more > 0 ? `; and ${more} more bar${more === 1 ? "" : "s"} read as written` : "");
  return text.charAt(0).toUpperCase() + text.slice(1) + ".";
}
