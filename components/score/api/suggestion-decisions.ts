"use client";

import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import type { Role } from "@/lib/analysis/types";
import { fetchJson, partUrl, retryDelay, retryTransient } from "@/components/client/fetch-json";
import { decisionKeys } from "@/components/client/keys";

export interface SuggestionDecision {
  noteKey: string;
  role: Role;
  decision: "accepted" | "dismissed";
}

export const getDecisions = (partId: string) =>
  fetchJson<{ decisions: SuggestionDecision[] }>(`${partUrl(partId)}/suggestions/decisions`);

export const postDecision = (partId: string, decision: SuggestionDecision) =>
  fetchJson<unknown>(`${partUrl(partId)}/suggestions/decisions`, { method: "POST", body: JSON.stringify(decision) });

export const decisionsQueryOptions = (partId: string) =>
  queryOptions({ queryKey: decisionKeys.list(partId), queryFn: () => getDecisions(partId) });

export const useDecisions = (partId: string) => useQuery(decisionsQueryOptions(partId));

/** Records accept/dismiss; optimistic, rolled back on error, refetched when settled. */
export function useDecide(partId: string) {
  const client = useQueryClient();
  const key = decisionKeys.list(partId);
  return useMutation({
    mutationKey: [...key, "post"],
    retry: retryTransient,
    retryDelay,
    mutationFn: (decision: SuggestionDecision) => postDecision(partId, decision),
    onMutate: async (decision) => {
      await client.cancelQueries({ queryKey: key });
      const previous = client.getQueryData<{ decisions: SuggestionDecision[] }>(key);
      client.setQueryData<{ decisions: SuggestionDecision[] }>(key, (old) => ({
        decisions: [
          ...(old?.decisions ?? []).filter((d) => !(d.noteKey === decision.noteKey && d.role === decision.role)),
          decision,
        ],
      }));
      return { previous };
    },
    onError: (_error, _decision, context) => {
      if (context?.previous) client.setQueryData(key, context.previous);
    },
    onSettled: () => {
      if (client.isMutating({ mutationKey: [...key, "post"] }) === 1) return client.invalidateQueries({ queryKey: key });
    },
  });
}
