import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import type { PartAnalysis } from "@/lib/analysis/types";
import type { Line } from "@/lib/musicxml/lines";
import { fetchJson, partUrl } from "@/components/client/fetch-json";
import { partKeys } from "@/components/client/keys";

export const getAnalysis = async (partId: string, line?: Line) => {
  const analysis = await fetchJson<PartAnalysis>(`${partUrl(partId)}/analysis${line ? `?line=${line}` : ""}`);
  // The benchmark splits the workspace's load into stages by these marks.
  if (typeof performance !== "undefined") performance.mark("ondula:analysis");
  return analysis;
};

/** The line is part of the key: switching lines asks for (and keeps) each line's analysis. */
export const analysisQueryOptions = (partId: string, line?: Line) =>
  queryOptions({ queryKey: partKeys.analysis(partId, line ?? "chosen"), queryFn: () => getAnalysis(partId, line), staleTime: 5 * 60_000 });

/**
 * `enabled: false` holds the request back (the workspace asks once the score is drawn); `line`,
 * the player's line of a two-player staff (the stored choice when left out).
 */
export const useAnalysis = (partId: string, { enabled = true, line }: { enabled?: boolean; line?: Line } = {}) =>
  // The other line's analysis shows until this one arrives, so the panels and the line control
  // stay in place while the line changes.
  useQuery({ ...analysisQueryOptions(partId, line), enabled, placeholderData: keepPreviousData });
