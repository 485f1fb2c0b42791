import "server-only";
import { analyzeScore, ANALYSIS_VERSION } from "@/lib/analysis";
import type { PartAnalysis, ScoreAnalysis } from "@/lib/analysis/types";
import { assertCan, type Action } from "@/lib/auth/policy";
import { notFound, redirect } from "next/navigation";
import { getCurrentUser } from "@/lib/auth/session";
import type { CurrentUser } from "@/lib/auth/types";
import { config } from "@/lib/config";
import { AppError } from "@/lib/errors";
import { readScoreFile } from "@/lib/musicxml";
import { ingestScore, type IngestedScore } from "@/lib/parts/ingest";
import { getPartAccessById, insertPart, newPartValues, storeAnalysisById, type PartAccess } from "@/db/parts";
import type { MarkingValues } from "@/lib/markings/schema";
import type { Part } from "@/db/schema";
import { randomUUID } from "node:crypto";

export function readLimits() {
  const c = config();
  return {
    maxFileBytes: c.UPLOAD_MAX_BYTES,
    maxUncompressedBytes: c.MXL_MAX_UNCOMPRESSED_BYTES,
    maxZipEntries: c.MXL_MAX_ENTRIES,
    maxNotes: c.MAX_NOTES,
    maxDepth: c.MAX_XML_DEPTH,
  };
}

/**
 * Loads a part for the viewer and checks the action through the policy. A part the viewer may
 * not see answers 404 exactly like a part that does not exist.
 */
export async function loadPart(user: CurrentUser, partId: string, action: Action): Promise<PartAccess> {
  const access = await getPartAccessById({ partId, viewerId: user.id });
  if (!access) throw new AppError("not_found:part", "This part does not exist, or it has not been shared with you.");
  assertCan(user, action, {
    type: "part",
    part: { id: access.part.id, ownerId: access.part.ownerId },
    share: access.permission === "owner" ? null : { permission: access.permission },
  });
  return access;
}

export interface CreatedPart {
  part: Part;
  /** Markings read back from an Ondula export and written to the new part. */
  importedMarkings: number;
  /** Marking records in the file that could not be read (named, never guessed). */
  unreadableMarkings: Array<{ noteKey: string; reason: string }>;
}

/**
 * For a page about one part: sends a visitor without a session to sign in (and back to `path`),
 * and answers "not found" for a part the viewer may not see, exactly as for one that is not there.
 */
export async function loadPartForPage({ partId, action, path }: { partId: string; action: Action; path: string }): Promise<{ user: CurrentUser; access: PartAccess }> {
  const user = await getCurrentUser();
  if (!user) redirect(`/sign-in?callbackUrl=${encodeURIComponent(path)}`);
  if (!UUID.test(partId)) notFound();
  try {
    return { user, access: await loadPart(user, partId, action) };
  } catch (err) {
    if (err instanceof AppError && (err.status === 404 || err.status === 403)) notFound();
    throw err;
  }
}

/** The part's title for the page's <title>, or null when the viewer may not see it. */
export async function partTitleForViewer(partId: string): Promise<string | null> {
  const user = await getCurrentUser();
  if (!user || !UUID.test(partId)) return null;
  const access = await loadPart(user, partId, "part:view").catch(() => null);
  return access?.part.title ?? null;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/**
 * Stores an uploaded file as a new part. A file exported by Ondula carries its markings in hidden
 * records (lib/export/README.md); those on the chosen part's notes become the new part's markings,
 * written by the uploader as one history step, so importing an export recovers every marking.
 */
export async function createPartFromFile(user: CurrentUser, fileName: string, bytes: Uint8Array): Promise<CreatedPart> {
  // One read: the model, the markings an Ondula export carried, and the stored text without the
  // elements Ondula wrote (the uploaded bytes stay as they were).
  const ingested = ingestScore(bytes, fileName, readLimits());
  const { markings, problems } = ingested.ownMarkings;
  // Only markings on the chosen part's notes; they are written in the part's own transaction.
  const known = new Set(ingested.summary.noteKeys);
  const withMarkings = [...markings].filter(([noteKey]) => known.has(noteKey)).map(([noteKey, values]) => ({ noteKey, values }));
  const { part, importedMarkings } = await insertPartFrom(user, fileName, bytes, ingested, withMarkings);
  return { part, importedMarkings, unreadableMarkings: problems };
}

function insertPartFrom(
  user: CurrentUser,
  fileName: string,
  bytes: Uint8Array,
  ingested: IngestedScore,
  withMarkings: Array<{ noteKey: string; values: MarkingValues }>,
) {
  const c = config();
  return insertPart({
    quota: { maxParts: c.QUOTA_PARTS, maxBytes: c.QUOTA_BYTES },
    values: newPartValues({ ownerId: user.id, fileName, bytes, ingested }),
    withMarkings,
    groupId: randomUUID(),
  });
}

/** The stored analysis, recomputed (and stored again) when the analysis version has changed. */
export async function analysisOf(part: Part): Promise<ScoreAnalysis> {
  if (part.analysis && part.analysisVersion === ANALYSIS_VERSION) return part.analysis as ScoreAnalysis;
  const { score } = readScoreFile(new TextEncoder().encode(part.musicxml), part.sourceFileName.replace(/\.mxl$/i, ".musicxml"), readLimits());
  const analysis = analyzeScore(score, part.sourceFileName);
  await storeAnalysisById({ partId: part.id, analysis, analysisVersion: ANALYSIS_VERSION });
  return analysis;
}

export async function chosenPartAnalysis(part: Part): Promise<PartAnalysis> {
  const analysis = await analysisOf(part);
  const result = analysis.parts.find((p) => p.id === part.chosenPartId);
  if (!result) throw new AppError("not_found:analysis", "The analysis of this part is missing. Upload the file again.");
  return result;
}

export function partDto(access: PartAccess) {
  const p = access.part;
  return {
    id: p.id,
    title: p.title,
    composer: p.composer,
    keyLabel: p.keyLabel,
    tempo: p.tempo,
    chosenPartId: p.chosenPartId,
    parts: p.partList,
    measureCount: p.measureCount,
    noteCount: p.noteCount,
    sourceFileName: p.sourceFileName,
    sourceFormat: p.sourceFormat,
    version: p.version,
    createdAt: p.createdAt.toISOString(),
    updatedAt: p.updatedAt.toISOString(),
    permission: access.permission,
    url: `/parts/${p.id}`,
  };
}
export type PartDto = ReturnType<typeof partDto>;
