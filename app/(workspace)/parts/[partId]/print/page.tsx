import type { Metadata } from "next";
import { partTitleForViewer } from "@/server/parts";
import { loadStandCopy } from "@/server/stand-copy";
import { parseStandCopyOptions } from "@/lib/stand-copy/options";
import { StandCopy } from "@/components/screens/stand-copy";

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
  const options = parseStandCopyOptions(await searchParams);
  const data = await loadStandCopy({ partId, path: `/parts/${partId}/print`, options });
  return <StandCopy data={data} />;
}
