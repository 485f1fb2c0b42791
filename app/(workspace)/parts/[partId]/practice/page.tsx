import type { Metadata } from "next";
import { dehydrate, HydrationBoundary, QueryClient } from "@tanstack/react-query";
import { utcIsoDate } from "@/lib/assignments/due";
import { loadPracticeRoom } from "@/server/practice";
import { assignmentKeys, practiceKeys } from "@/components/client/keys";
import { PracticeRoom } from "@/components/screens/practice-room";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Practise" };

export default async function PracticePage({ params, searchParams }: { params: Promise<{ partId: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const { partId } = await params;
  const { note } = await searchParams;
  const room = await loadPracticeRoom({ partId, path: `/parts/${partId}/practice` });
  const { part } = room;
  const queryClient = new QueryClient();
  queryClient.setQueryData(practiceKeys.log(partId), room.log);
  queryClient.setQueryData(practiceKeys.takes(partId), room.takes);
  queryClient.setQueryData(assignmentKeys.list(partId), room.assignments);
  // `?note=` (from a link to practice on a note) opens the room on that note.
  const initialNoteKey = typeof note === "string" && part.noteKeys.includes(note) ? note : null;

  return (
    <HydrationBoundary state={dehydrate(queryClient)}>
      {/* Without a tempo the room asks its owner once and keeps the metronome drills until then. */}
      <PracticeRoom partId={partId} title={part.title} tempo={part.tempo} canSetTempo={part.isOwner} notes={room.notes} line={part.line} canWrite={room.canWrite} initialNoteKey={initialNoteKey} serverToday={utcIsoDate(new Date())} />
    </HydrationBoundary>
  );
}
