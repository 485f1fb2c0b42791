import { workingTempoOf } from "@/lib/parts/working-tempo";
import type { Metadata, Viewport } from "next";
import { resolutionsOf } from "@/lib/markings/durations";
import { selectPartsXml } from "@/lib/musicxml";
import { chosenPartAnalysis, loadPartForPage, partTitleForViewer } from "@/lib/server/parts";
import { listMarkingsByPartId } from "@/db/markings";
import { StandView } from "@/components/stand-view/stand-view";

export const dynamic = "force-dynamic";

export async function generateMetadata({ params }: { params: Promise<{ partId: string }> }): Promise<Metadata> {
  const { partId } = await params;
  const title = await partTitleForViewer(partId);
  return { title: title ? `${title} — stand view` : "Stand view" };
}

/** The stand fills the tablet: no pinch-zoom fighting the page turns, the page drawn under the notch. */
export const viewport: Viewport = { width: "device-width", initialScale: 1, viewportFit: "cover" };

/**
 * The stand view: the marked part, read-only, a screenful at a time. Everything it shows travels
 * inside the page (the service worker keeps the page, so it opens again without a network).
 */
export default async function StandViewPage({ params }: { params: Promise<{ partId: string }> }) {
  const { partId } = await params;
  const { access } = await loadPartForPage({ partId, action: "part:view", path: `/parts/${partId}/stand` });
  const { part } = access;
  const [markings, analysis] = await Promise.all([listMarkingsByPartId({ partId }), chosenPartAnalysis(part)]);
  return (
    <StandView
      data={{
        partId,
        title: part.title,
        composer: part.composer,
        tempo: workingTempoOf(part),
        xml: selectPartsXml(part.musicxml, [part.chosenPartId]),
        markings,
        notes: analysis.notes.map(({ key, duration }) => ({ key, duration })),
        resolutions: resolutionsOf(analysis.suggestions),
        asOf: new Date().toISOString(),
      }}
    />
  );
}
