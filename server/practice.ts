import "server-only";
import { workingTempoOf } from "@/lib/parts/working-tempo";
import { can } from "@/lib/auth/policy";
import type { CurrentUser } from "@/lib/auth/types";
import { noteLabel } from "@/lib/markings/note-labels";
import { beatsOfDuration } from "@/lib/practice/hold-ladder";
import type { PracticeLogDto, practiceEntryBodySchema, takeBodySchema } from "@/lib/practice/schema";
import type { z } from "zod";
import { listAssignmentsByPartId } from "@/db/assignments";
import { getMarkingByNoteKey, listMarkingsByPartId } from "@/db/markings";
import type { PartAccess } from "@/db/parts";
import { insertPracticeEntry, insertTake, listPracticeEntriesByPartId, listTakesByPartId } from "@/db/practice";
import { assignmentAbilities } from "./assignments";
import { assertNoteOfPart, barsOfPart, chosenPartAnalysis, loadPart, loadPartForPage } from "./parts";

/** Whether the viewer may add to the part's practice log and takes (the policy decides). */
export function canWritePractice(user: CurrentUser, access: PartAccess): boolean {
  const { part, permission } = access;
  return can(user, "practice:write", { type: "part", part: { id: part.id, ownerId: part.ownerId }, share: permission === "owner" ? null : { permission } });
}

/** The part owner's practice log; the owner's teacher with access reads it too. */
export async function getPracticeLog(user: CurrentUser, partId: string): Promise<PracticeLogDto> {
  const access = await loadPart(user, partId, "practice:view");
  const log = await listPracticeEntriesByPartId({ partId, userId: access.part.ownerId });
  return { ...log, canWrite: canWritePractice(user, access) };
}

export async function addPracticeEntry(user: CurrentUser, partId: string, body: z.infer<typeof practiceEntryBodySchema>) {
  const { part } = await loadPart(user, partId, "practice:write");
  assertNoteOfPart(part, body.noteKey);
  const entry = await insertPracticeEntry({ partId, userId: user.id, kind: body.kind, minutes: body.minutes, noteKey: body.noteKey ?? null, notes: body.notes });
  return { entry };
}

/** The owner's measured takes, newest first (optionally of one note). */
export async function listTakes(user: CurrentUser, partId: string, noteKey: string | undefined) {
  const { part } = await loadPart(user, partId, "practice:view");
  return { takes: await listTakesByPartId({ partId, userId: part.ownerId, noteKey }) };
}

/** Stores a take's numbers; the marking it is compared with is read here, not sent by the client. */
export async function saveTake(user: CurrentUser, partId: string, body: z.infer<typeof takeBodySchema>) {
  const { part } = await loadPart(user, partId, "practice:write");
  assertNoteOfPart(part, body.noteKey);
  const marking = await getMarkingByNoteKey({ partId, noteKey: body.noteKey });
  const { noteKey, ...numbers } = body;
  const take = await insertTake({
    partId,
    userId: user.id,
    noteKey,
    measured: { ...numbers, marked: marking ? { speedHz: marking.speedHz, depthCents: marking.depthCents } : null },
  });
  return { take };
}

/** What the practice room carries: its notes with their markings, the log, the takes and the practice set. */
export async function loadPracticeRoom({ partId, path }: { partId: string; path: string }) {
  const { user, access } = await loadPartForPage({ partId, action: "practice:view", path });
  const { part } = access;
  const [analysis, markings, log, takes, assignments] = await Promise.all([
    chosenPartAnalysis(part),
    listMarkingsByPartId({ partId }),
    listPracticeEntriesByPartId({ partId, userId: part.ownerId }),
    listTakesByPartId({ partId, userId: part.ownerId }),
    listAssignmentsByPartId({ partId }),
  ]);
  const byKey = new Map(markings.map((m) => [m.noteKey, m]));
  const bars = barsOfPart(part);
  const notes = analysis.notes.map((n) => {
    const m = byKey.get(n.key);
    return {
      key: n.key,
      label: noteLabel(n.key, bars, n),
      midi: n.midi,
      beats: beatsOfDuration(n.duration) || 1,
      marking: m ? { depthCents: m.depthCents, speedHz: m.speedHz, placement: m.placement, onset: m.onset, shape: m.shape, role: m.role, comment: m.comment } : null,
    };
  });
  const canWrite = canWritePractice(user, access);
  return {
    // The working tempo (null: the part gives none and the player has not said yet).
    part: { title: part.title, tempo: workingTempoOf(part), noteKeys: part.noteKeys, isOwner: user.id === part.ownerId, line: analysis.lines?.line ?? null },
    notes,
    canWrite,
    log: { ...log, canWrite },
    takes: { takes },
    assignments: { assignments, ...assignmentAbilities(user, access) },
  };
}
