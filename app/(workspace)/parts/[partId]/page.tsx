import type { Metadata } from "next";
import { notFound, redirect } from "next/navigation";
import { dehydrate, HydrationBoundary, QueryClient } from "@tanstack/react-query";
import { getCurrentUser } from "@/lib/auth/session";
import { AppError } from "@/lib/errors";
import { selectPartsXml } from "@/lib/musicxml";
import { loadPart, partDto } from "@/lib/server/parts";
import { listMarkingsByPartId } from "@/db/markings";
import { listDecisionsByPartId } from "@/db/suggestion-decisions";
import { decisionKeys, markingKeys, partKeys } from "@/components/score/api/keys";
import { Workspace } from "@/components/score/workspace";

export const dynamic = "force-dynamic";

export async function generateMetadata({ params }: { params: Promise<{ partId: string }> }): Promise<Metadata> {
  const { partId } = await params;
  const user = await getCurrentUser();
  if (!user || !/^[0-9a-f-]{36}$/i.test(partId)) return { title: "Workspace" };
  const access = await loadPart(user, partId, "part:view").catch(() => null);
  return { title: access?.part.title ?? "Workspace" };
}

export default async function PartWorkspacePage({ params }: { params: Promise<{ partId: string }> }) {
  const { partId } = await params;
  const user = await getCurrentUser();
  if (!user) redirect(`/sign-in?callbackUrl=/parts/${encodeURIComponent(partId)}`);
  if (!/^[0-9a-f-]{36}$/i.test(partId)) notFound();
  let access;
  try {
    access = await loadPart(user, partId, "part:view");
  } catch (err) {
    if (err instanceof AppError && (err.status === 404 || err.status === 403)) notFound();
    throw err;
  }
  // The text to engrave and the markings travel with the page, so engraving starts without a
  // round trip; the analysis (as large as the text) follows through its own request while the
  // engraver works. The client keeps all of it fresh through the same query keys.
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
