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

/** A file the reader refuses; `code` names the problem, `message` tells a player what to do. */
export class MusicXmlError extends AppError {
  constructor(code: ErrorCode, message: string, details?: unknown) {
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
      `Elements in this file are nested more than ${limit} deep, which no MusicXML score needs; the file is damaged or not a score. ${EXPORT_HINT}`,
      { limit },
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
      `The file declares the text encoding "${label}", which could not be read. Save it as UTF-8 MusicXML.`,
      { encoding: label },
    ),
  wrongRoot: (root: string) =>
    new MusicXmlError(
      "unsupported:not_musicxml",
      root === "opus"
        ? "This is a MusicXML opus (a list of other files), not a score. Upload one of the scores it lists."
        : `This XML file is a <${root}> document, not a MusicXML score (expected <score-partwise> or <score-timewise>). ${EXPORT_HINT}`,
      { root },
    ),
  truncated: () =>
    new MusicXmlError(
      "bad_request:truncated",
      `The file ends in the middle of the score; it was probably cut off while saving or uploading. Upload it again, or ${EXPORT_HINT.charAt(0).toLowerCase()}${EXPORT_HINT.slice(1)}`,
    ),
  malformed: (where: string, why: string) =>
    new MusicXmlError(
      "bad_request:malformed",
      `The file is damaged XML (${why}${where ? ` at ${where}` : ""}). ${EXPORT_HINT}`,
      { where, why },
    ),
  entity: (what: "subset" | "entity" | "parameter") =>
    new MusicXmlError(
      "bad_request:entity_refused",
      {
        subset: "The file carries its own DTD definitions (an internal DOCTYPE subset). Ondula refuses these because they can expand without bound or read other files.",
        entity: "The file declares its own entities (<!ENTITY …>). Ondula refuses these because they can expand without bound or read other files.",
        parameter: "The file uses DTD parameter entities (%name;). Ondula refuses these because they can expand without bound or read other files.",
      }[what] + ` ${EXPORT_HINT}`,
      { what },
    ),
  mxlNoScore: (why: string) =>
    new MusicXmlError("bad_request:mxl_no_score", `This .mxl holds no MusicXML score (${why}). ${EXPORT_HINT}`, { why }),
  mxlCorrupt: (why: string) =>
    new MusicXmlError("bad_request:mxl_corrupt", `This .mxl archive is damaged (${why}). ${EXPORT_HINT}`, { why }),
  divisions: (measure: string, value: string) =>
    new MusicXmlError(
      "bad_request:divisions",
      `Measure ${measure} sets <divisions> to "${value}"; it must be a positive number of divisions per quarter note. ${EXPORT_HINT}`,
      { measure, value },
    ),
  duration: (measure: string, value: string) =>
    new MusicXmlError(
      "bad_request:duration",
      `Measure ${measure} has a duration "${value}" that is not a usable positive number. ${EXPORT_HINT}`,
      { measure, value },
    ),
  noParts: () =>
    new MusicXmlError("bad_request:no_parts", `This MusicXML score contains no parts with measures. ${EXPORT_HINT}`),
  unknownPart: (ids: string[]) =>
    new MusicXmlError("not_found:part", `This score has no part with the id ${ids.join(", ")}.`, { ids }),
};
