import { cmp } from "../fraction";
import type { Note, PartModel, ScoreModel } from "../model";
import { buildTimeline, type TempoEvent } from "../timeline";
import { barLengthNotices } from "./bar-lengths";
import type { HeaderReader } from "./header";
import { DEFAULT_TEMPO, type PartState } from "./measures";

/**
 * Step 5 of the reader: the model. Parts in the part list's order, notes in time order, seconds
 * at the written tempi on one measure grid for all parts, and the normalized partwise text.
 */

function compareVoice(a: string, b: string): number {
  const x = Number(a);
  const y = Number(b);
  if (Number.isFinite(x) && Number.isFinite(y)) return x - y;
  return a < b ? -1 : a > b ? 1 : 0;
}

/** Time order inside a part: measure, onset, staff, voice, grace notes before their main note, pitch. */
export function compareNotes(a: Note, b: Note): number {
  return (
    a.measureIndex - b.measureIndex ||
    cmp(a.onset, b.onset) ||
    a.staff - b.staff ||
    compareVoice(a.voice, b.voice) ||
    (a.isGrace ? a.graceIndex : Infinity) - (b.isGrace ? b.graceIndex : Infinity) ||
    (a.pitch?.midi ?? -1) - (b.pitch?.midi ?? -1)
  );
}

/** The parts that carry measures, in part-list order (parts the list forgot come last). */
export function orderParts(parts: Map<string, PartState>, partListOrder: string[]): PartState[] {
  const listed = new Set(partListOrder);
  const order = [...partListOrder.filter((id) => parts.has(id)), ...[...parts.keys()].filter((id) => !listed.has(id))];
  return order.map((id) => parts.get(id)!).filter((p) => p.measures.length > 0);
}

export function buildModels(states: PartState[], header: HeaderReader, tempoEvents: TempoEvent[], remarks: Set<string>): ScoreModel {
  const timeline = buildTimeline(states, tempoEvents, DEFAULT_TEMPO);
  if (!tempoEvents.length) remarks.add(`No tempo is written; times in seconds assume ${DEFAULT_TEMPO} quarter notes per minute.`);
  const parts: PartModel[] = states.map((p) => {
    p.notes.sort(compareNotes);
    for (const m of p.measures) {
      m.startSeconds = timeline.measureStartSeconds(m.index);
      m.tempo = timeline.tempoAtMeasureStart(m.index);
    }
    for (const n of p.notes) {
      const start = timeline.abs(n.measureIndex, n.onset);
      n.onsetSeconds = timeline.seconds(start);
      n.durationSeconds = n.duration.num === 0 ? 0 : timeline.seconds(start + n.duration.num / n.duration.den) - n.onsetSeconds;
    }
    return { id: p.id, name: header.partNames.get(p.id) ?? p.id, measures: p.measures, notes: p.notes };
  });
  return {
    title: header.title || header.movementTitle,
    composer: header.composer,
    parts,
    remarks: [...remarks],
    notices: barLengthNotices(states),
  };
}

const ESC_ATTR = /[&<>"\n\r\t]/;
const ENT: Record<string, string> = { "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "\n": "&#10;", "\r": "&#13;", "\t": "&#9;" };
export const escAttr = (s: string) => (ESC_ATTR.test(s) ? s.replace(/[&<>"\n\r\t]/g, (c) => ENT[c]) : s);

export function attrString(attrs: Record<string, string>): string {
  let s = "";
  for (const k in attrs) s += ` ${k}="${escAttr(attrs[k])}"`;
  return s;
}

/**
 * The normalized text: the source slices of the header elements and of each part's measures,
 * exactly as the strict tokenizer accepted them, under a root and part elements written here.
 */
export function partwiseText(rootAttrs: string, head: string[], states: PartState[]): string {
  const xml = [`<?xml version="1.0" encoding="UTF-8"?>\n<score-partwise${rootAttrs}>\n`, ...head.map((h) => `${h}\n`)];
  for (const p of states) xml.push(`<part id="${escAttr(p.id)}">\n`, ...p.out, "</part>\n");
  xml.push("</score-partwise>\n");
  return xml.join("");
}
