import { AppError, type ErrorCode } from "../errors";

/** Byte and count limits of one read. Every limit has its own error code. */
export interface ReadLimits {
  /** Size of the uploaded file as received (text or `.mxl`). */
  maxFileBytes: number;
  /** Bytes actually inflated from an `.mxl`, over all entries read. */
  maxUncompressedBytes: number;
  maxZipEntries: number;
  /** `note` elements (rests, chord tones, grace notes and tie continuations included). */
  maxNotes: number;
  /** Element nesting depth (real MusicXML stays under 15). */
  maxDepth: number;
}

export const DEFAULT_LIMITS: Readonly<ReadLimits> = Object.freeze({
  maxFileBytes: 10 * 1024 * 1024,
  maxUncompressedBytes: 50 * 1024 * 1024,
  maxZipEntries: 200,
  maxNotes: 100_000,
  maxDepth: 64,
});

/**
 * A file the reader refuses; `code` names the problem, `message` tells a player what to do in
 * their words (bar, note; never an element name). What an engineer or a notation program's
 * support needs (element names, values, XML positions) goes in `details.technical`, which the
 * screens keep behind a "Details" toggle.
 */
export class MusicXmlError extends AppError {
  constructor(code: ErrorCode, message: string, details?: Record<string, unknown>) {
    super(code, message, { field: "file", details });
    this.name = "MusicXmlError";
  }
}

function mb(bytes: number): string {
  return `${Math.round((bytes / (1024 * 1024)) * 10) / 10} MB`;
}

const EXPORT_HINT = "Export the part again from your notation program as MusicXML (.musicxml or .mxl).";

/** Every refusal in one place, so codes and wording stay consistent. */
export const fail = {
  fileTooLarge: (size: number, limit: number) =>
    new MusicXmlError(
      "too_large:file",
      `This file is ${mb(size)}; the limit is ${mb(limit)}. Upload the single part you play, or the compressed .mxl export.`,
      { size, limit },
    ),
  mxlUncompressed: (limit: number) =>
    new MusicXmlError(
      "too_large:mxl_uncompressed",
      `This .mxl unpacks to more than ${mb(limit)}, far more than any part needs. Export just your part, or upload the uncompressed .musicxml.`,
      { limit },
    ),
  mxlEntries: (count: number, limit: number) =>
    new MusicXmlError(
      "too_large:mxl_entries",
      `This .mxl holds ${count} files; a MusicXML export holds a few (the limit is ${limit}). ${EXPORT_HINT}`,
      { count, limit },
    ),
  tooManyNotes: (limit: number) =>
    new MusicXmlError(
      "too_large:notes",
      `This score has more than ${limit.toLocaleString("en")} notes. Upload the single part you play rather than the full score.`,
      { limit },
    ),
  nesting: (limit: number) =>
    new MusicXmlError(
      "bad_request:nesting",
      `This file is built far deeper than any score needs; it is damaged or not a score. ${EXPORT_HINT}`,
      { limit, technical: `Elements are nested more than ${limit} deep.` },
    ),
  empty: () => new MusicXmlError("bad_request:empty", `The file is empty. ${EXPORT_HINT}`),
  notXml: (what: string) =>
    new MusicXmlError("unsupported:not_xml", `This file is not MusicXML: ${what}. ${EXPORT_HINT}`),
  image: (kind: string) =>
    new MusicXmlError(
      "unsupported:image",
      `This is a ${kind} image, not MusicXML. Ondula reads MusicXML exported from a notation program, not photos or scans of sheet music.`,
      { kind },
    ),
  pdf: () =>
    new MusicXmlError(
      "unsupported:pdf",
      `This is a PDF, not MusicXML. Ondula cannot read printed sheet music; ${EXPORT_HINT.charAt(0).toLowerCase()}${EXPORT_HINT.slice(1)}`,
    ),
  encoding: (label: string) =>
    new MusicXmlError(
      "unsupported:encoding",
      "The file's text is stored in a way Ondula cannot read. Export it again as MusicXML; most programs store it as UTF-8.",
      { encoding: label, technical: `The XML declaration names the encoding "${label}", which could not be decoded.` },
    ),
  wrongRoot: (root: string) =>
    new MusicXmlError(
      "unsupported:not_musicxml",
      root === "opus"
        ? "This file is a list of other MusicXML files, not a score. Upload one of the scores it lists."
        : `This file is XML, but not a MusicXML score. ${EXPORT_HINT}`,
      { root, technical: `The root element is <${root}>; a score's is <score-partwise> or <score-timewise>.` },
    ),
  truncated: () =>
    new MusicXmlError(
      "bad_request:truncated",
      `The file ends in the middle of the score; it was probably cut off while saving or uploading. Upload it again, or ${EXPORT_HINT.charAt(0).toLowerCase()}${EXPORT_HINT.slice(1)}`,
    ),
  malformed: (where: string, why: string) =>
    new MusicXmlError(
      "bad_request:malformed",
      `The file is damaged: its text breaks off or is garbled${where ? ` (${where})` : ""}, so it cannot be read as a score. ${EXPORT_HINT}`,
      { where, why, technical: `Not well-formed XML: ${why}${where ? ` at ${where}` : ""}.` },
    ),
  entity: (what: "subset" | "entity" | "parameter") =>
    new MusicXmlError(
      "bad_request:entity_refused",
      `The file carries definitions of its own that could make it grow without end or read other files, so Ondula does not open it. ${EXPORT_HINT}`,
      {
        what,
        technical: {
          subset: "The file carries its own DTD definitions (an internal DOCTYPE subset).",
          entity: "The file declares its own entities (<!ENTITY …>).",
          parameter: "The file uses DTD parameter entities (%name;).",
        }[what],
      },
    ),
  mxlNoScore: (why: string) =>
    new MusicXmlError("bad_request:mxl_no_score", `This .mxl file holds no score. ${EXPORT_HINT}`, { why, technical: why }),
  mxlCorrupt: (why: string) =>
    new MusicXmlError("bad_request:mxl_corrupt", `This .mxl file is damaged and cannot be opened. ${EXPORT_HINT}`, { why, technical: `The .mxl (zip) archive is damaged: ${why}.` }),
  divisions: (measure: string, value: string) =>
    new MusicXmlError(
      "bad_request:divisions",
      `From bar ${measure} on, the file does not say how long its notes are, so they cannot be read. ${EXPORT_HINT}`,
      { measure, value, technical: `Measure number="${measure}" sets <divisions> to "${value}"; it must be a positive number of divisions per quarter note.` },
    ),
  duration: (measure: string, value: string) =>
    new MusicXmlError(
      "bad_request:duration",
      `A note or rest in bar ${measure} has a length that cannot be read. ${EXPORT_HINT}`,
      { measure, value, technical: `Measure number="${measure}" has a <duration> of "${value}", which is not a usable positive number.` },
    ),
  noParts: () =>
    new MusicXmlError("bad_request:no_parts", `This MusicXML score contains no parts with measures. ${EXPORT_HINT}`),
  unknownPart: (ids: string[]) =>
    new MusicXmlError("not_found:part", "This score has no such part. Reload the page and choose the part again.", { ids, technical: `No part with the id ${ids.join(", ")}.` }),
};
