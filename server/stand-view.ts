import "server-only";
import { resolutionsOf } from "@/lib/markings/durations";
import { selectPartsXml } from "@/lib/musicxml";
import { workingTempoOf } from "@/lib/parts/working-tempo";
import { listMarkingsByPartId } from "@/db/markings";
import { chosenPartAnalysis, loadPartForPage } from "./parts";

/**
 * The stand view: the part's text, its markings and what the glyphs need (durations, tension
 * arcs), all inside the page, so the kept page opens again without a network.
 */
export async function loadStandView({ partId, path }: { partId: string; path: string }) {
  const { access } = await loadPartForPage({ partId, action: "part:view", path });
  const { part } = access;
  const [markings, analysis] = await Promise.all([listMarkingsByPartId({ partId }), chosenPartAnalysis(part)]);
  return {
    partId,
    title: part.title,
    composer: part.composer,
    tempo: workingTempoOf(part),
    xml: selectPartsXml(part.musicxml, [part.chosenPartId]),
    /** The server's note keys: the engraved notes are keyed by them (markings attach to them). */
    noteKeys: part.noteKeys,
    markings,
    notes: analysis.notes.map(({ key, duration }) => ({ key, duration })),
    resolutions: resolutionsOf(analysis.suggestions),
    asOf: new Date().toISOString(),
  };
}
