import type { Metadata } from "next";
import { notFound, redirect } from "next/navigation";
import { getCurrentUser } from "@/lib/auth/session";
import { AppError } from "@/lib/errors";
import { toState } from "@/lib/markings/changes";
import { resolutionsOf } from "@/lib/markings/durations";
import { pendingSuggestions } from "@/lib/markings/suggestions";
import { selectPartsXml } from "@/lib/musicxml";
import { chosenPartAnalysis, loadPart } from "@/lib/server/parts";
import { parseStandCopyOptions } from "@/lib/stand-copy/options";
import { listMarkingsByPartId } from "@/db/markings";
import { listCommentsForPrint } from "@/db/stand-copy";
import { listDecisionsByPartId } from "@/db/suggestion-decisions";
import { getUserById } from "@/db/users";
import { StandCopy } from "@/components/stand-copy/stand-copy";

export const dynamic = "force-dynamic";

const UUID = /^[0-9a-f-]{36}$/i;

export async function generateMetadata({ params }: { params: Promise<{ partId: string }> }): Promise<Metadata> {
  const { partId } = await params;
  const user = await getCurrentUser();
  if (!user || !UUID.test(partId)) return { title: "Stand copy" };
  const access = await loadPart(user, partId, "part:view").catch(() => null);
  return { title: access ? `${access.part.title} — stand copy` : "Stand copy" };
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
  const user = await getCurrentUser();
  if (!user) redirect(`/sign-in?callbackUrl=${encodeURIComponent(`/parts/${partId}/print`)}`);
  if (!UUID.test(partId)) notFound();
  let access;
  try {
    access = await loadPart(user, partId, "part:view");
  } catch (err) {
    if (err instanceof AppError && (err.status === 404 || err.status === 403)) notFound();
    throw err;
  }
  const { part } = access;
  const options = parseStandCopyOptions(await searchParams);
  const [markings, analysis, decisions, owner, comments] = await Promise.all([
    listMarkingsByPartId({ partId }),
    chosenPartAnalysis(part),
    options.suggestions ? listDecisionsByPartId({ partId }) : Promise.resolve([]),
    getUserById({ userId: part.ownerId }),
    options.comments ? listCommentsForPrint({ partId }) : Promise.resolve(null),
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
        tempo: part.tempo,
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
