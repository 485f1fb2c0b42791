import { Midi } from "@tonejs/midi";
import { describe, expect, it } from "vitest";
import { DEFAULT_MARKING, type MarkingValues } from "@/lib/markings/schema";
import type { Measure, Note, PartModel } from "@/lib/musicxml/model";
import { BEND_POINTS_PER_CYCLE, renderMidi } from "./midi";
import { bendToCents as bend14ToCents, centsToBend as centsToBend14 } from "@/lib/analysis/vibrato";
import { centsToSignedBend, readBendToCents } from "./pitch-bend";
import { DELAYED_ONSET_FRACTION, ENVELOPE_RAMP } from "./vibrato-curve";

const base: MarkingValues = DEFAULT_MARKING;

/** Bars 1–3 at ♩=120 (2 s a bar), bars 4–6 at ♩=60 (4 s a bar), all 4/4. */
function measures(): Measure[] {
  const tempos = [120, 120, 120, 60, 60, 60];
  let start = 0;
  return tempos.map((tempo, index) => {
    const m: Measure = {
      index,
      number: String(index + 1),
      divisions: 4,
      key: { fifths: 0, mode: "major" },
      keyChanged: index === 0,
      time: { beats: 4, beatType: 4 },
      timeChanged: index === 0,
      tempo,
      length: { num: 1, den: 1 },
      barlineRight: "regular",
      barlineLeft: "regular",
      startSeconds: start,
    };
    start += (4 * 60) / tempo;
    return m;
  });
}

function note(measureIndex: number, onset: [number, number], duration: [number, number], midi: number, extra: Partial<Note> = {}): Note {
  const ms = measures();
  const m = ms[measureIndex];
  const secondsPerWhole = (4 * 60) / m.tempo;
  const graceIndex = extra.graceIndex ?? 0;
  const key = `P1:m${measureIndex}:s1:v1:${onset[0]}/${onset[1]}:${midi}${graceIndex ? `:g${graceIndex}` : ""}`;
  // A duration crossing into the slower bars (the tie below) is summed bar by bar.
  let durationSeconds = 0;
  let left = duration[0] / duration[1];
  let at = onset[0] / onset[1];
  for (let i = measureIndex; left > 0 && i < ms.length; i++) {
    const inBar = Math.min(left, 1 - at);
    durationSeconds += inBar * ((4 * 60) / ms[i].tempo);
    left -= inBar;
    at = 0;
  }
  return {
    key,
    partId: "P1",
    measureIndex,
    measureNumber: m.number,
    staff: 1,
    voice: "1",
    onset: { num: onset[0], den: onset[1] },
    duration: { num: duration[0], den: duration[1] },
    onsetSeconds: m.startSeconds + (onset[0] / onset[1]) * secondsPerWhole,
    durationSeconds,
    pitch: { step: "C", alter: 0, octave: 4, midi, name: "" },
    isRest: false,
    isChord: false,
    isGrace: false,
    graceIndex: 0,
    isCue: false,
    tied: false,
    marks: { fermata: false, breathMark: false, caesura: false, slurStarts: [], slurStops: [], dynamics: null },
    ...extra,
  };
}

const notes: Note[] = [
  note(0, [0, 1], [1, 1], 72), // 0–2 s
  note(1, [0, 1], [1, 2], 74), // 2–3 s, unmarked
  note(1, [1, 2], [3, 2], 76, { tied: true }), // 3–6 s, tied across the barline
  note(3, [0, 1], [0, 1], 79, { isGrace: true, graceIndex: 1, durationSeconds: 0 }), // unmarked grace
  note(3, [1, 2], [1, 2], 77), // 8–10 s
  note(4, [0, 1], [1, 1], 79), // 10–14 s
  note(5, [0, 1], [1, 2], 81), // 14–16 s, unmarked
  note(5, [1, 2], [1, 2], 82), // 16–18 s, marked with no depth: plays plain
];
// The grace note belongs before the bar-4 F: move it there (the model gives graces the principal's onset).
notes[3] = note(3, [1, 2], [0, 1], 79, { isGrace: true, graceIndex: 1, durationSeconds: 0 });
notes[3].key = "P1:m3:s1:v1:1/2:79:g1";
const rest: Note = { ...note(3, [0, 1], [1, 2], 0), key: "", pitch: null, isRest: true };
const part: PartModel = { id: "P1", name: "Flute", measures: measures(), notes: [...notes.slice(0, 3), rest, ...notes.slice(3)] };

const marked = new Map<string, MarkingValues>([
  [notes[0].key, { ...base }],
  [notes[2].key, { ...base, depthCents: 30, speedHz: 6, placement: "top-on-pitch", onset: "delayed" }],
  [notes[4].key, { ...base, depthCents: 40, speedHz: 5, shape: "growing", role: "peak" }],
  [notes[5].key, { ...base, depthCents: 25, speedHz: 6.5, shape: "fading", placement: "top-on-pitch" }],
  [notes[7].key, { ...base, depthCents: 0, speedHz: 5 }],
]);

function parse(bytes: Uint8Array) {
  const midi = new Midi(bytes);
  const track = midi.tracks.find((t) => t.notes.length > 0)!;
  return { midi, track };
}

interface Extreme {
  time: number;
  cents: number;
  kind: "peak" | "trough";
}

/** Local maxima and minima of the bend curve inside [from, to). */
function extremes(points: Array<{ time: number; cents: number }>): Extreme[] {
  const out: Extreme[] = [];
  for (let i = 1; i < points.length - 1; i++) {
    const [a, b, c] = [points[i - 1].cents, points[i].cents, points[i + 1].cents];
    if (b > a && b >= c) out.push({ time: points[i].time, cents: b, kind: "peak" });
    if (b < a && b <= c) out.push({ time: points[i].time, cents: b, kind: "trough" });
  }
  return out;
}

/** Speed from the spacing of peaks; depth as half peak-to-peak of neighbouring extremes. */
function measure(points: Array<{ time: number; cents: number }>) {
  const ex = extremes(points);
  const peaks = ex.filter((e) => e.kind === "peak");
  const speedHz = (peaks.length - 1) / (peaks[peaks.length - 1].time - peaks[0].time);
  const halfSwings = ex.slice(1).map((e, i) => ({ time: (e.time + ex[i].time) / 2, depth: Math.abs(e.cents - ex[i].cents) / 2 }));
  return { speedHz, halfSwings, peaks, troughs: ex.filter((e) => e.kind === "trough") };
}

const S = 2;
const bytes = renderMidi(part, marked, { bendRangeSemitones: S });
const { midi, track } = parse(bytes);
const bendsIn = (n: Note) =>
  track.pitchBends
    .filter((b) => b.time >= n.onsetSeconds - 1e-9 && b.time < n.onsetSeconds + n.durationSeconds - 1e-6)
    .map((b) => ({ time: b.time, cents: readBendToCents(b.value, S) }));
const errors: string[] = [];
const relErr = (got: number, want: number) => Math.abs(got - want) / want;

describe("pitch-bend arithmetic", () => {
  it("converts cents to 14-bit bend values as MIDI 1.0 defines them", () => {
    // MIDI 1.0 / check values §7.1: centre 8192, full scale = RPN 0 range, clamp to 0…16383.
    expect(centsToBend14(0, 2)).toBe(8192); // MIDI 1.0 / check values §7
    expect(centsToBend14(50, 2)).toBe(10240); // MIDI 1.0 / check values §7
    expect(centsToBend14(-50, 2)).toBe(6144); // MIDI 1.0 / check values §7
    expect(centsToBend14(1, 2)).toBe(8233); // MIDI 1.0 / check values §7
    expect(centsToBend14(10, 2)).toBe(8602); // MIDI 1.0 / check values §7
    expect(centsToBend14(-200, 2)).toBe(0); // MIDI 1.0 / check values §7
    expect(centsToBend14(200, 2)).toBe(16383); // MIDI 1.0 / check values §7: 16384 clamps to 16383
    expect(bend14ToCents(16383, 2)).toBeCloseTo(199.976, 3); // MIDI 1.0 / check values §7
    expect(centsToSignedBend(30, 2) - centsToSignedBend(-30, 2)).toBe(2 * 1229); // check values §7 test idea
    expect(centsToBend14(100, 12) - 8192).toBe(683); // 6.827 units per cent at S = 12, check values §7
  });

  it("writes raw signed bends through @tonejs/midi and reads them back divided by 8192", () => {
    // check values §7.3: @tonejs/midi passes the written value through; reading divides by 2^13.
    const m = new Midi();
    const t = m.addTrack();
    t.addNote({ midi: 60, ticks: 0, durationTicks: 960 });
    t.addPitchBend({ ticks: 0, value: 4096 });
    t.addPitchBend({ ticks: 10, value: -8192 });
    t.addPitchBend({ ticks: 20, value: 0.5 });
    const back = parse(m.toArray()).track.pitchBends.map((b) => b.value);
    expect(back).toEqual([0.5, -1, 0]); // check values §7.3: 4096 → 0.5, −8192 → −1, 0.5 → 0
  });
});

describe("MIDI export", () => {
  it("sets the bend range through RPN 0 before any bend and states it in a text event", () => {
    const ccAt = (n: number) => (track.controlChanges[n] ?? []).map((c) => ({ ticks: c.ticks, value: Math.round(c.value * 127) }));
    // MIDI 1.0 RPN 0 (check values §7.1): 101=0, 100=0, 6=semitones, 38=cents, then RPN null 127/127.
    expect(ccAt(101)).toEqual([{ ticks: 0, value: 0 }, { ticks: 2, value: 127 }]);
    expect(ccAt(100)).toEqual([{ ticks: 0, value: 0 }, { ticks: 2, value: 127 }]);
    expect(ccAt(6)).toEqual([{ ticks: 1, value: S }]);
    expect(ccAt(38)).toEqual([{ ticks: 1, value: 0 }]);
    expect(Math.min(...track.pitchBends.map((b) => b.ticks))).toBeGreaterThan(1);
    expect(midi.header.meta.some((e) => e.type === "text" && e.text.includes(`±${S} semitones`))).toBe(true);
    const wide = parse(renderMidi(part, marked, { bendRangeSemitones: 12 }));
    expect(Math.round(wide.track.controlChanges[6][0].value * 127)).toBe(12);
  });

  it("plays at the working tempo, every written tempo change scaled by the same factor", () => {
    // Written ♩ = 120 then 60; a working tempo of 90 is 3/4 of the first: 90 then 45.
    const slow = parse(renderMidi(part, marked, { workingTempo: 90 }));
    expect(slow.midi.header.tempos.map((t) => [t.ticks, Math.round(t.bpm)])).toEqual([
      [0, 90],
      [3 * 4 * 480, 45],
    ]);
    // The first note (4 beats: 2 s at ♩ = 120) lasts 4 × 60 / 90 s at ♩ = 90.
    expect(slow.track.notes[0].duration).toBeCloseTo((4 * 60) / 90, 3);
  });

  it("plays the part at its tempi with ties merged, grace notes short and the flute program", () => {
    expect(midi.header.tempos.map((t) => [t.ticks, Math.round(t.bpm)])).toEqual([
      [0, 120],
      [3 * 4 * 480, 60],
    ]);
    expect(track.instrument.number).toBe(73);
    const got = track.notes.map((n) => [n.midi, +n.time.toFixed(3), +n.duration.toFixed(3)]);
    expect(got).toEqual([
      [72, 0, 2],
      [74, 2, 1],
      [76, 3, 3], // tied through bar 3: one note
      [79, 7.875, 0.125], // a thirty-second note at ♩=60, just before its principal
      [77, 8, 2],
      [79, 10, 4],
      [81, 14, 2],
      [82, 16, 2],
    ]);
  });

  it("renders each marked note's vibrato at its speed and depth within 2 %", () => {
    // Steady, centered, immediate.
    const steady = measure(bendsIn(notes[0]));
    expect(relErr(steady.speedHz, 5.5)).toBeLessThan(0.02);
    const steadyDepth = steady.halfSwings.reduce((s, h) => s + h.depth, 0) / steady.halfSwings.length;
    expect(relErr(steadyDepth, 20)).toBeLessThan(0.02);
    for (const h of steady.halfSwings) expect(relErr(h.depth, 20)).toBeLessThan(0.02);
    expect(Math.max(...steady.peaks.map((p) => p.cents))).toBeCloseTo(20, 0);
    expect(Math.min(...steady.troughs.map((p) => p.cents))).toBeCloseTo(-20, 0);
    errors.push(`steady 5.5 Hz/20¢: speed ${(relErr(steady.speedHz, 5.5) * 100).toFixed(3)} %, depth ${(relErr(steadyDepth, 20) * 100).toFixed(3)} %`);

    // Top on pitch, delayed, on a tied note: never above the pitch, top on it.
    const tied = notes[2];
    const topPoints = bendsIn(tied);
    const top = measure(topPoints);
    expect(relErr(top.speedHz, 6)).toBeLessThan(0.02);
    const topDepth = top.halfSwings.reduce((s, h) => s + h.depth, 0) / top.halfSwings.length;
    expect(relErr(topDepth, 30)).toBeLessThan(0.02);
    expect(Math.max(...topPoints.map((p) => p.cents))).toBeLessThanOrEqual(0);
    for (const p of top.peaks) expect(p.cents).toBeGreaterThan(-0.1);
    for (const t of top.troughs) expect(relErr(-t.cents, 60)).toBeLessThan(0.02);
    const firstMove = topPoints.find((p) => p.cents !== 0)!;
    const delayedStart = tied.onsetSeconds + DELAYED_ONSET_FRACTION * tied.durationSeconds;
    expect(firstMove.time).toBeGreaterThan(delayedStart);
    expect(firstMove.time - delayedStart).toBeLessThan(1 / (6 * BEND_POINTS_PER_CYCLE) + 0.002);
    errors.push(`top-on-pitch delayed 6 Hz/30¢: speed ${(relErr(top.speedHz, 6) * 100).toFixed(3)} %, depth ${(relErr(topDepth, 30) * 100).toFixed(3)} %`);

    // Growing: full depth over the last quarter, smaller swings before it.
    const grow = measure(bendsIn(notes[4]));
    expect(relErr(grow.speedHz, 5)).toBeLessThan(0.02);
    const growStart = notes[4].onsetSeconds + ENVELOPE_RAMP * notes[4].durationSeconds;
    const growFull = grow.halfSwings.filter((h) => h.time > growStart + 0.1);
    expect(growFull.length).toBeGreaterThan(2);
    for (const h of growFull) expect(relErr(h.depth, 40)).toBeLessThan(0.02);
    expect(grow.halfSwings[0].depth).toBeLessThan(0.5 * 40);
    errors.push(`growing 5 Hz/40¢: speed ${(relErr(grow.speedHz, 5) * 100).toFixed(3)} %, full depth ${(Math.max(...growFull.map((h) => relErr(h.depth, 40))) * 100).toFixed(3)} % (worst swing)`);

    // Fading, top on pitch: full depth over the first quarter, smaller swings after.
    const fade = measure(bendsIn(notes[5]));
    expect(relErr(fade.speedHz, 6.5)).toBeLessThan(0.02);
    const fadeEnd = notes[5].onsetSeconds + (1 - ENVELOPE_RAMP) * notes[5].durationSeconds;
    const fadeFull = fade.halfSwings.filter((h) => h.time < fadeEnd - 0.1);
    expect(fadeFull.length).toBeGreaterThan(2);
    for (const h of fadeFull) expect(relErr(h.depth, 25)).toBeLessThan(0.02);
    expect(fade.halfSwings[fade.halfSwings.length - 1].depth).toBeLessThan(0.5 * 25);
    errors.push(`fading 6.5 Hz/25¢: speed ${(relErr(fade.speedHz, 6.5) * 100).toFixed(3)} %, full depth ${(Math.max(...fadeFull.map((h) => relErr(h.depth, 25))) * 100).toFixed(3)} % (worst swing)`);

    console.info(`Measured MIDI vibrato errors:\n  ${errors.join("\n  ")}`);
  });

  it("resets the bend to centre at the end of each marked note", () => {
    for (const i of [0, 2, 4, 5]) {
      const end = notes[i].onsetSeconds + notes[i].durationSeconds;
      const last = track.pitchBends.filter((b) => b.time <= end + 1e-6).at(-1)!;
      expect(last.time).toBeCloseTo(end, 3);
      expect(last.value).toBe(0);
    }
  });

  it("leaves unmarked notes and a marking with no depth without any bend", () => {
    for (const i of [1, 3, 6, 7]) {
      const n = notes[i];
      const inside = track.pitchBends.filter((b) => b.time > n.onsetSeconds + 1e-6 && b.time < n.onsetSeconds + n.durationSeconds - 1e-6);
      expect(inside).toEqual([]);
    }
    const plain = parse(renderMidi(part, new Map()));
    expect(plain.track.pitchBends).toEqual([]);
  });

  it("shapes expression (CC 11): a rising ramp for growing, a falling one for fading, constant for steady", () => {
    const expr = (n: Note) =>
      (track.controlChanges[11] ?? [])
        .filter((c) => c.time >= n.onsetSeconds - 1e-9 && c.time < n.onsetSeconds + n.durationSeconds - 1e-6)
        .map((c) => Math.round(c.value * 127));
    const up = expr(notes[4]);
    const down = expr(notes[5]);
    expect(up.length).toBeGreaterThan(4);
    expect(up[0]).toBeLessThan(up[up.length - 1]);
    for (let i = 1; i < up.length; i++) expect(up[i]).toBeGreaterThanOrEqual(up[i - 1]);
    expect(down[0]).toBeGreaterThan(down[down.length - 1]);
    for (let i = 1; i < down.length; i++) expect(down[i]).toBeLessThanOrEqual(down[i - 1]);
    expect(expr(notes[0])).toEqual([100]); // the level set at the start holds through a steady note
    // Back to the steady level when a shaped note ends.
    const after = (track.controlChanges[11] ?? []).filter((c) => Math.abs(c.time - 14) < 1e-6).map((c) => Math.round(c.value * 127));
    expect(after).toContain(100);
  });
});

describe("a staff carrying two players (our two-flute sample, tests/fixtures/real/ours)", async () => {
  const fs = await import("node:fs");
  const path = await import("node:path");
  const { readScoreFile } = await import("@/lib/musicxml");
  const file = path.resolve(import.meta.dirname, "../../tests/fixtures/real/ours/two-flutes-chords.musicxml");
  const part = readScoreFile(new Uint8Array(fs.readFileSync(file)), "two-flutes-chords.musicxml").score.parts[0];
  const pitches = (t: Midi["tracks"][number]) => t.notes.map((n) => n.midi);

  it("plays the chosen line with its vibrato, and the other player's own notes quieter on a second track", () => {
    const marked = part.notes.find((n) => n.pitch?.name === "D5")!;
    const lower = new Midi(renderMidi(part, new Map([[marked.key, { ...base, depthCents: 20, speedHz: 5 }]]), { line: "lower" }));
    expect(lower.tracks).toHaveLength(2);
    // Flute 2: D5 E5 F♯5 | G5 F♯5 E5 | a2 A5 B5 C♯6 D6 | A5.
    expect(pitches(lower.tracks[0])).toEqual([74, 76, 78, 79, 78, 76, 81, 83, 85, 86, 81]);
    expect(lower.tracks[0].pitchBends.length).toBeGreaterThan(0);
    // Flute 1's own notes (the a2 bar sounds once, on the player's track).
    expect(pitches(lower.tracks[1])).toEqual([78, 79, 81, 83, 81, 79, 86]);
    expect(lower.tracks[1].channel).toBe(1);
    expect(lower.tracks[1].pitchBends).toEqual([]);
    for (const n of lower.tracks[1].notes) expect(n.velocity).toBeLessThan(lower.tracks[0].notes[0].velocity);

    const upper = new Midi(renderMidi(part, new Map(), { line: "upper" }));
    expect(pitches(upper.tracks[0])).toEqual([78, 79, 81, 83, 81, 79, 81, 83, 85, 86, 86]);
    expect(pitches(upper.tracks[1])).toEqual([74, 76, 78, 79, 78, 76, 81]);
  });

  it("without a line, every note plays on one track as before", () => {
    const all = new Midi(renderMidi(part, new Map()));
    expect(all.tracks).toHaveLength(1);
    expect(all.tracks[0].notes).toHaveLength(part.notes.filter((n) => !n.isRest).length);
  });
});
