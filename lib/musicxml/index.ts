/**
 * Reading MusicXML safely into the normalized model. The browser only ever receives
 * `partwiseXml` (or a selection of it): never the upload itself.
 */
import { DEFAULT_LIMITS, fail, type ReadLimits } from "./errors";
import type { ScoreModel } from "./model";
import { readMxl } from "./mxl";
import type { SiteScan } from "./read/sites";
import { readMusicXmlText, type ReadOptions } from "./reader";
import { decodeText, sniff } from "./sniff";

export { DEFAULT_LIMITS, MusicXmlError, type ReadLimits } from "./errors";
export { noteKey, parseNoteKey, type NoteKeyParts } from "./note-key";
export { selectPartsXml } from "./select-parts";
export { describeNotices } from "./read/bar-lengths";
export type * from "./model";

export interface ReadScoreResult {
  score: ScoreModel;
  /** Normalized `score-partwise` text: no DOCTYPE, no comments, no entities beyond XML's own. */
  partwiseXml: string;
  format: "musicxml" | "mxl";
  /** With `options.sites`: where each note sits in the text read (see read/sites.ts). */
  sites?: SiteScan;
}

/**
 * Reads an uploaded MusicXML (`.musicxml`, `.xml`) or compressed `.mxl` file. The format is
 * decided from the bytes, not from `fileName` (which only serves messages). Throws
 * `MusicXmlError` with a code and a message a player can act on.
 */
export function readScoreFile(bytes: Uint8Array, fileName: string, limits?: Partial<ReadLimits>, options?: ReadOptions): ReadScoreResult {
  const l: ReadLimits = { ...DEFAULT_LIMITS, ...limits };
  void fileName;
  if (bytes.length > l.maxFileBytes) throw fail.fileTooLarge(bytes.length, l.maxFileBytes);
  if (bytes.length === 0) throw fail.empty();
  const kind = sniff(bytes);
  const text = kind === "zip" ? readMxl(bytes, l) : decodeText(bytes);
  const { score, partwiseXml, sites } = readMusicXmlText(text, l, options);
  return { score, partwiseXml, format: kind === "zip" ? "mxl" : "musicxml", ...(sites ? { sites } : {}) };
}
