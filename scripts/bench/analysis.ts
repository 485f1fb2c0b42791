/**
 * Analysis time of generated 1 000, 10 000 and 100 000-note flute parts, next to the reader's time
 * on the same MusicXML text (the baseline, measured in the same run). Growth should be linear:
 * the µs per note stays flat as the part grows. Each round handles the same number of notes at
 * every size.
 */
import { analyzeScore } from "@/lib/analysis";
import { readScoreFile } from "@/lib/musicxml";
import { seededRandom } from "@/lib/seeded-random";
import type { BenchSection } from "./index";
import { table } from "./util";

const STEPS = ["C", "D", "E", "F", "G", "A", "B"] as const;

/** A deterministic random walk in G major: quarters and eighths, an F♯ or C♯ now and then,
 * a rest and a breath mark every four bars, slurs over each two-bar group. */
export function generatePart(noteCount: number, seed = 7): string {
  const rand = seededRandom(seed);
  const out: string[] = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    '<score-partwise version="4.0"><part-list><score-part id="P1"><part-name>Flute</part-name></score-part></part-list><part id="P1">',
  ];
  let written = 0;
  let bar = 0;
  let degree = 11; // index on a diatonic ladder from C4 (G4 = 4 + 7)
  while (written < noteCount) {
    bar++;
    out.push(`<measure number="${bar}">`);
    if (bar === 1) out.push("<attributes><divisions>2</divisions><key><fifths>1</fifths><mode>major</mode></key><time><beats>4</beats><beat-type>4</beat-type></time><clef><sign>G</sign><line>2</line></clef></attributes>");
    let t = 0;
    while (t < 8 && written < noteCount) {
      const restHere = bar % 4 === 0 && t === 6;
      const dur = restHere || rand() < 0.6 || t === 7 ? 2 - (t === 7 ? 1 : 0) : 1;
      if (restHere) {
        out.push(`<note><rest/><duration>${dur}</duration><voice>1</voice><type>quarter</type></note>`);
      } else {
        degree = Math.max(7, Math.min(20, degree + Math.round((rand() - 0.5) * 4)));
        const step = STEPS[degree % 7];
        const octave = 3 + Math.floor(degree / 7);
        const alter = step === "F" || (step === "C" && rand() < 0.1) ? 1 : 0;
        const notations: string[] = [];
        if (t === 0 && bar % 2 === 1) notations.push('<slur type="start" number="1"/>');
        if (bar % 2 === 0 && t + dur >= 6 && (bar % 4 !== 0 ? t + dur === 8 : t + dur === 6)) notations.push('<slur type="stop" number="1"/>');
        if (bar % 4 === 0 && t + dur === 6) notations.push("<articulations><breath-mark/></articulations>");
        out.push(
          `<note><pitch><step>${step}</step>${alter ? `<alter>${alter}</alter>` : ""}<octave>${octave}</octave></pitch>` +
            `<duration>${dur}</duration><voice>1</voice><type>${dur === 2 ? "quarter" : "eighth"}</type>` +
            (notations.length ? `<notations>${notations.join("")}</notations>` : "") +
            "</note>",
        );
      }
      written++;
      t += dur;
    }
    if (t < 8) out.push(`<forward><duration>${8 - t}</duration></forward>`);
    out.push("</measure>");
  }
  out.push("</part></score-partwise>");
  return out.join("\n");
}

/** With `node --expose-gc`, a full collection before each timed call, so that no call pays for
 * the garbage of the one before; without it (as `npm run bench` runs), nothing. */
const gc = (globalThis as { gc?: () => void }).gc;
const collect = () => gc?.();

/** Notes handled in each timed round, whatever the part's size. */
const ROUND_NOTES = 100_000;

/** Wall time and this process's processor time (every thread: the collector's helpers too) of a
 * call, in ms. Processor time leaves out the waits for a core that other work on a shared machine
 * causes. */
function measure(fn: () => void): { wall: number; cpu: number } {
  const cpu0 = process.cpuUsage();
  const t0 = performance.now();
  fn();
  const wall = performance.now() - t0;
  const cpu = process.cpuUsage(cpu0);
  return { wall, cpu: (cpu.user + cpu.system) / 1000 };
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

async function run(): Promise<void> {
  const sizes = [1_000, 10_000, 100_000].map((n) => {
    const bytes = new TextEncoder().encode(generatePart(n));
    const limits = { maxNotes: n + 10, maxFileBytes: Infinity };
    const read = () => readScoreFile(bytes, "bench.musicxml", limits);
    const { score } = read();
    const analyze = () => analyzeScore(score, "bench.musicxml");
    for (let i = 0; i < 2; i++) {
      read();
      analyze();
    }
    // Every round handles the same number of notes at every size (100 parts of 1,000 notes, 10 of
    // 10,000, one of 100,000), so that each round pays its share of the collector's work: one
    // short call can finish between two collections, which would make a small part look cheaper
    // per note than it is. Times are per call (the round's time ÷ its calls).
    const calls = Math.max(1, Math.round(ROUND_NOTES / n));
    const repeated = (fn: () => unknown) => () => {
      for (let c = 0; c < calls; c++) fn();
    };
    return { n, bytes: bytes.length, calls, read: repeated(read), analyze: repeated(analyze), reads: [] as number[], analyses: [] as number[], analysisCpu: [] as number[] };
  });
  // Rounds interleave the sizes and the two tasks, so all see the same load on a shared machine;
  // medians reported, and the fastest round (the least disturbed by other work) beside them.
  for (let round = 0; round < 9; round++) {
    for (const size of sizes) {
      collect();
      size.reads.push(measure(size.read).wall / size.calls);
      collect();
      const a = measure(size.analyze);
      size.analyses.push(a.wall / size.calls);
      size.analysisCpu.push(a.cpu / size.calls);
    }
  }
  const rows: Array<Record<string, string | number>> = sizes.map(({ n, bytes, reads, analyses, analysisCpu }) => {
    const readMs = median(reads);
    const analyzeMs = median(analyses);
    const perNote = (ms: number) => Number(((ms * 1000) / n).toFixed(2));
    return {
      notes: n,
      "text MB": Number((bytes / 1e6).toFixed(2)),
      "read ms (baseline)": Number(readMs.toFixed(1)),
      "analyze ms": Number(analyzeMs.toFixed(1)),
      "analyze / read": Number((analyzeMs / readMs).toFixed(2)),
      "analyze µs/note": perNote(analyzeMs),
      "fastest µs/note": perNote(Math.min(...analyses)),
      "processor µs/note": perNote(median(analysisCpu)),
      "read µs/note": perNote(readMs),
    };
  });
  table(rows);
  const growth = (key: string) => ((rows[2][key] as number) / (rows[1][key] as number)).toFixed(2);
  console.log(
    `analysis µs/note from 10 000 to 100 000 notes: ×${growth("analyze µs/note")} (median), ×${growth("fastest µs/note")} (fastest round), ` +
      `×${growth("processor µs/note")} (processor time); the reader's ×${growth("read µs/note")} (linear growth keeps these near 1)${gc ? "; collected before each call" : ""}`,
  );
}

const section: BenchSection = { name: "analysis", run };
export default section;
