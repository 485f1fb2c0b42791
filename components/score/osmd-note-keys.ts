/**
 * Note keys on the browser side, read from OpenSheetMusicDisplay's model:
 * `<part>:m<measure index>:s<staff>:v<voice>:<onset fraction>:<midi>[:g<n>]` — the same format
 * the server computes from MusicXML (see lib/musicxml). A tie continuation shares the key of the
 * note its tie starts from; grace notes get `:g1`, `:g2` … in order before their onset.
 */
import type { GraphicalNote, OpenSheetMusicDisplay } from "opensheetmusicdisplay";
import { noteKey } from "@/lib/musicxml/note-key";

export interface OsmdNoteRef {
  key: string;
  measureIndex: number;
  graphicalNote: GraphicalNote;
  svgGroup: SVGGElement | null;
  isRest: boolean;
  isTieContinuation: boolean;
  isGrace: boolean;
}

type SourceNote = GraphicalNote["sourceNote"];

function keyOf(note: SourceNote, measureIndex: number, graceIndex: number): string {
  const entry = note.ParentVoiceEntry;
  const staff = note.ParentStaff;
  const instrument = staff.ParentInstrument;
  const staffNumber = Math.max(1, instrument.Staves.indexOf(staff) + 1);
  const ts = entry.Timestamp;
  return noteKey({
    partId: instrument.IdString,
    measureIndex,
    staff: staffNumber,
    voice: String(entry.ParentVoice.VoiceId),
    onset: { num: ts.GetExpandedNumerator(), den: ts.Denominator },
    midi: note.halfTone + 12,
    graceIndex,
  });
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
          // The notes of one grace chord share their number.
          let chordGraceIndex = 0;
          for (const graphicalNote of voiceEntry.notes) {
            const note = graphicalNote.sourceNote;
            const isRest = note.isRest();
            const isGrace = Boolean(note.IsGraceNote || note.ParentVoiceEntry?.IsGrace);
            let graceIndex = 0;
            if (isGrace && !isRest) {
              if (!chordGraceIndex) {
                const slot = `${note.ParentStaff.Id}:${note.ParentVoiceEntry.ParentVoice.VoiceId}:${note.ParentVoiceEntry.Timestamp.RealValue}`;
                chordGraceIndex = (graceCounts.get(slot) ?? 0) + 1;
                graceCounts.set(slot, chordGraceIndex);
              }
              graceIndex = chordGraceIndex;
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
