import type { Metadata } from "next";
import { dehydrate, HydrationBoundary, QueryClient } from "@tanstack/react-query";
import { noteLabel } from "@/lib/markings/note-labels";
import { beatsOfDuration } from "@/lib/practice/hold-ladder";
import { chosenPartAnalysis, loadPartForPage } from "@/server/parts";
import { canWritePractice } from "@/server/practice";
import { assignmentAbilities } from "@/server/assignments";
import { utcIsoDate } from "@/lib/assignments/due";
import { listAssignmentsByPartId } from "@/db/assignments";
import { assignmentKeys, practiceKeys } from "@/components/client/keys";
import { listMarkingsByPartId } from "@/db/markings";
import { listPracticeEntriesByPartId, listTakesByPartId } from "@/db/practice";
import { PracticeRoom, type PracticeNote } from "@/components/screens/practice-room";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Practise" };

/** A part without a tempo marking is practised at a moderate ♩ = 72 (common practice for slow work). */
const ASSUMED_TEMPO = 72;

export default async function PracticePage({ params, searchParams }: { params: Promise<{ partId: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const { partId } = await params;
  const { note } = await searchParams;
  const { user, access } = await loadPartForPage({ partId, action: "practice:view", path: `/parts/${partId}/practice` });
  const { part } = access;
  const [analysis, markings, log, takes, assignments] = await Promise.all([
    chosenPartAnalysis(part),
    listMarkingsByPartId({ partId }),
    listPracticeEntriesByPartId({ partId, userId: part.ownerId }),
    listTakesByPartId({ partId, userId: part.ownerId }),
    listAssignmentsByPartId({ partId }),
  ]);
  const byKey = new Map(markings.map((m) => [m.noteKey, m]));
  const notes: PracticeNote[] = analysis.notes.map((n) => {
    const m = byKey.get(n.key);
    return {
      key: n.key,
      label: noteLabel(n.key, n),
      midi: n.midi,
      beats: beatsOfDuration(n.duration) || 1,
      marking: m ? { depthCents: m.depthCents, speedHz: m.speedHz, placement: m.placement, onset: m.onset, shape: m.shape, role: m.role, comment: m.comment } : null,
    };
  });
  const canWrite = canWritePractice(user, access);
  const queryClient = new QueryClient();
  queryClient.setQueryData(practiceKeys.log(partId), { ...log, canWrite });
  queryClient.setQueryData(practiceKeys.takes(partId), { takes });
  queryClient.setQueryData(assignmentKeys.list(partId), { assignments, ...assignmentAbilities(user, access) });
  // `?note=` (from a link to practice on a note) opens the room on that note.
  const initialNoteKey = typeof note === "string" && part.noteKeys.includes(note) ? note : null;

  return (
    <HydrationBoundary state={dehydrate(queryClient)}>
      <PracticeRoom partId={partId} title={part.title} tempo={part.tempo ?? ASSUMED_TEMPO} tempoAssumed={!part.tempo} notes={notes} canWrite={canWrite} initialNoteKey={initialNoteKey} serverToday={utcIsoDate(new Date())} />
    </HydrationBoundary>
  );
}
