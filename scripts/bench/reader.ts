/**
 * Reader benchmark: for generated flute parts of 1 000, 10 000 and 100 000 notes, the time of a
 * bare saxes pass that only counts elements (the floor), of a plain object-tree parse
 * (fast-xml-parser, document order kept) and of our readScoreFile, on the same text in one run.
 * Goal (issue 3): readScoreFile within 3× the floor, growing linearly.
 */
import { XMLParser } from "fast-xml-parser";
import { SaxesParser } from "saxes";
import { readScoreFile } from "../../lib/musicxml";
import type { BenchSection } from "./index";
import { medianMs, table } from "./util";

const STEPS = ["C", "D", "E", "F", "G", "A", "B"] as const;

/** A single-voice part in 4/4, eight eighths a bar, with the markings real exports carry. */
export function generatePart(notes: number): string {
  const out: string[] = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    '<!DOCTYPE score-partwise PUBLIC "-//Recordare//DTD MusicXML 4.0 Partwise//EN" "http://www.musicxml.org/dtds/partwise.dtd">',
    '<score-partwise version="4.0">',
    "  <work><work-title>Generated Study</work-title></work>",
    '  <part-list><score-part id="P1"><part-name>Flute</part-name></score-part></part-list>',
    '  <part id="P1">',
  ];
  let n = 0;
  let tied = "";
  for (let m = 0; n < notes; m++) {
    out.push(`    <measure number="${m + 1}">`);
    if (m === 0) {
      out.push(
        "      <attributes><divisions>4</divisions><key><fifths>-2</fifths><mode>major</mode></key><time><beats>4</beats><beat-type>4</beat-type></time><clef><sign>G</sign><line>2</line></clef></attributes>",
      );
    }
    if (m % 8 === 0) {
      out.push(
        '      <direction placement="above"><direction-type><metronome><beat-unit>quarter</beat-unit><per-minute>96</per-minute></metronome></direction-type><sound tempo="96"/></direction>',
        '      <direction placement="below"><direction-type><dynamics><mf/></dynamics></direction-type></direction>',
      );
    }
    for (let i = 0; i < 8 && n < notes; i++, n++) {
      const step = STEPS[(m * 3 + i) % 7];
      const alter = step === "B" || step === "E" ? "<alter>-1</alter>" : "";
      let pitch = `<pitch><step>${step}</step>${alter}<octave>${5 + (i % 2)}</octave></pitch>`;
      let tie = "";
      if (i === 0 && tied) {
        // the last eighth of every fourth bar is tied over the barline
        pitch = tied;
        tie = '<tie type="stop"/>';
        tied = "";
      } else if (i === 7 && m % 4 === 3) {
        tie = '<tie type="start"/>';
        tied = pitch;
      }
      const slur = i === 0 ? '<notations><slur type="start" number="1"/></notations>' : i === 7 ? '<notations><slur type="stop" number="1"/></notations>' : "";
      out.push(
        `      <note default-x="${20 + i * 30}">${pitch}<duration>2</duration>${tie}<voice>1</voice><type>eighth</type><stem>down</stem><beam number="1">${i % 4 === 0 ? "begin" : i % 4 === 3 ? "end" : "continue"}</beam>${slur}</note>`,
      );
    }
    if (n >= notes && n % 8 !== 0) {
      const left = (8 - (n % 8)) * 2;
      out.push(`      <forward><duration>${left}</duration></forward>`);
    }
    out.push("    </measure>");
  }
  out.push("  </part>", "</score-partwise>", "");
  return out.join("\n");
}

function saxesCount(text: string): number {
  const p = new SaxesParser({ position: false, xmlns: false });
  let count = 0;
  p.on("opentag", () => void count++);
  p.write(text).close();
  return count;
}

// The upload limit is policy, not speed: the largest generated part is above it on purpose.
const NO_SIZE_LIMIT = { maxFileBytes: Infinity };

const fxp = new XMLParser({ preserveOrder: true, ignoreAttributes: false, processEntities: false });

export async function run(): Promise<void> {
  const rows: Array<Record<string, string | number>> = [];
  for (const size of [1_000, 10_000, 100_000]) {
    const text = generatePart(size);
    const bytes = new TextEncoder().encode(text);
    const mb = bytes.length / (1024 * 1024);
    // Interleaved rounds, so the three see the same load on a shared machine; medians reported.
    const rounds = size >= 100_000 ? 5 : 11;
    const floors: number[] = [];
    const reads: number[] = [];
    const read = () => readScoreFile(bytes, "generated.musicxml", NO_SIZE_LIMIT);
    for (let i = 0; i < 3; i++) {
      saxesCount(text);
      read();
    }
    for (let i = 0; i < rounds; i++) {
      floors.push(await medianMs(() => saxesCount(text), 1, 0));
      reads.push(await medianMs(read, 1, 0));
    }
    const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
    const floor = median(floors);
    const ours = median(reads);
    // The object tree is the slow baseline: fewer runs at the largest size.
    const tree = await medianMs(() => fxp.parse(text), size >= 100_000 ? 3 : 7, 1);
    const notes = readScoreFile(bytes, "generated.musicxml", NO_SIZE_LIMIT).score.parts[0].notes.length;
    const fmt = (ms: number) => ({ ms: Number(ms.toFixed(1)), mbps: Number((mb / (ms / 1000)).toFixed(1)) });
    const f = fmt(floor);
    const t = fmt(tree);
    const o = fmt(ours);
    rows.push({
      notes: size,
      "model notes": notes,
      MB: Number(mb.toFixed(2)),
      "saxes ms": f.ms,
      "saxes MB/s": f.mbps,
      "fxp tree ms": t.ms,
      "fxp MB/s": t.mbps,
      "fxp ×floor": Number((tree / floor).toFixed(2)),
      "read ms": o.ms,
      "read MB/s": o.mbps,
      "read ×floor": Number((ours / floor).toFixed(2)),
      "read µs/note": Number(((ours * 1000) / size).toFixed(2)),
    });
  }
  table(rows);
  const worst = Math.max(...rows.map((r) => r["read ×floor"] as number));
  console.log(`readScoreFile vs bare saxes: worst ${worst}× (goal ≤ 3×)`);
}

const section: BenchSection = { name: "reader", run };
export default section;
