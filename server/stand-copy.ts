import "server-only";
import { workingTempoOf } from "@/lib/parts/working-tempo";
import { toState } from "@/lib/markings/changes";
import { resolutionsOf } from "@/lib/markings/durations";
import { pendingSuggestions } from "@/lib/markings/suggestions";
import { selectPartsXml } from "@/lib/musicxml";
import type { StandCopyOptions } from "@/lib/stand-copy/options";
import { listCommentsByPartId } from "@/db/comments";
import { listMarkingsByPartId } from "@/db/markings";
import { listDecisionsByPartId } from "@/db/suggestion-decisions";
import { getUserById } from "@/db/users";
import { barsOfPart, chosenPartAnalysis, loadPartForPage } from "./parts";

/** The stand copy: the engraved part with its markings, legend and table, with what `options` asks for. */
export async function loadStandCopy({ partId, path, options }: { partId: string; path: string; options: StandCopyOptions }) {
  const { access } = await loadPartForPage({ partId, action: "part:view", path });
  const { part } = access;
  const [markings, analysis, decisions, owner, comments] = await Promise.all([
    listMarkingsByPartId({ partId }),
    chosenPartAnalysis(part),
    options.suggestions ? listDecisionsByPartId({ partId }) : Promise.resolve([]),
    getUserById({ userId: part.ownerId }),
    options.comments ? listCommentsByPartId({ partId }) : Promise.resolve(null),
  ]);
  return {
    partId,
    title: part.title,
    composer: part.composer,
    keyLabel: part.keyLabel,
    tempo: workingTempoOf(part),
    playerName: owner?.name ?? "",
    xml: selectPartsXml(part.musicxml, [part.chosenPartId]),
    /** The server's note keys: the engraved notes are keyed by them (markings attach to them). */
    noteKeys: part.noteKeys,
    markings,
    notes: analysis.notes,
    /** The part's bars as written, to name them as the part does. */
    bars: barsOfPart(part),
    suggestions: options.suggestions ? pendingSuggestions(analysis.suggestions, decisions, toState(markings)) : [],
    resolutions: resolutionsOf(analysis.suggestions),
    comments: comments?.map(({ threadKey, authorName, body, createdAt }) => ({ threadKey, authorName, body, createdAt })) ?? null,
    options,
  };
}
