/**
 * Note keys in the browser, read from OpenSheetMusicDisplay's loaded and rendered model. The key
 * of every note is built by the same `noteKey` function the server uses (lib/musicxml/note-key.ts),
 * from the same ingredients: part id, 0-based measure index, staff within the part, voice, onset as
 * an exact fraction, MIDI number and grace position. Browser code: never import server modules.
 */
import type { GraphicalNote, MusicSheet, Note, OpenSheetMusicDisplay, VexFlowGraphicalNote } from "opensheetmusicdisplay";
import { sortNoteKeys } from "@/lib/musicxml/key-order";
import { noteKey } from "@/lib/musicxml/note-key";
import { reconcileNoteKeys } from "@/lib/musicxml/reconcile-keys";

export interface OsmdNoteRef {
  /** The note key; "" for rests (they are never marked). */
  key: string;
  measureIndex: number;
  graphicalNote: GraphicalNote;
  /** The engraved `<g class="vf-stavenote">`; null when the note was not drawn. */
  svgGroup: SVGGElement | null;
  isRest: boolean;
  /** A later note of a tie chain: it carries the key of the chain's first note. */
  isTieContinuation: boolean;
  isGrace: boolean;
}

/** Staff number inside the note's own part, 1-based, as MusicXML's `staff` element counts. */
function staffInPart(note: Note): number {
  const staff = note.ParentStaff;
  return staff.ParentInstrument.Staves.indexOf(staff) + 1;
}

// OSMD's halfTone counts from C0 = 0 in its own octave numbering (octave − 3 relative to
// scientific pitch, see the stack notes): MIDI = halfTone + 12, so C4 = 60.
const midiOf = (note: Note) => note.halfTone + 12;

function keyOf(note: Note, graceIndex: number): string {
  const entry = note.ParentVoiceEntry;
  const onset = entry.Timestamp;
  return noteKey({
    partId: note.ParentStaff.ParentInstrument.IdString,
    measureIndex: note.SourceMeasure.measureListIndex,
    staff: staffInPart(note),
    voice: String(entry.ParentVoice.VoiceId),
    // Exact: OSMD keeps the timestamp as a fraction of a whole note, with whole notes held apart.
    onset: { num: onset.GetExpandedNumerator(), den: onset.Denominator },
    midi: midiOf(note),
    graceIndex,
  });
}

function svgGroupOf(graphicalNote: GraphicalNote): SVGGElement | null {
  const vexNote = graphicalNote as Partial<VexFlowGraphicalNote>;
  try {
    return vexNote.getSVGGElement?.() ?? null;
  } catch {
    // Notes VexFlow did not draw (e.g. hidden) have no element.
    return null;
  }
}

/**
 * Every engraved note and rest of the rendered score with its key, in engraving order
 * (measure, then staff from the top, then position). Call again after every `render()`:
 * graphical objects and SVG elements are rebuilt each time.
 */
export function collectOsmdNotes(osmd: OpenSheetMusicDisplay): OsmdNoteRef[] {
  const refs: OsmdNoteRef[] = [];
  // The first note of each tie chain is keyed where it stands; continuations look it up here.
  const keyByNote = new Map<Note, string>();
  osmd.GraphicSheet.MeasureList.forEach((staves) => {
    for (const measure of staves) {
      if (!measure) continue;
      for (const staffEntry of measure.staffEntries) {
        // Grace notes are numbered 1, 2, … per voice before the note they lead into; a grace
        // chord is one voice entry, so its notes share the number.
        const graceCount = new Map<number, number>();
        for (const voiceEntry of staffEntry.graphicalVoiceEntries) {
          const source = voiceEntry.parentVoiceEntry;
          let graceIndex = 0;
          if (source.IsGrace) {
            const voiceId = source.ParentVoice.VoiceId;
            graceIndex = (graceCount.get(voiceId) ?? 0) + 1;
            graceCount.set(voiceId, graceIndex);
          }
          for (const graphicalNote of voiceEntry.notes) {
            const note = graphicalNote.sourceNote;
            const measureIndex = note.SourceMeasure.measureListIndex;
            const base = { measureIndex, graphicalNote, svgGroup: svgGroupOf(graphicalNote), isGrace: source.IsGrace };
            if (note.isRest()) {
              refs.push({ ...base, key: "", isRest: true, isTieContinuation: false });
              continue;
            }
            const tie = note.NoteTie;
            const first = tie?.StartNote;
            const isTieContinuation = !!first && first !== note;
            let key: string;
            if (isTieContinuation) {
              key = keyByNote.get(first) ?? keyOf(first, 0);
            } else {
              key = keyOf(note, graceIndex);
              keyByNote.set(note, key);
            }
            refs.push({ ...base, key, isRest: false, isTieContinuation });
          }
        }
      }
    }
  });
  return refs;
}

/** The server's keys of the part a page draws. */
export interface ServerNoteKeys {
  keys: readonly string[];
  /** Set when the list covers only the first this many measures (a long part's opening). */
  measures?: number | null;
}

/**
 * The notes with the server's keys (lib/musicxml/reconcile-keys.ts): a note the engraver placed
 * at another time than the one written gets the key of the server's note it stands for. A note
 * that cannot be paired gets no key (it cannot be selected: a marking on it would name no note of
 * the part) and is returned in `unmapped`, so the page can say so. Without a server list, the
 * page's own keys are kept.
 */
export function keyNotesAsServer(refs: readonly OsmdNoteRef[], server: ServerNoteKeys | null | undefined): { refs: OsmdNoteRef[]; unmapped: OsmdNoteRef[] } {
  if (!server) return { refs: [...refs], unmapped: [] };
  const result = reconcileNoteKeys(
    refs.map((ref) => ref.key),
    server.keys,
    { measures: server.measures },
  );
  const unknown = new Set(result.unmapped);
  const unmapped: OsmdNoteRef[] = [];
  const keyed = refs.map((ref, i) => {
    if (unknown.has(ref.key)) {
      if (!ref.isTieContinuation) unmapped.push(ref);
      return { ...ref, key: "" };
    }
    const key = result.keys[i];
    return key === ref.key ? ref : { ...ref, key };
  });
  return { refs: keyed, unmapped };
}

/**
 * The keys of the sounding notes (no rests, one key per tie chain) in the order the server lists
 * them (lib/musicxml/key-order.ts), so the two lists can be compared note for note.
 */
export function osmdNoteKeys(osmd: OpenSheetMusicDisplay): string[] {
  const keys = collectOsmdNotes(osmd)
    .filter((ref) => !ref.isRest && !ref.isTieContinuation)
    .map((ref) => ref.key);
  const partOrder = osmd.Sheet.Instruments.map((instrument) => instrument.IdString);
  return sortNoteKeys(keys, partOrder);
}

/**
 * The same keys read from the loaded model alone (no drawing): every source measure's staff
 * entries and their voice entries, grace notes numbered as in {@link collectOsmdNotes}. A file the
 * engraver cannot draw still gets its keys compared.
 */
export function sheetNoteKeys(sheet: MusicSheet): string[] {
  const keys: string[] = [];
  for (const measure of sheet.SourceMeasures) {
    for (const container of measure.VerticalSourceStaffEntryContainers) {
      for (const staffEntry of container.StaffEntries) {
        if (!staffEntry) continue;
        const graceCount = new Map<number, number>();
        for (const entry of staffEntry.VoiceEntries) {
          let graceIndex = 0;
          if (entry.IsGrace) {
            const voiceId = entry.ParentVoice.VoiceId;
            graceIndex = (graceCount.get(voiceId) ?? 0) + 1;
            graceCount.set(voiceId, graceIndex);
          }
          for (const note of entry.Notes) {
            if (note.isRest()) continue;
            const first = note.NoteTie?.StartNote;
            if (first && first !== note) continue;
            keys.push(keyOf(note, graceIndex));
          }
        }
      }
    }
  }
  return sortNoteKeys(
    keys,
    sheet.Instruments.map((instrument) => instrument.IdString),
  );
}
