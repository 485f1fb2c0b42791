import "server-only";
import { workingTempoOf } from "@/lib/parts/working-tempo";
import { analyzePart, analyzeScore, ANALYSIS_VERSION } from "@/lib/analysis";
import type { Line } from "@/lib/musicxml/lines";
import type { PartAnalysis, ScoreAnalysis } from "@/lib/analysis/types";
import { assertCan, type Action } from "@/lib/auth/policy";
import { notFound, redirect } from "next/navigation";
import { getCurrentUser } from "@/server/auth/session";
import type { CurrentUser } from "@/lib/auth/types";
import { config } from "@/lib/config";
import { AppError } from "@/lib/errors";
import { readScoreFile } from "@/lib/musicxml";
import { writtenBarsFromText, type WrittenBar } from "@/lib/musicxml/bar-names";
import { noteInBar } from "@/lib/markings/note-labels";
import { ingestScore, summarizePart, type IngestedScore } from "@/lib/parts/ingest";
import { embedMarkings } from "@/lib/export/musicxml-markings";
import { renderMidi } from "@/lib/export/midi";
import type { MarkingValues } from "@/lib/markings/schema";
import { selectPartsXml } from "@/lib/musicxml";
import type { listPartsQuery, patchPartBody } from "@/lib/parts/schemas";
import type { z } from "zod";
import { deletePartById, getPartAccessById, getPartNoteKeysAccessById, getPartTextAccessById, insertPart, listPartsForViewer, newPartValues, storeAnalysisById, storeLineAnalysisById, updatePartById, type PartAccess, type PartTextAccess } from "@/db/parts";
import { listMarkingsByPartId } from "@/db/markings";
import { listDecisionsByPartId } from "@/db/suggestion-decisions";
import type { Part } from "@/db/schema";
import { randomUUID } from "node:crypto";
import { cache } from "react";
import { firstTextOf, openingNoteKeys } from "@/lib/engraving/opening";

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

export const PART_NOT_FOUND = "This part does not exist, or it has not been shared with you.";

/**
 * Loads a part for the viewer and checks the action through the policy. A part the viewer may
 * not see answers 404 exactly like a part that does not exist.
 */
export async function loadPart(user: CurrentUser, partId: string, action: Action): Promise<PartAccess> {
  return allowed(user, action, await getPartAccessById({ partId, viewerId: user.id }));
}

/** `loadPart` without the analyses and uploaded bytes: for what draws the part. */
export async function loadPartText(user: CurrentUser, partId: string, action: Action): Promise<PartTextAccess> {
  return allowed(user, action, await getPartTextAccessById({ partId, viewerId: user.id }));
}

/** The part's row read once for a page's render: its title (metadata) and its body ask alike. */
const readPartForPage = cache((partId: string, viewerId: string) => getPartAccessById({ partId, viewerId }));
const readPartTextForPage = cache((partId: string, viewerId: string) => getPartTextAccessById({ partId, viewerId }));

function allowed<A extends { part: { id: string; ownerId: string }; permission: PartTextAccess["permission"] }>(user: CurrentUser, action: Action, access: A | null): A {
  if (!access) throw new AppError("not_found:part", PART_NOT_FOUND);
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
  /** Marking records in the file that could not be read (named, never guessed), with where they sat. */
  unreadableMarkings: Array<{ noteKey: string; reason: string; where: string }>;
}

/**
 * For a page about one part: sends a visitor without a session to sign in (and back to `path`),
 * and answers "not found" for a part the viewer may not see, exactly as for one that is not there.
 */
export async function loadPartForPage({ partId, action, path }: { partId: string; action: Action; path: string }): Promise<{ user: CurrentUser; access: PartAccess }> {
  return loadForPage({ partId, action, path }, readPartForPage);
}

async function loadForPage<A extends PartTextAccess>(
  { partId, action, path }: { partId: string; action: Action; path: string },
  read: (partId: string, viewerId: string) => Promise<A | null>,
): Promise<{ user: CurrentUser; access: A }> {
  const user = await getCurrentUser();
  if (!user) redirect(`/sign-in?callbackUrl=${encodeURIComponent(path)}`);
  if (!UUID.test(partId)) notFound();
  try {
    return { user, access: allowed(user, action, await read(partId, user.id)) };
  } catch (err) {
    if (err instanceof AppError && (err.status === 404 || err.status === 403)) notFound();
    throw err;
  }
}

/** The part's title for the page's <title>, or null when the viewer may not see it. */
export async function partTitleForViewer(partId: string): Promise<string | null> {
  const user = await getCurrentUser();
  if (!user || !UUID.test(partId)) return null;
  try {
    return allowed(user, "part:view", await readPartTextForPage(partId, user.id)).part.title;
  } catch {
    return null;
  }
}


/** A note named in a request body must be a note of the part (a stale tab may hold old keys). */
export function assertNoteOfPart(part: Part, noteKey: string | null | undefined) {
  if (noteKey && !part.noteKeys.includes(noteKey)) {
    throw new AppError("bad_request:note", "That note is not in this part. Reload the page: the part may have changed.", { field: "noteKey" });
  }
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
  const bars = writtenBarsFromText(ingested.partwiseXml, ingested.chosenPartId);
  const unreadableMarkings = problems.map((p) => ({ ...p, where: noteInBar(p.noteKey, bars) ?? "a note" }));
  return { part, importedMarkings, unreadableMarkings };
}

/** The chosen part's bars as written (numbers and unnumbered bars), for naming bars to people. */
export function barsOfPart(part: Pick<Part, "musicxml" | "chosenPartId">): WrittenBar[] {
  return writtenBarsFromText(part.musicxml, part.chosenPartId);
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

/**
 * The chosen part's analysis on the player's line (or on `line`). The stored analysis holds every
 * part on its upper line; the lower line of a staff carrying two players is analysed on first
 * request and kept under a key of the analysis version, the part and the line.
 */
export async function chosenPartAnalysis(part: Part, line: Line = part.line): Promise<PartAnalysis> {
  const analysis = await analysisOf(part);
  const result = analysis.parts.find((p) => p.id === part.chosenPartId);
  if (!result) throw new AppError("not_found:analysis", "The analysis of this part is missing. Upload the file again.");
  if (line === "upper" || !result.lines) return result;
  const key = lineAnalysisKey(part.chosenPartId, line);
  if (part.lineAnalysis?.key === key) return part.lineAnalysis.analysis as PartAnalysis;
  const { score } = readScoreFile(new TextEncoder().encode(part.musicxml), "stored.musicxml", readLimits());
  const chosen = score.parts.find((p) => p.id === part.chosenPartId);
  if (!chosen) throw new AppError("not_found:analysis", "The analysis of this part is missing. Upload the file again.");
  const onLine = analyzePart(score, chosen, { line });
  await storeLineAnalysisById({ partId: part.id, key, analysis: onLine });
  return onLine;
}

export function lineAnalysisKey(partId: string, line: Line): string {
  return `${ANALYSIS_VERSION}:${partId}:${line}`;
}

export function partDto(access: PartTextAccess) {
  const p = access.part;
  return {
    id: p.id,
    title: p.title,
    composer: p.composer,
    keyLabel: p.keyLabel,
    /** The working tempo: the player's, else the part's own; null when neither exists (then asked for). */
    tempo: workingTempoOf(p),
    writtenTempo: p.tempo,
    workingTempo: p.workingTempo,
    chosenPartId: p.chosenPartId,
    /** Whose line of a two-player staff the analysis, practice and playback follow. */
    line: p.line,
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

// ——— use cases ———

export async function listParts(user: CurrentUser, q: z.infer<typeof listPartsQuery>) {
  const result = await listPartsForViewer({ viewerId: user.id, ...q });
  return { ...result, page: q.page, pageSize: q.pageSize };
}

export async function getPart(user: CurrentUser, partId: string): Promise<PartDto> {
  return partDto(await loadPartText(user, partId, "part:view"));
}

/**
 * Stores an uploaded score as a new part of the uploader's (see `createPartFromFile`). The upload
 * is received only once the policy allows it, so a refused caller's file is never read.
 */
export async function uploadPart(user: CurrentUser, receive: () => Promise<{ fileName: string; bytes: Uint8Array }>) {
  assertCan(user, "part:create", { type: "site" });
  const file = await receive();
  const { part, importedMarkings, unreadableMarkings } = await createPartFromFile(user, file.fileName, file.bytes);
  return { id: part.id, url: `/parts/${part.id}`, parts: part.partList, chosenPart: part.chosenPartId, importedMarkings, unreadableMarkings, notices: part.readNotices };
}

/** Renames the part, or chooses another part of its score (summarised again from the stored text). */
export async function updatePart(user: CurrentUser, partId: string, body: z.infer<typeof patchPartBody>): Promise<PartDto> {
  const access = await loadPart(user, partId, "part:edit");
  const changes: Parameters<typeof updatePartById>[0]["changes"] = {};
  if (body.title !== undefined) changes.title = body.title;
  if (body.composer !== undefined) changes.composer = body.composer;
  if (body.workingTempo !== undefined) changes.workingTempo = body.workingTempo;
  const choosesPart = body.chosenPart !== undefined && body.chosenPart !== access.part.chosenPartId;
  if (body.line !== undefined) {
    // The lower line exists only where the staff carries two players (the analysis says).
    const chosen = (await analysisOf(access.part)).parts.find((p) => p.id === (body.chosenPart ?? access.part.chosenPartId));
    if (body.line === "lower" && !chosen?.lines) {
      throw new AppError("bad_request:line", "This part has one player on its staff, so there is no lower line to choose.", { field: "line" });
    }
    changes.line = body.line;
  } else if (choosesPart) {
    // Another part of the score starts on its upper line.
    changes.line = "upper";
  }
  if (body.chosenPart !== undefined && body.chosenPart !== access.part.chosenPartId) {
    if (!access.part.partList.some((p) => p.id === body.chosenPart)) {
      throw new AppError("bad_request:chosen_part", `This score has no part "${body.chosenPart}". Choose one of: ${access.part.partList.map((p) => p.id).join(", ")}.`, { field: "chosenPart" });
    }
    const analysis = await analysisOf(access.part);
    const { score } = readScoreFile(new TextEncoder().encode(access.part.musicxml), "stored.musicxml", readLimits());
    Object.assign(changes, { chosenPartId: body.chosenPart, ...summarizePart(score, analysis, body.chosenPart) });
  }
  const part = await updatePartById({ partId, changes, expectedVersion: body.version });
  return partDto({ part, permission: access.permission });
}

export async function deletePart(user: CurrentUser, partId: string): Promise<{ id: string; deleted: true }> {
  await loadPart(user, partId, "part:delete");
  await deletePartById({ partId });
  return { id: partId, deleted: true };
}

/**
 * The chosen part's analysis, in the same shape as one part of the command line's output, on the
 * player's line or on the `line` asked for.
 */
export async function getPartAnalysis(user: CurrentUser, partId: string, line?: Line): Promise<PartAnalysis> {
  const { part } = await loadPart(user, partId, "part:view");
  return chosenPartAnalysis(part, line ?? part.line);
}

/**
 * The chosen part's note keys, as the reader keys them: the page keys its drawn notes by them
 * (the engraver can place a note at another time than written; see lib/musicxml/reconcile-keys.ts).
 */
export async function getPartNoteKeys(user: CurrentUser, partId: string): Promise<{ keys: string[] }> {
  const { part } = allowed(user, "part:view", await getPartNoteKeysAccessById({ partId, viewerId: user.id }));
  return { keys: part.noteKeys };
}

function fileStem(title: string): string {
  return title.replace(/[^\w\- ]+/g, "").trim().replace(/\s+/g, "-").toLowerCase() || "part";
}

export interface ExportedFile {
  body: string | Uint8Array;
  contentType: string;
  fileName: string;
}

/** The part with its markings, as MusicXML any notation program opens, or as MIDI with the vibrato. */
export async function exportPart(user: CurrentUser, partId: string, format: "musicxml" | "midi"): Promise<ExportedFile> {
  const { part } = await loadPart(user, partId, "part:view");
  const markings = new Map<string, MarkingValues>(
    (await listMarkingsByPartId({ partId })).map(({ noteKey, version: _v, authorId: _a, updatedAt: _u, ...values }) => [noteKey, values]),
  );
  const stem = fileStem(part.title);
  if (format === "musicxml") {
    return { body: embedMarkings(part.musicxml, markings), contentType: "application/vnd.recordare.musicxml+xml; charset=utf-8", fileName: `${stem}-marked.musicxml` };
  }
  const { score } = readScoreFile(new TextEncoder().encode(part.musicxml), "stored.musicxml", readLimits());
  const chosen = score.parts.find((p) => p.id === part.chosenPartId);
  if (!chosen) throw new AppError("not_found:part", "The chosen part is missing from the score. Choose the part again.");
  return { body: new Uint8Array(renderMidi(chosen, markings, { workingTempo: workingTempoOf(part), line: part.line })), contentType: "audio/midi", fileName: `${stem}-vibrato.mid` };
}

/**
 * The workspace page: the part, its markings and decisions, and the text it engraves first — the
 * whole text of a short part, only the opening of a long one (`opening`; the browser asks for the
 * whole text once the opening is drawn, so the page stays small and its notes come sooner). The
 * analysis, history and discussion are asked for once drawn.
 */
export async function loadWorkspace({ partId, path }: { partId: string; path: string }) {
  const { user, access } = await loadForPage({ partId, action: "part:view", path }, readPartTextForPage);
  const [markings, decisions] = await Promise.all([listMarkingsByPartId({ partId }), listDecisionsByPartId({ partId })]);
  const first = firstTextOf(access.part.musicxml, (xml) => selectPartsXml(xml, [access.part.chosenPartId]));
  return {
    viewerId: user.id,
    part: partDto(access),
    musicxml: first.whole,
    opening: first.opening,
    // The keys travel like the text: all of a short part's, only the opening's of a long one (the
    // whole list is fetched with the whole text).
    noteKeys: first.whole !== null ? access.part.noteKeys : null,
    openingKeys: first.opening !== null ? openingNoteKeys(access.part.noteKeys) : null,
    markings,
    decisions,
  };
}
