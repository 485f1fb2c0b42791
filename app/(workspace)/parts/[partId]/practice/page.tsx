import { workingTempoOf } from "@/lib/parts/working-tempo";
import { PracticeTempoPrompt } from "@/components/score/working-tempo";
import type { Metadata } from "next";
import { dehydrate, HydrationBoundary, QueryClient } from "@tanstack/react-query";
import { noteLabel } from "@/lib/markings/note-labels";
import { beatsOfDuration } from "@/lib/practice/hold-ladder";
import { chosenPartAnalysis, loadPartForPage } from "@/lib/server/parts";
import { canWritePractice } from "@/lib/server/practice";
import { assignmentAbilities } from "@/lib/server/assignments";
import { utcIsoDate } from "@/lib/assignments/due";
import { listAssignmentsByPartId } from "@/db/assignments";
import { assignmentKeys } from "@/components/assignments/api";
import { listMarkingsByPartId } from "@/db/markings";
import { listPracticeEntriesByPartId, listTakesByPartId } from "@/db/practice";
import { practiceKeys } from "@/components/practice/api";
import { PracticeRoom, type PracticeNote } from "@/components/practice/practice-room";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Practise" };

/** Until the player answers the question for a part without a tempo: a moderate ♩ = 72 (common practice for slow work). */
const ASSUMED_TEMPO = 72;

export default async function PracticePage({ params, searchParams }: { params: Promise<{ partId: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const { partId } = await params;
  const { note } = await searchParams;
  const { user, access } = await loadPartForPage({ partId, action: "practice:view", path: `/parts/${partId}/practice` });
  const { part } = access;
  const tempo = workingTempoOf(part);
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
      {tempo === null && user.id === part.ownerId ? (
        <div className="mx-auto max-w-5xl px-gutter pt-4 text-sm">
          <PracticeTempoPrompt partId={partId} />
        </div>
      ) : null}
      <PracticeRoom partId={partId} title={part.title} tempo={tempo ?? ASSUMED_TEMPO} tempoAssumed={tempo === null} notes={notes} canWrite={canWrite} initialNoteKey={initialNoteKey} serverToday={utcIsoDate(new Date())} />
    </HydrationBoundary>
  );
}
