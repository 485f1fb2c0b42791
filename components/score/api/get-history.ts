import { queryOptions, useQuery } from "@tanstack/react-query";
import { fetchJson, partUrl } from "@/components/client/fetch-json";
import { historyKeys } from "@/components/client/keys";

export interface HistoryEntry {
  id: number | string;
  noteKey: string;
  action: "create" | "update" | "delete";
  actorName: string;
  createdAt: string;
  proposalId: string | null;
}

export interface HistoryState {
  canUndo: boolean;
  canRedo: boolean;
  entries: HistoryEntry[];
}

export const getHistory = (partId: string) => fetchJson<HistoryState>(`${partUrl(partId)}/history`);

export const historyQueryOptions = (partId: string) =>
  queryOptions({ queryKey: historyKeys.list(partId), queryFn: () => getHistory(partId) });

export const useHistory = (partId: string, { enabled = true } = {}) => useQuery({ ...historyQueryOptions(partId), enabled });
