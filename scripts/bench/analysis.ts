/**
 * Analysis time of generated 1 000, 10 000 and 100 000-note flute parts, next to the reader's time
 * on the same MusicXML text (the baseline, measured in the same run). Growth should be linear:
 * the µs per note stays flat as the part grows.
 */
import { analyzeScore } from "@/lib/analysis";
import { readScoreFile } from "@/lib/musicxml";
import type { BenchSection } from "./index";
import { medianMs, table } from "./util";

const STEPS = ["C", "D", "E", "F", "G", "A", "B"] as const;

/** A deterministic random walk in G major: quarters and eighths, an F♯ or C♯ now and then,
 * a rest and a breath mark every four bars, slurs over each two-bar group. */
export function generatePart(noteCount: number, seed = 7): string {
  let s = seed;
  const rand = () => {
    s = (s * 1103515245 + 12345) % 2147483648;
    return s / 2147483648;
  };
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

async function run(): Promise<void> {
  const rows: Array<Record<string, string | number>> = [];
  for (const n of [1_000, 10_000, 100_000]) {
    const bytes = new TextEncoder().encode(generatePart(n));
    const limits = { maxNotes: n + 10, maxFileBytes: Infinity };
    const read = () => readScoreFile(bytes, "bench.musicxml", limits);
    const { score } = read();
    const analyze = () => analyzeScore(score, "bench.musicxml");
    for (let i = 0; i < 2; i++) {
      read();
      analyze();
    }
    // Interleaved rounds, so both see the same load on a shared machine; medians reported, and
    // the fastest round (the least disturbed by other work) beside them.
    const rounds = n >= 100_000 ? 9 : 21;
    const reads: number[] = [];
    const analyses: number[] = [];
    for (let i = 0; i < rounds; i++) {
      collect();
      reads.push(await medianMs(read, 1, 0));
      collect();
      analyses.push(await medianMs(analyze, 1, 0));
    }
    const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
    const readMs = median(reads);
    const analyzeMs = median(analyses);
    const analyzeMin = Math.min(...analyses);
    rows.push({
      notes: n,
      "text MB": Number((bytes.length / 1e6).toFixed(2)),
      "read ms (baseline)": Number(readMs.toFixed(1)),
      "analyze ms": Number(analyzeMs.toFixed(1)),
      "analyze / read": Number((analyzeMs / readMs).toFixed(2)),
      "analyze µs/note": Number(((analyzeMs * 1000) / n).toFixed(2)),
      "fastest µs/note": Number(((analyzeMin * 1000) / n).toFixed(2)),
      "read µs/note": Number(((readMs * 1000) / n).toFixed(2)),
    });
  }
  table(rows);
  const growth = (key: string) => ((rows[2][key] as number) / (rows[1][key] as number)).toFixed(2);
  console.log(
    `analysis µs/note from 10 000 to 100 000 notes: ×${growth("analyze µs/note")} (median), ×${growth("fastest µs/note")} (fastest round); ` +
      `the reader's ×${growth("read µs/note")} (linear growth keeps these near 1)${gc ? "; collected before each call" : ""}`,
  );
}

const section: BenchSection = { name: "analysis", run };
export default section;
