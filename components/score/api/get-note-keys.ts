import { queryOptions, useQuery } from "@tanstack/react-query";
import { fetchJson, partUrl } from "@/components/client/fetch-json";
import { partKeys } from "@/components/client/keys";

/** The chosen part's note keys as the server keys them (the page keys its drawn notes by them). */
export const getNoteKeys = (partId: string) => fetchJson<{ keys: string[] }>(`${partUrl(partId)}/note-keys`);

export const noteKeysQueryOptions = (partId: string) =>
  queryOptions({ queryKey: partKeys.noteKeys(partId), queryFn: () => getNoteKeys(partId), staleTime: Infinity });

/** `enabled: false` holds the request back (a long part's whole list, fetched with its whole text). */
export const useNoteKeys = (partId: string, { enabled = true }: { enabled?: boolean } = {}) => useQuery({ ...noteKeysQueryOptions(partId), enabled });
