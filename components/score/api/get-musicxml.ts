import { queryOptions, useQuery } from "@tanstack/react-query";
import { fetchText, partUrl } from "@/components/client/fetch-json";
import { partKeys } from "@/components/client/keys";

/** The normalized MusicXML of the chosen part only (what the engraving draws). */
export const getMusicXml = (partId: string) => fetchText(`${partUrl(partId)}/musicxml`, { headers: { accept: "application/xml, text/xml" } });

export const musicXmlQueryOptions = (partId: string) =>
  queryOptions({ queryKey: partKeys.musicxml(partId), queryFn: () => getMusicXml(partId), staleTime: Infinity });

export const useMusicXml = (partId: string) => useQuery(musicXmlQueryOptions(partId));
