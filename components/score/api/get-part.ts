import { queryOptions, useQuery } from "@tanstack/react-query";
import { fetchJson, partUrl } from "@/components/client/fetch-json";
import { partKeys } from "@/components/client/keys";

export type Permission = "owner" | "comment" | "propose";

export interface PartDetail {
  id: string;
  title: string;
  composer: string;
  keyLabel: string;
  /** The working tempo (the player's, else the part's own); null when neither exists. */
  tempo: number | null;
  writtenTempo: number | null;
  workingTempo: number | null;
  chosenPartId: string;
  /** Whose line of a two-player staff the analysis, practice and playback follow. */
  line: "upper" | "lower";
  parts: { id: string; name: string }[];
  measureCount: number;
  noteCount: number;
  version: number;
  updatedAt: string;
  permission: Permission;
}

export const getPart = (partId: string) => fetchJson<PartDetail>(partUrl(partId));

export const partQueryOptions = (partId: string) =>
  queryOptions({ queryKey: partKeys.detail(partId), queryFn: () => getPart(partId) });

export const usePart = (partId: string) => useQuery(partQueryOptions(partId));
