/** Small MusicXML builders for the reader's tests (not shipped code). */
import { readScoreFile } from "./index";

export const XML_DECL = '<?xml version="1.0" encoding="UTF-8"?>';
export const DOCTYPE =
  '<!DOCTYPE score-partwise PUBLIC "-//Recordare//DTD MusicXML 4.0 Partwise//EN" "http://www.musicxml.org/dtds/partwise.dtd">';

export function partwise(measures: string[], opts: { id?: string; name?: string; doctype?: boolean } = {}): string {
  const id = opts.id ?? "P1";
  return [
    XML_DECL,
    opts.doctype === false ? "" : DOCTYPE,
    '<score-partwise version="4.0">',
    `<part-list><score-part id="${id}"><part-name>${opts.name ?? "Flute"}</part-name></score-part></part-list>`,
    `<part id="${id}">`,
    ...measures.map((m, i) => `<measure number="${i + 1}">${m}</measure>`),
    "</part>",
    "</score-partwise>",
  ].join("\n");
}

export function attrs(divisions: number, fifths = 0, beats = 4, beatType = 4, mode?: string): string {
  return `<attributes><divisions>${divisions}</divisions><key><fifths>${fifths}</fifths>${mode ? `<mode>${mode}</mode>` : ""}</key><time><beats>${beats}</beats><beat-type>${beatType}</beat-type></time></attributes>`;
}

export interface NoteOpts {
  alter?: number;
  voice?: string;
  staff?: number;
  chord?: boolean;
  grace?: boolean;
  tie?: Array<"start" | "stop">;
  /** Children of <notations>, in schema order. */
  notations?: string;
}

/** One pitched note, children in the schema's order (grace, chord, pitch, duration, tie, voice, staff, notations). */
export function note(step: string, octave: number, duration: number, o: NoteOpts = {}): string {
  return [
    "<note>",
    o.grace ? "<grace/>" : "",
    o.chord ? "<chord/>" : "",
    `<pitch><step>${step}</step>${o.alter ? `<alter>${o.alter}</alter>` : ""}<octave>${octave}</octave></pitch>`,
    o.grace ? "" : `<duration>${duration}</duration>`,
    ...(o.tie ?? []).map((t) => `<tie type="${t}"/>`),
    `<voice>${o.voice ?? "1"}</voice>`,
    o.staff ? `<staff>${o.staff}</staff>` : "",
    o.notations ? `<notations>${o.notations}</notations>` : "",
    "</note>",
  ].join("");
}

export function rest(duration: number, voice = "1"): string {
  return `<note><rest/><duration>${duration}</duration><voice>${voice}</voice></note>`;
}

export function read(xml: string, fileName = "test.musicxml") {
  return readScoreFile(new TextEncoder().encode(xml), fileName);
}
