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
 *   share it. A voice's own rests are that line's silence. A chord in one voice while the other
 *   voice only rests is both players (top and bottom); while the other voice plays, its line
 *   takes its top (upper) or bottom (lower) note and its other notes belong to neither player.
 * - A tie chain held while the other player moves keeps its place: a chord fits around a note
 *   held from before, and a single held note is the player on its side of the note entering.
 * - Grace notes go with their voice (and their chord's top or bottom); tie chains are already one
 *   note in the model. Cue notes belong to neither player and pass through to both lines.
 * Directions such as "1." or "a2" are not read: the notes alone decide.
 */
import { cmp } from "./fraction";
import type { Note, PartModel } from "./model";

export const LINES = ["upper", "lower"] as const;
export type Line = (typeof LINES)[number];

export interface TwoPlayers {
  /** How the staff writes its two players. */
  writtenAs: "chords" | "voices";
  staff: number;
  /** For "voices": the upper line's voice and the lower line's first voice. */
  voices: [string, string] | null;
  /** Share of the upper line's sounding time that the lower line does not share (0–1). */
  apart: number;
}

/**
 * Below this share of the time apart, the staff is one player with occasional double stops or a
 * passing second voice (on the real corpus, most string parts with double stops stay under 0.06;
 * our two-flute samples are at 0.5 and 0.75): no choice is offered.
 */
export const MIN_APART = 0.1;

const EPS = 1e-6;
/** Which lines a note belongs to, as bits. */
const UPPER = 1;
const LOWER = 2;
const BOTH = UPPER | LOWER;
const played = (n: Note) => !n.isRest && !n.isCue && n.pitch !== null;
const byNumber = (a: string, b: string) => a.localeCompare(b, "en", { numeric: true });
/** Notes that sound (or are written) together in one voice: a chord, or a grace chord. */
const slotOf = (n: Note) => `${n.measureIndex}|${n.staff}|${n.voice}|${n.onset.num}/${n.onset.den}|${n.isGrace ? n.graceIndex : 0}`;

/**
 * Whether the part is one staff carrying two players: two notes sound together — chords, or two
 * voices overlapping in time — for at least `MIN_APART` of the upper line's time. Voices that only
 * take turns (a file that renumbers its one voice from bar to bar) are one player. A part on
 * several staves (a keyboard) is not offered.
 */
export function twoPlayersOf(part: PartModel): TwoPlayers | null {
  const found = writingOf(part);
  if (!found) return null;
  const keep = membership(part, found);
  let upper = 0;
  let alone = 0;
  for (const [n, bits] of keep) {
    if (!(bits & UPPER) || !played(n)) continue;
    upper += n.durationSeconds;
    if (!(bits & LOWER)) alone += n.durationSeconds;
  }
  const apart = upper > 0 ? alone / upper : 0;
  return apart >= MIN_APART ? { ...found, apart } : null;
}

function writingOf(part: PartModel): Omit<TwoPlayers, "apart"> | null {
  // One pass over the notes (a long part has a hundred thousand): how many sound, their staff
  // and voices, and whether two of them share a slot with different pitches.
  let count = 0;
  let staff = 0;
  const voiceSet = new Set<string>();
  const instants = new Instants();
  for (const n of part.notes) {
    if (!played(n) || n.isGrace) continue;
    if (count === 0) staff = n.staff;
    else if (n.staff !== staff) return null;
    count++;
    voiceSet.add(n.voice);
    instants.add(n);
  }
  if (count < 2) return null;
  const sounding = () => part.notes.filter((n) => played(n) && !n.isGrace);

  const voices = [...voiceSet].sort(byNumber);
  if (voices.length >= 2) {
    const all = sounding();
    const upper = spans(all.filter((n) => n.voice === voices[0]));
    const lower = all.filter((n) => n.voice !== voices[0]);
    if (lower.some((n) => overlaps(upper, n.onsetSeconds, n.onsetSeconds + n.durationSeconds))) {
      return { writtenAs: "voices", staff, voices: [voices[0], voices[1]] };
    }
  }
  return instants.hasChord(sounding) ? { writtenAs: "chords", staff, voices: null } : null;
}

/**
 * Whether two notes of one slot (sounding, not grace, one staff) have different pitches, fed one
 * note at a time. The reader lists notes in time order, so a slot's notes come together among
 * those of one instant: they are compared inside each instant rather than keyed one by one.
 */
class Instants {
  /** The notes of the current instant: the first `size` (the array is reused). */
  private group: Note[] = [];
  private size = 0;
  private found = false;
  private ordered = true;

  add(n: Note): void {
    if (this.found || !this.ordered) return;
    const last = this.size > 0 ? this.group[this.size - 1] : null;
    const order = last ? last.measureIndex - n.measureIndex || cmp(last.onset, n.onset) : 0;
    if (order > 0) this.ordered = false;
    else if (order < 0) this.close();
    this.group[this.size++] = n;
  }

  hasChord(sounding: () => readonly Note[]): boolean {
    if (!this.ordered) return hasChordByKey(sounding());
    this.close();
    return this.found;
  }

  private close(): void {
    const g = this.group;
    const size = this.size;
    if (size > 16) this.found = hasChordByKey(g.slice(0, size));
    else {
      for (let x = 0; x < size && !this.found; x++) {
        for (let y = x + 1; y < size; y++) {
          const p = g[x];
          const q = g[y];
          if (q.voice === p.voice && q.onset.num === p.onset.num && q.onset.den === p.onset.den && q.pitch!.midi !== p.pitch!.midi) this.found = true;
        }
      }
    }
    this.size = 0;
  }
}

function hasChordByKey(sounding: readonly Note[]): boolean {
  const pitchesAt = new Map<string, number>();
  for (const n of sounding) {
    const slot = slotOf(n);
    const first = pitchesAt.get(slot);
    if (first === undefined) pitchesAt.set(slot, n.pitch!.midi);
    else if (first !== n.pitch!.midi) return true;
  }
  return false;
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

/** For each note of the staff: the lines it belongs to (a bit set); notes not listed belong to both. */
function membership(part: PartModel, players: Omit<TwoPlayers, "apart">): Map<Note, number> {
  const out = new Map<Note, number>();
  const events = part.notes.filter((n) => !n.isCue && n.staff === players.staff);
  // Which side of the staff each event is written on, and which lines it may go to.
  const sideOf = (n: Note) => (players.writtenAs === "chords" || n.voice === players.voices![0] ? UPPER : LOWER);
  let linesOf: (n: Note, chord?: boolean) => number = () => BOTH;
  if (players.writtenAs === "voices") {
    const written = (side: number, notesOnly: boolean) => spans(events.filter((n) => !n.isGrace && sideOf(n) === side && (!notesOnly || played(n))));
    const upperSpans = written(UPPER, false);
    const lowerSpans = written(LOWER, false);
    const upperNotes = written(UPPER, true);
    const lowerNotes = written(LOWER, true);
    linesOf = (n, chord = false) => {
      const side = sideOf(n);
      const from = n.onsetSeconds;
      const to = from + n.durationSeconds;
      // Written on one side only while the other side is silent on the page: both players play
      // it. A chord while the other side only rests is both players too (two notes, two players).
      if (chord) return overlaps(side === UPPER ? lowerNotes : upperNotes, from, to) ? side : BOTH;
      return overlaps(side === UPPER ? lowerSpans : upperSpans, from, to) ? side : BOTH;
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
  const around = heldAround(events.filter((n) => played(n) && !n.isGrace), sideOf);
  for (const g of groups.values()) {
    const lines = linesOf(g[0], new Set(g.map((n) => n.pitch!.midi)).size > 1);
    let top = g[0];
    let bottom = g[0];
    for (const n of g) {
      if (n.pitch!.midi > top.pitch!.midi) top = n;
      if (n.pitch!.midi < bottom.pitch!.midi) bottom = n;
    }
    // A note of the same side held across the chord from an earlier onset (a tie chain) keeps its
    // place and the chord fits around it; a single note held while another enters is the player
    // on its side of the one entering (a chord names both players at its onset).
    const range = (n: Note): Range | undefined => {
      const h = around.get(n);
      if (!h) return undefined;
      const parts = g.length === 1 ? [h.before, h.after] : [h.before];
      const known = parts.filter((r): r is Range => r !== undefined);
      return known.length ? { low: Math.min(...known.map((r) => r.low)), high: Math.max(...known.map((r) => r.high)) } : undefined;
    };
    const upperOk = top.pitch!.midi >= (range(top)?.high ?? -Infinity);
    const lowerOk = bottom.pitch!.midi <= (range(bottom)?.low ?? Infinity);
    for (const n of g) {
      let bits = 0;
      if (lines & UPPER && n === top && upperOk) bits |= UPPER;
      if (lines & LOWER && n === bottom && lowerOk) bits |= LOWER;
      out.set(n, bits);
    }
  }
  return out;
}

interface Range {
  low: number;
  high: number;
}

/**
 * For each note, the pitch range of the notes on its side of the staff that sound during it but
 * start at another time (in one voice only a tie chain merged into one long note does that):
 * `before`, held from an earlier onset; `after`, entering while it sounds. Notes without such
 * neighbours are left out.
 */
function heldAround(notes: readonly Note[], sideOf: (n: Note) => number): Map<Note, { before?: Range; after?: Range }> {
  const out = new Map<Note, { before?: Range; after?: Range }>();
  const add = (n: Note, which: "before" | "after", other: Note) => {
    const midi = other.pitch!.midi;
    const entry = out.get(n) ?? {};
    const r = entry[which];
    entry[which] = r ? { low: Math.min(r.low, midi), high: Math.max(r.high, midi) } : { low: midi, high: midi };
    out.set(n, entry);
  };
  for (const side of [UPPER, LOWER]) {
    const list = notes.filter((n) => sideOf(n) === side).sort((a, b) => a.onsetSeconds - b.onsetSeconds);
    let active: Note[] = [];
    for (const n of list) {
      active = active.filter((a) => a.onsetSeconds + a.durationSeconds > n.onsetSeconds + EPS);
      for (const a of active) {
        if (Math.abs(a.onsetSeconds - n.onsetSeconds) < EPS) continue;
        add(n, "before", a);
        add(a, "after", n);
      }
      active.push(n);
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
