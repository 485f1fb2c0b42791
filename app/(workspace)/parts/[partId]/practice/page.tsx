import type { Metadata } from "next";
import { dehydrate, HydrationBoundary, QueryClient } from "@tanstack/react-query";
import { noteLabel } from "@/lib/markings/note-labels";
import { beatsOfDuration } from "@/lib/practice/hold-ladder";
import { chosenPartAnalysis, loadPartForPage } from "@/lib/server/parts";
import { canWritePractice } from "@/lib/server/practice";
import { listMarkingsByPartId } from "@/db/markings";
import { listPracticeEntriesByPartId, listTakesByPartId } from "@/db/practice";
import { practiceKeys } from "@/components/practice/api";
import { PracticeRoom, type PracticeNote } from "@/components/practice/practice-room";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Practise" };

/** A part without a tempo marking is practised at a moderate ♩ = 72 (common practice for slow work). */
const ASSUMED_TEMPO = 72;

export default async function PracticePage({ params }: { params: Promise<{ partId: string }> }) {
  const { partId } = await params;
  const { user, access } = await loadPartForPage({ partId, action: "practice:view", path: `/parts/${partId}/practice` });
  const { part } = access;
  const [analysis, markings, log, takes] = await Promise.all([
    chosenPartAnalysis(part),
    listMarkingsByPartId({ partId }),
    listPracticeEntriesByPartId({ partId, userId: part.ownerId }),
    listTakesByPartId({ partId, userId: part.ownerId }),
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

  return (
    <HydrationBoundary state={dehydrate(queryClient)}>
      <PracticeRoom partId={partId} title={part.title} tempo={part.tempo ?? ASSUMED_TEMPO} tempoAssumed={!part.tempo} notes={notes} canWrite={canWrite} />
    </HydrationBoundary>
  );
}
