import { queryOptions, useQuery } from "@tanstack/react-query";
import { fetchText, musicXmlUrl } from "@/components/client/fetch-json";
import { partKeys } from "@/components/client/keys";

/** The normalized MusicXML of the chosen part only (what the engraving draws). */
export const getMusicXml = (partId: string) => fetchText(musicXmlUrl(partId), { headers: { accept: "application/xml, text/xml" } });

export const musicXmlQueryOptions = (partId: string) =>
  queryOptions({ queryKey: partKeys.musicxml(partId), queryFn: () => getMusicXml(partId), staleTime: Infinity });

/** `enabled: false` holds the request back (a long part's whole text, until its opening is drawn). */
export const useMusicXml = (partId: string, { enabled = true }: { enabled?: boolean } = {}) => useQuery({ ...musicXmlQueryOptions(partId), enabled });
