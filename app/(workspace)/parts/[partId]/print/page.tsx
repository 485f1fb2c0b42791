import { workingTempoOf } from "@/lib/parts/working-tempo";
import type { Metadata } from "next";
import { toState } from "@/lib/markings/changes";
import { resolutionsOf } from "@/lib/markings/durations";
import { pendingSuggestions } from "@/lib/markings/suggestions";
import { selectPartsXml } from "@/lib/musicxml";
import { chosenPartAnalysis, loadPartForPage, partTitleForViewer } from "@/lib/server/parts";
import { parseStandCopyOptions } from "@/lib/stand-copy/options";
import { listMarkingsByPartId } from "@/db/markings";
import { listCommentsByPartId } from "@/db/comments";
import { listDecisionsByPartId } from "@/db/suggestion-decisions";
import { getUserById } from "@/db/users";
import { StandCopy } from "@/components/stand-copy/stand-copy";

export const dynamic = "force-dynamic";


export async function generateMetadata({ params }: { params: Promise<{ partId: string }> }): Promise<Metadata> {
  const { partId } = await params;
  const title = await partTitleForViewer(partId);
  return { title: title ? `${title} — stand copy` : "Stand copy" };
}

/** The stand copy: the engraved part with its markings, legend and table, ready to print. */
export default async function StandCopyPage({
  params,
  searchParams,
}: {
  params: Promise<{ partId: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const { partId } = await params;
  const { access } = await loadPartForPage({ partId, action: "part:view", path: `/parts/${partId}/print` });
  const { part } = access;
  const options = parseStandCopyOptions(await searchParams);
  const [markings, analysis, decisions, owner, comments] = await Promise.all([
    listMarkingsByPartId({ partId }),
    chosenPartAnalysis(part),
    options.suggestions ? listDecisionsByPartId({ partId }) : Promise.resolve([]),
    getUserById({ userId: part.ownerId }),
    options.comments ? listCommentsByPartId({ partId }) : Promise.resolve(null),
  ]);
  const suggestions = options.suggestions ? pendingSuggestions(analysis.suggestions, decisions, toState(markings)) : [];
  const resolutions = resolutionsOf(analysis.suggestions);

  return (
    <StandCopy
      data={{
        partId,
        title: part.title,
        composer: part.composer,
        keyLabel: part.keyLabel,
        tempo: workingTempoOf(part),
        playerName: owner?.name ?? "",
        xml: selectPartsXml(part.musicxml, [part.chosenPartId]),
        markings,
        notes: analysis.notes,
        suggestions,
        resolutions,
        comments: comments?.map(({ threadKey, authorName, body, createdAt }) => ({ threadKey, authorName, body, createdAt })) ?? null,
        options,
      }}
    />
  );
}
