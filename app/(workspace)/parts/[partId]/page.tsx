import type { Metadata } from "next";
import { dehydrate, HydrationBoundary, QueryClient } from "@tanstack/react-query";
import { loadWorkspace, partTitleForViewer } from "@/server/parts";
import { decisionKeys, markingKeys, partKeys } from "@/components/client/keys";
import { Workspace } from "@/components/screens/workspace";

export const dynamic = "force-dynamic";

export async function generateMetadata({ params }: { params: Promise<{ partId: string }> }): Promise<Metadata> {
  const { partId } = await params;
  return { title: (await partTitleForViewer(partId)) ?? "Workspace" };
}

export default async function PartWorkspacePage({ params }: { params: Promise<{ partId: string }> }) {
  const { partId } = await params;
  // The text to engrave first and the markings travel with the page, so engraving starts without
  // a round trip: a short part's whole text, a long part's opening only (its whole text, as large
  // as the page would be, is asked for once the opening is drawn, and drawn when the page is
  // idle). The analysis (as large as the text), the history and the discussion's counts are asked
  // for once the score is drawn. The note keys go with the text they key (a long part's opening
  // with its opening's keys), so the drawn notes carry the server's keys from the first drawing.
  // The client keeps all of it fresh through the same query keys.
  const page = await loadWorkspace({ partId, path: `/parts/${partId}` });
  const queryClient = new QueryClient();
  queryClient.setQueryData(partKeys.detail(partId), page.part);
  if (page.musicxml !== null) queryClient.setQueryData(partKeys.musicxml(partId), page.musicxml);
  if (page.noteKeys !== null) queryClient.setQueryData(partKeys.noteKeys(partId), { keys: page.noteKeys });
  queryClient.setQueryData(markingKeys.list(partId), { markings: page.markings });
  queryClient.setQueryData(decisionKeys.list(partId), { decisions: page.decisions });
  return (
    <HydrationBoundary state={dehydrate(queryClient)}>
      <Workspace partId={partId} viewerId={page.viewerId} opening={page.opening} openingKeys={page.openingKeys} />
    </HydrationBoundary>
  );
}
