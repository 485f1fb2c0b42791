/**
 * Note keys on the browser side, read from OpenSheetMusicDisplay's model:
 * `<part>:m<measure index>:s<staff>:v<voice>:<onset fraction>:<midi>[:g<n>]` — the same format
 * the server computes from MusicXML (see lib/musicxml). A tie continuation shares the key of the
 * note its tie starts from; grace notes get `:g1`, `:g2` … in order before their onset.
 */
import type { GraphicalNote, OpenSheetMusicDisplay } from "opensheetmusicdisplay";

export interface OsmdNoteRef {
  key: string;
  measureIndex: number;
  graphicalNote: GraphicalNote;
  svgGroup: SVGGElement | null;
  isRest: boolean;
  isTieContinuation: boolean;
  isGrace: boolean;
}

function gcd(a: number, b: number): number {
  a = Math.abs(a);
  b = Math.abs(b);
  while (b) [a, b] = [b, a % b];
  return a || 1;
}

type SourceNote = GraphicalNote["sourceNote"];

function keyOf(note: SourceNote, measureIndex: number, graceIndex: number): string {
  const entry = note.ParentVoiceEntry;
  const staff = note.ParentStaff;
  const instrument = staff.ParentInstrument;
  const staffNumber = Math.max(1, instrument.Staves.indexOf(staff) + 1);
  const ts = entry.Timestamp;
  const num = ts.GetExpandedNumerator();
  const den = ts.Denominator;
  const g = gcd(num, den);
  const onset = `${num / g}/${den / g}`;
  const midi = note.halfTone + 12;
  const base = `${instrument.IdString}:m${measureIndex}:s${staffNumber}:v${entry.ParentVoice.VoiceId}:${onset}:${midi}`;
  return graceIndex > 0 ? `${base}:g${graceIndex}` : base;
}

/** Every graphical note of the rendered sheet, in time order (measure, onset, voice, pitch). */
export function collectOsmdNotes(osmd: OpenSheetMusicDisplay): OsmdNoteRef[] {
  const refs: OsmdNoteRef[] = [];
  const sheet = osmd.GraphicSheet;
  if (!sheet) return refs;
  const tieStartKeys = new Map<SourceNote, string>();
  sheet.MeasureList.forEach((staves, measureIndex) => {
    for (const measure of staves) {
      if (!measure) continue;
      const graceCounts = new Map<string, number>();
      for (const staffEntry of measure.staffEntries) {
        for (const voiceEntry of staffEntry.graphicalVoiceEntries) {
          for (const graphicalNote of voiceEntry.notes) {
            const note = graphicalNote.sourceNote;
            const isRest = note.isRest();
            const isGrace = Boolean(note.IsGraceNote || note.ParentVoiceEntry?.IsGrace);
            let graceIndex = 0;
            if (isGrace && !isRest) {
              const slot = `${note.ParentVoiceEntry.ParentVoice.VoiceId}:${note.ParentVoiceEntry.Timestamp.RealValue}`;
              graceIndex = (graceCounts.get(slot) ?? 0) + 1;
              graceCounts.set(slot, graceIndex);
            }
            const tie = note.NoteTie;
            const isTieContinuation = Boolean(tie && tie.StartNote && tie.StartNote !== note);
            let key = "";
            if (!isRest) {
              key = isTieContinuation ? (tieStartKeys.get(tie.StartNote) ?? keyOf(tie.StartNote, tie.StartNote.SourceMeasure.measureListIndex, 0)) : keyOf(note, measureIndex, graceIndex);
              if (tie && !isTieContinuation) tieStartKeys.set(note, key);
            }
            let svgGroup: SVGGElement | null = null;
            try {
              svgGroup = (graphicalNote as unknown as { getSVGGElement?: () => SVGGElement | undefined }).getSVGGElement?.() ?? null;
            } catch {
              svgGroup = null;
            }
            refs.push({ key, measureIndex, graphicalNote, svgGroup, isRest, isTieContinuation, isGrace });
          }
        }
      }
    }
  });
  return refs;
}
