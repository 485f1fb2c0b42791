import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import type { PracticeEntryBody, PracticeEntryDto, PracticeLogDto, TakeBody, TakeDto } from "@/lib/practice/schema";
import { fetchJson, partUrl } from "@/components/client/fetch-json";
import { practiceKeys } from "@/components/client/keys";


export const practiceLogQueryOptions = (partId: string) =>
  queryOptions({ queryKey: practiceKeys.log(partId), queryFn: () => fetchJson<PracticeLogDto>(`${partUrl(partId)}/practice`) });

export const takesQueryOptions = (partId: string) =>
  queryOptions({ queryKey: practiceKeys.takes(partId), queryFn: () => fetchJson<{ takes: TakeDto[] }>(`${partUrl(partId)}/takes`) });

export const usePracticeLog = (partId: string) => useQuery(practiceLogQueryOptions(partId));
export const useTakes = (partId: string) => useQuery(takesQueryOptions(partId));

export function useAddPracticeEntry(partId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: PracticeEntryBody) =>
      fetchJson<{ entry: PracticeEntryDto }>(`${partUrl(partId)}/practice`, { method: "POST", body: JSON.stringify(body) }),
    onSettled: () => client.invalidateQueries({ queryKey: practiceKeys.log(partId) }),
  });
}

export function useSaveTake(partId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: TakeBody) => fetchJson<{ take: TakeDto }>(`${partUrl(partId)}/takes`, { method: "POST", body: JSON.stringify(body) }),
    onSettled: () => client.invalidateQueries({ queryKey: practiceKeys.takes(partId) }),
  });
}
