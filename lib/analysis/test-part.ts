/**
 * Builds normalized parts from a compact melody text, for the analysis tests (no MusicXML needed).
 *
 *   "C4:q D4:q E4:q F4:q | G4:h r:q E4:q ||  K:-2:minor  G4:w |]"
 *
 * Tokens: a pitch (`C4`, `F#5`, `Bb3`, `C##4`) or `r` for a rest, then `:` and a duration
 * (`w h q e s`, dots allowed: `q.`; or a fraction of a whole note: `3/8`); grace notes use `:g`.
 * Suffixes: `!` fermata, `,` breath mark, `(` slur start, `)` slur stop, `^` caesura.
 * Chords: `[C4,E4,G4]:h`. Bars: `|` regular, `||` double, `|]` final. `K:fifths:mode` at the
 * start of a bar changes the key (`K:1:none` for no mode); `T:3/4` changes the time signature.
 */
import type { BarlineStyle, Fraction, Measure, Note, PartModel, ScoreModel } from "@/lib/musicxml/model";

const STEPS = { C: 0, D: 2, E: 4, F: 5, G: 7, A: 9, B: 11 } as const;

function gcd(a: number, b: number): number {
  return b === 0 ? Math.abs(a) : gcd(b, a % b);
}

export function fr(num: number, den: number): Fraction {
  const g = gcd(num, den) || 1;
  return { num: num / g, den: den / g };
}

function add(a: Fraction, b: Fraction): Fraction {
  return fr(a.num * b.den + b.num * a.den, a.den * b.den);
}

function parseDuration(d: string): Fraction {
  if (d.includes("/")) {
    const [n, m] = d.split("/").map(Number);
    return fr(n, m);
  }
  const base: Record<string, number> = { w: 1, h: 2, q: 4, e: 8, s: 16 };
  const den = base[d[0]];
  if (!den) throw new Error(`bad duration ${d}`);
  let f = fr(1, den);
  let part = fr(1, den);
  for (const c of d.slice(1)) {
    if (c !== ".") throw new Error(`bad duration ${d}`);
    part = fr(part.num, part.den * 2);
    f = add(f, part);
  }
  return f;
}

function parsePitch(p: string) {
  const m = /^([A-G])(#{1,2}|b{1,2})?(-?\d)$/.exec(p);
  if (!m) throw new Error(`bad pitch ${p}`);
  const step = m[1] as keyof typeof STEPS;
  const alter = m[2] ? (m[2][0] === "#" ? m[2].length : -m[2].length) : 0;
  const octave = Number(m[3]);
  return { step, alter, octave, midi: 12 * (octave + 1) + STEPS[step] + alter, name: `${step}${m[2] ?? ""}${octave}` };
}

export interface BuildOptions {
  id?: string;
  name?: string;
  fifths?: number;
  mode?: string | null;
  time?: [number, number];
  tempo?: number;
  /** Staff and voice of every note (default 1 / "1"). */
  staff?: number;
  voice?: string;
}

export function buildPart(text: string, opts: BuildOptions = {}): PartModel {
  const id = opts.id ?? "P1";
  const staff = opts.staff ?? 1;
  const voice = opts.voice ?? "1";
  const tempo = opts.tempo ?? 100;
  let key = { fifths: opts.fifths ?? 0, mode: opts.mode === undefined ? "major" : opts.mode };
  let time = { beats: opts.time?.[0] ?? 4, beatType: opts.time?.[1] ?? 4 };
  const measures: Measure[] = [];
  const notes: Note[] = [];
  const parts = text.split(/(\|\]|\|\||\|)/);
  let seconds = 0;
  let barText = "";
  const bars: Array<{ text: string; right: BarlineStyle }> = [];
  for (const p of parts) {
    if (p === "|" || p === "||" || p === "|]") {
      bars.push({ text: barText, right: p === "|" ? "regular" : p === "||" ? "double" : "final" });
      barText = "";
    } else barText += p;
  }
  if (barText.trim()) bars.push({ text: barText, right: "regular" });
  for (const [index, bar] of bars.entries()) {
    let keyChanged = index === 0;
    let timeChanged = index === 0;
    let onset = fr(0, 1);
    let graceCount = 0;
    const pending: Note[] = [];
    for (const tok of bar.text.trim().split(/\s+/).filter(Boolean)) {
      if (tok.startsWith("K:")) {
        const [, f, m] = tok.split(":");
        key = { fifths: Number(f), mode: m === "none" ? null : m };
        keyChanged = true;
        continue;
      }
      if (tok.startsWith("T:")) {
        const [b, t] = tok.slice(2).split("/").map(Number);
        time = { beats: b, beatType: t };
        timeChanged = true;
        continue;
      }
      const m = /^(\[[^\]]+\]|[^:]+):([^!,()^]+)([!,()^]*)$/.exec(tok);
      if (!m) throw new Error(`bad token ${tok}`);
      const [, head, durText, marksText] = m;
      const grace = durText === "g";
      const duration = grace ? fr(0, 1) : parseDuration(durText);
      const pitches = head.startsWith("[") ? head.slice(1, -1).split(",") : [head];
      const marks = {
        fermata: marksText.includes("!"),
        breathMark: marksText.includes(","),
        caesura: marksText.includes("^"),
        slurStarts: marksText.includes("(") ? [1] : [],
        slurStops: marksText.includes(")") ? [1] : [],
        dynamics: null,
      };
      const secPerWhole = (60 / tempo) * 4;
      pitches.forEach((ptext, ci) => {
        const isRest = ptext === "r";
        const pitch = isRest ? null : parsePitch(ptext);
        if (grace) graceCount++;
        const keyText = isRest ? "" : `${id}:m${index}:s${staff}:v${voice}:${onset.num}/${onset.den}:${pitch?.midi}${grace ? `:g${graceCount}` : ""}`;
        pending.push({
          key: keyText,
          partId: id,
          measureIndex: index,
          measureNumber: String(index + 1),
          staff,
          voice,
          onset,
          duration,
          onsetSeconds: seconds + (onset.num / onset.den) * secPerWhole,
          durationSeconds: (duration.num / duration.den) * secPerWhole,
          pitch,
          isRest,
          isChord: ci > 0,
          isGrace: grace,
          graceIndex: grace ? graceCount : 0,
          isCue: false,
          tied: false,
          marks: { ...marks, slurStarts: [...marks.slurStarts], slurStops: [...marks.slurStops] },
        });
      });
      if (!grace) {
        onset = add(onset, duration);
        graceCount = 0;
      }
    }
    const length = fr(time.beats, time.beatType);
    measures.push({
      index,
      number: String(index + 1),
      divisions: 48,
      key: { ...key },
      keyChanged,
      time: { ...time },
      timeChanged,
      tempo,
      length,
      barlineRight: bar.right,
      barlineLeft: "regular",
      startSeconds: seconds,
    });
    seconds += (length.num / length.den) * (60 / tempo) * 4;
    notes.push(...pending);
  }
  return { id, name: opts.name ?? "Flute", measures, notes };
}

export function buildScore(...parts: PartModel[]): ScoreModel {
  return { title: "Test", composer: "", parts, remarks: [], notices: [] };
}
