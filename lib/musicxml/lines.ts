/**
 * Two players on one staff ("Flutes 1.2"): the upper or the lower line of the staff, derived from
 * the reader's model. Pure; the line's notes are the model's own `Note` objects (same keys), so
 * markings, suggestions and practice stay on the notes the page shows.
 *
 * The rules (README, "What Ondula reads"):
 * - Written as chords (one voice): the upper line takes each chord's highest note, the lower line
 *   its lowest; a single note (unison, "a2") and every rest belong to both lines.
 * - Written as two voices: the upper line is the first voice (lowest number), the lower line the
 *   second (a third voice is read with the second). Each line follows its voice where the voices
 *   cross — a player reads their own stems, not the higher pitch. Where only one voice is written
 *   (no note or rest of the other voice sounds then: an "a2" passage written once), both lines
 *   share it. A voice's own rests are that line's silence. A chord inside a voice is reduced as
 *   above.
 * - Grace notes go with their voice (and their chord's top or bottom); tie chains are already one
 *   note in the model. Cue notes belong to neither player and pass through to both lines.
 * Directions such as "1." or "a2" are not read: the notes alone decide.
 */
import type { Note, PartModel } from "./model";

export const LINES = ["upper", "lower"] as const;
export type Line = (typeof LINES)[number];

export interface TwoPlayers {
  /** How the staff writes its two players. */
  writtenAs: "chords" | "voices";
  staff: number;
  /** For "voices": the upper line's voice and the lower line's first voice. */
  voices: [string, string] | null;
}

const EPS = 1e-6;
const played = (n: Note) => !n.isRest && !n.isCue && n.pitch !== null;
const byNumber = (a: string, b: string) => a.localeCompare(b, "en", { numeric: true });
/** Notes that sound (or are written) together in one voice: a chord, or a grace chord. */
const slotOf = (n: Note) => `${n.measureIndex}|${n.staff}|${n.voice}|${n.onset.num}/${n.onset.den}|${n.isGrace ? n.graceIndex : 0}`;

/**
 * Whether the part is one staff carrying two players: two notes sound together somewhere — a
 * chord, or two voices overlapping in time. Voices that only take turns (a file that renumbers its
 * one voice from bar to bar) are one player. A part on several staves (a keyboard) is not offered.
 */
export function twoPlayersOf(part: PartModel): TwoPlayers | null {
  const sounding = part.notes.filter((n) => played(n) && !n.isGrace);
  if (sounding.length < 2) return null;
  const staff = sounding[0].staff;
  if (sounding.some((n) => n.staff !== staff)) return null;

  const voices = [...new Set(sounding.map((n) => n.voice))].sort(byNumber);
  if (voices.length >= 2) {
    const upper = spans(sounding.filter((n) => n.voice === voices[0]));
    const lower = sounding.filter((n) => n.voice !== voices[0]);
    if (lower.some((n) => overlaps(upper, n.onsetSeconds, n.onsetSeconds + n.durationSeconds))) {
      return { writtenAs: "voices", staff, voices: [voices[0], voices[1]] };
    }
  }
  const pitchesAt = new Map<string, number>();
  for (const n of sounding) {
    const slot = slotOf(n);
    const first = pitchesAt.get(slot);
    if (first === undefined) pitchesAt.set(slot, n.pitch!.midi);
    else if (first !== n.pitch!.midi) return { writtenAs: "chords", staff, voices: null };
  }
  return null;
}

/**
 * The part reduced to one line: the notes and rests of the upper or lower player in the part's
 * time order. A part that does not carry two players is returned as it is.
 */
export function lineOf(part: PartModel, line: Line, players: TwoPlayers | null = twoPlayersOf(part)): PartModel {
  if (!players) return part;
  const keep = membership(part, players);
  const want = line === "upper" ? UPPER : LOWER;
  return { ...part, notes: part.notes.filter((n) => ((keep.get(n) ?? BOTH) & want) !== 0) };
}

/** The notes of the other line that the chosen line does not share (for playing both, the other quieter). */
export function otherLineOnly(part: PartModel, line: Line, players: TwoPlayers | null = twoPlayersOf(part)): Note[] {
  if (!players) return [];
  const keep = membership(part, players);
  const mine = line === "upper" ? UPPER : LOWER;
  return part.notes.filter((n) => ((keep.get(n) ?? BOTH) & mine) === 0);
}

const UPPER = 1;
const LOWER = 2;
const BOTH = UPPER | LOWER;

/** For each note of the staff: the lines it belongs to (a bit set); notes not listed belong to both. */
function membership(part: PartModel, players: TwoPlayers): Map<Note, number> {
  const out = new Map<Note, number>();
  const events = part.notes.filter((n) => !n.isCue && n.staff === players.staff);
  // Which side of the staff each event is written on, and which lines it may go to.
  const sideOf = (n: Note) => (players.writtenAs === "chords" || n.voice === players.voices![0] ? UPPER : LOWER);
  let linesOf: (n: Note) => number = () => BOTH;
  if (players.writtenAs === "voices") {
    const upperSpans = spans(events.filter((n) => !n.isGrace && sideOf(n) === UPPER));
    const lowerSpans = spans(events.filter((n) => !n.isGrace && sideOf(n) === LOWER));
    linesOf = (n) => {
      const side = sideOf(n);
      const other = side === UPPER ? lowerSpans : upperSpans;
      // Written on one side only while the other side is silent on the page: both players play it.
      return overlaps(other, n.onsetSeconds, n.onsetSeconds + n.durationSeconds) ? side : BOTH;
    };
  }

  // Group each side's notes into chords; rests stand alone.
  const groups = new Map<string, Note[]>();
  for (const n of events) {
    if (!played(n)) {
      out.set(n, linesOf(n));
      continue;
    }
    const slot = `${sideOf(n)}|${slotOf(n)}`;
    const g = groups.get(slot);
    if (g) g.push(n);
    else groups.set(slot, [n]);
  }
  for (const g of groups.values()) {
    const lines = linesOf(g[0]);
    let top = g[0];
    let bottom = g[0];
    for (const n of g) {
      if (n.pitch!.midi > top.pitch!.midi) top = n;
      if (n.pitch!.midi < bottom.pitch!.midi) bottom = n;
    }
    for (const n of g) {
      let bits = 0;
      if (lines & UPPER && n === top) bits |= UPPER;
      if (lines & LOWER && n === bottom) bits |= LOWER;
      out.set(n, bits);
    }
  }
  return out;
}

interface Spans {
  starts: number[];
  /** The latest end among the spans up to each index (spans sorted by start). */
  maxEnd: number[];
}

function spans(notes: readonly Note[]): Spans {
  const list = notes.map((n) => [n.onsetSeconds, n.onsetSeconds + n.durationSeconds] as const).sort((a, b) => a[0] - b[0]);
  const starts: number[] = [];
  const maxEnd: number[] = [];
  let m = -Infinity;
  for (const [s, e] of list) {
    m = Math.max(m, e);
    starts.push(s);
    maxEnd.push(m);
  }
  return { starts, maxEnd };
}

/**
 * Whether anything in `spans` sounds during [from, to) — or at `from`, for a grace note, which
 * takes no time: a span that starts at or before it and ends after it.
 */
function overlaps(s: Spans, from: number, to: number): boolean {
  const limit = to > from + EPS ? to - EPS : from + EPS;
  // The last span starting before `limit`.
  let lo = 0;
  let hi = s.starts.length - 1;
  let last = -1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    if (s.starts[mid] < limit) {
      last = mid;
      lo = mid + 1;
    } else hi = mid - 1;
  }
  return last >= 0 && s.maxEnd[last] > from + EPS;
}
