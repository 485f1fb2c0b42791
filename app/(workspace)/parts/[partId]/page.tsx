import type { Metadata } from "next";
import { dehydrate, HydrationBoundary, QueryClient } from "@tanstack/react-query";
import { selectPartsXml } from "@/lib/musicxml";
import { loadPartForPage, partDto, partTitleForViewer } from "@/server/parts";
import { listMarkingsByPartId } from "@/db/markings";
import { listDecisionsByPartId } from "@/db/suggestion-decisions";
import { decisionKeys, markingKeys, partKeys } from "@/components/client/keys";
import { Workspace } from "@/components/screens/workspace";

export const dynamic = "force-dynamic";

export async function generateMetadata({ params }: { params: Promise<{ partId: string }> }): Promise<Metadata> {
  const { partId } = await params;
  return { title: (await partTitleForViewer(partId)) ?? "Workspace" };
}

export default async function PartWorkspacePage({ params }: { params: Promise<{ partId: string }> }) {
  const { partId } = await params;
  const { user, access } = await loadPartForPage({ partId, action: "part:view", path: `/parts/${partId}` });
  // The text to engrave and the markings travel with the page, so engraving starts without a
  // round trip; the analysis (as large as the text), the history and the discussion's counts are
  // asked for once the score is drawn. The client keeps all of it fresh through the same query keys.
  const [markings, decisions] = await Promise.all([listMarkingsByPartId({ partId }), listDecisionsByPartId({ partId })]);
  const queryClient = new QueryClient();
  queryClient.setQueryData(partKeys.detail(partId), partDto(access));
  queryClient.setQueryData(partKeys.musicxml(partId), selectPartsXml(access.part.musicxml, [access.part.chosenPartId]));
  queryClient.setQueryData(markingKeys.list(partId), { markings });
  queryClient.setQueryData(decisionKeys.list(partId), { decisions });
  return (
    <HydrationBoundary state={dehydrate(queryClient)}>
      <Workspace partId={partId} viewerId={user.id} />
    </HydrationBoundary>
  );
}
