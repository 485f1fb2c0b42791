import { analyzeScore, ANALYSIS_VERSION } from "@/lib/analysis";
import type { PartAnalysis, ScoreAnalysis } from "@/lib/analysis/types";
import { markingsFromSites, type ExtractReport } from "@/lib/export/musicxml-markings";
import { OWN_SITES } from "@/lib/export/note-sites";
import { readScoreFile, type ReadLimits } from "@/lib/musicxml";
import { keepMusicXml } from "@/lib/musicxml/keep-musicxml";
import type { PartModel, ScoreModel } from "@/lib/musicxml/model";
import { partDisplayName } from "./part-names";

export interface IngestedScore {
  title: string;
  composer: string;
  format: "musicxml" | "mxl";
  partwiseXml: string;
  partList: { id: string; name: string }[];
  chosenPartId: string;
  analysis: ScoreAnalysis;
  analysisVersion: number;
  summary: PartSummary;
  /** Bars read as written although they disagree with their time signature, in player's words. */
  notices: string[];
  /**
   * Markings an Ondula export carried in the file, read in the same pass; the stored text
   * (`partwiseXml`) is the file without the elements Ondula wrote (their printed copies would go
   * stale on the engraving once the markings live in the database), keeping only MusicXML
   * (lib/musicxml/keep-musicxml.ts: no foreign markup, comments or processing instructions).
   */
  ownMarkings: ExtractReport;
}

export interface PartSummary {
  keyLabel: string;
  tempo: number | null;
  measureCount: number;
  noteCount: number;
  noteKeys: string[];
}

/** Display spelling: "Bb" → "B♭", "F#" → "F♯". */
export function displayTonic(tonic: string): string {
  return tonic.replace(/##/g, "𝄪").replace(/#/g, "♯").replace(/b/g, (m, i) => (i === 0 ? m : "♭"));
}

/**
 * The part a player most likely means to mark: the first part on one staff whose notes are
 * almost all single-line (a flute rather than the piano), else the first part.
 */
export function chooseMelodyPart(score: ScoreModel): string {
  const isMelodic = (p: PartModel) => {
    const sounding = p.notes.filter((n) => !n.isRest);
    if (sounding.length === 0) return false;
    const chords = sounding.filter((n) => n.isChord).length;
    const staves = new Set(sounding.map((n) => n.staff)).size;
    return staves === 1 && chords / sounding.length < 0.1;
  };
  return (score.parts.find(isMelodic) ?? score.parts[0]).id;
}

export function summarizePart(score: ScoreModel, analysis: ScoreAnalysis, partId: string): PartSummary {
  const part = score.parts.find((p) => p.id === partId);
  const result = analysis.parts.find((p) => p.id === partId);
  if (!part || !result) throw new Error(`part ${partId} is not in the score`);
  return {
    keyLabel: keyLabel(result),
    tempo: part.measures[0]?.tempo ?? null,
    measureCount: part.measures.length,
    noteCount: part.notes.filter((n) => !n.isRest).length,
    noteKeys: part.notes.filter((n) => !n.isRest && n.key).map((n) => n.key),
  };
}

export function keyLabel(result: PartAnalysis): string {
  return `${displayTonic(result.key.tonic)} ${result.key.mode}`;
}

/** Reads and analyses an uploaded file; throws the reader's MusicXmlError on bad input. */
export function ingestScore(bytes: Uint8Array, fileName: string, limits: Partial<ReadLimits>): IngestedScore {
  const { score, partwiseXml, format, sites } = readScoreFile(bytes, fileName, limits, { sites: OWN_SITES, dropOwn: true });
  const analysis = analyzeScore(score, fileName);
  const chosenPartId = chooseMelodyPart(score);
  const fallbackTitle = fileName.replace(/\.(musicxml|xml|mxl)$/i, "").replace(/[-_]+/g, " ").trim() || "Untitled part";
  return {
    title: (score.title || fallbackTitle).slice(0, 200),
    composer: (score.composer || "").slice(0, 200),
    format,
    partwiseXml: keepMusicXml(partwiseXml).xml,
    partList: score.parts.map((p: PartModel, i) => ({ id: p.id, name: partDisplayName(p.name, i) })),
    chosenPartId,
    analysis,
    analysisVersion: ANALYSIS_VERSION,
    summary: summarizePart(score, analysis, chosenPartId),
    notices: score.notices.map((n) => n.message),
    ownMarkings: markingsFromSites(sites!.sites),
  };
}
