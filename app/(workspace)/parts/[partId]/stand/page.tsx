import type { Metadata, Viewport } from "next";
import { partTitleForViewer } from "@/server/parts";
import { loadStandView } from "@/server/stand-view";
import { StandView } from "@/components/stand-view/stand-view";

export const dynamic = "force-dynamic";

export async function generateMetadata({ params }: { params: Promise<{ partId: string }> }): Promise<Metadata> {
  const { partId } = await params;
  const title = await partTitleForViewer(partId);
  return { title: title ? `${title} — stand view` : "Stand view" };
}

/** The stand fills the tablet, drawn under a notch too. */
export const viewport: Viewport = { width: "device-width", initialScale: 1, viewportFit: "cover" };

/**
 * The stand view: the marked part, read-only, a screenful at a time. Everything it shows travels
 * inside the page (the service worker keeps the page, so it opens again without a network).
 */
export default async function StandViewPage({ params }: { params: Promise<{ partId: string }> }) {
  const { partId } = await params;
  return <StandView data={await loadStandView({ partId, path: `/parts/${partId}/stand` })} />;
}
