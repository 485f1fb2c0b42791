import { queryOptions, useQuery } from "@tanstack/react-query";
import type { MarkingDto } from "@/lib/markings/schema";
import { fetchJson, partUrl } from "@/components/client/fetch-json";
import { markingKeys } from "@/components/client/keys";

export interface MarkingList {
  markings: MarkingDto[];
}

export const getMarkings = (partId: string) => fetchJson<MarkingList>(`${partUrl(partId)}/markings`);

export const markingsQueryOptions = (partId: string) =>
  queryOptions({ queryKey: markingKeys.list(partId), queryFn: () => getMarkings(partId) });

export const useMarkings = (partId: string) => useQuery(markingsQueryOptions(partId));
