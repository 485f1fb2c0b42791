import { queryOptions, useQuery } from "@tanstack/react-query";
import { fetchText, musicXmlUrl } from "@/components/client/fetch-json";
import { partKeys } from "@/components/client/keys";

/**
 * The normalized MusicXML of the chosen part only (what the engraving draws). Sent without headers
 * of its own, so the request the workspace page preloads from its head (same address, CORS mode,
 * same-origin credentials) is the one this takes up.
 */
export const getMusicXml = (partId: string) => fetchText(musicXmlUrl(partId));

export const musicXmlQueryOptions = (partId: string) =>
  queryOptions({ queryKey: partKeys.musicxml(partId), queryFn: () => getMusicXml(partId), staleTime: Infinity });

export const useMusicXml = (partId: string) => useQuery(musicXmlQueryOptions(partId));
