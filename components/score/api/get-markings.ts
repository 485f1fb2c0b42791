import { queryOptions, useQuery, type QueryClient } from "@tanstack/react-query";
import type { MarkingDto } from "@/lib/markings/schema";
import { fetchJson, partUrl } from "@/components/client/fetch-json";
import { markingKeys } from "@/components/client/keys";

export interface MarkingList {
  markings: MarkingDto[];
}

export const getMarkings = (partId: string) => fetchJson<MarkingList>(`${partUrl(partId)}/markings`);

/**
 * The fetched list with the notes whose writes are still pending kept as the page shows them: a
 * refetch (on reconnecting, after another write) must not paint an edit that is waiting to be
 * saved as if it had never been made, nor hand its write a version it was not made against.
 */
export function keepPendingEdits(client: QueryClient, partId: string, fetched: MarkingList): MarkingList {
  const pending = new Set(
    client
      .getMutationCache()
      .findAll({ mutationKey: markingKeys.write(partId), status: "pending" })
      .map((m) => (m.state.variables as { noteKey?: string } | undefined)?.noteKey)
      .filter((k): k is string => typeof k === "string"),
  );
  if (pending.size === 0) return fetched;
  const shown = new Map((client.getQueryData<MarkingList>(markingKeys.list(partId))?.markings ?? []).map((m) => [m.noteKey, m]));
  const kept = fetched.markings.filter((m) => !pending.has(m.noteKey));
  for (const key of pending) {
    const entry = shown.get(key);
    if (entry) kept.push(entry);
  }
  return { markings: kept };
}

export const markingsQueryOptions = (partId: string) =>
  queryOptions({
    queryKey: markingKeys.list(partId),
    queryFn: async ({ client }) => keepPendingEdits(client, partId, await getMarkings(partId)),
  });

export const useMarkings = (partId: string) => useQuery(markingsQueryOptions(partId));
