import { queryOptions, useQuery } from "@tanstack/react-query";
import { fetchJson, partUrl } from "@/components/client/fetch-json";
import { partKeys } from "@/components/client/keys";

export type Permission = "owner" | "comment" | "propose";

export interface PartDetail {
  id: string;
  title: string;
  composer: string;
  keyLabel: string;
  tempo: number | null;
  chosenPartId: string;
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
