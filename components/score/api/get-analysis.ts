import { queryOptions, useQuery } from "@tanstack/react-query";
import type { PartAnalysis } from "@/lib/analysis/types";
import { fetchJson, partUrl } from "@/components/client/fetch-json";
import { partKeys } from "@/components/client/keys";

export const getAnalysis = async (partId: string) => {
  const analysis = await fetchJson<PartAnalysis>(`${partUrl(partId)}/analysis`);
  // The benchmark splits the workspace's load into stages by these marks.
  if (typeof performance !== "undefined") performance.mark("ondula:analysis");
  return analysis;
};

export const analysisQueryOptions = (partId: string) =>
  queryOptions({ queryKey: partKeys.analysis(partId), queryFn: () => getAnalysis(partId), staleTime: 5 * 60_000 });

/** `enabled: false` holds the request back (the workspace asks once the score is drawn). */
export const useAnalysis = (partId: string, { enabled = true } = {}) => useQuery({ ...analysisQueryOptions(partId), enabled });
