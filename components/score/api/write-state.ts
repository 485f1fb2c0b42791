"use client";

/**
 * What the part's write queue learnt from the server — refused writes (conflicts), the versions
 * it confirmed, the last error — kept in the query cache beside the markings, under client-only
 * keys that are never fetched. The editor store holds only the editor's own state.
 */
import { useQuery, type QueryClient } from "@tanstack/react-query";
import type { MarkingDto, MarkingValues } from "@/lib/markings/schema";
import { markingKeys } from "@/components/client/keys";

/** A write the server refused because someone changed the note first. */
export interface Conflict {
  noteKey: string;
  /** What I meant to write; null when I meant to clear the marking. */
  mine: MarkingValues | null;
  /** The marking on the server now; null when it was cleared there. */
  current: MarkingDto | null;
}

// Kept while the part is open: these entries have no server to be fetched again from.
const LOCAL = { staleTime: Infinity, gcTime: Infinity } as const;

function local<T>(client: QueryClient, key: readonly unknown[], initial: () => T): T {
  client.setQueryDefaults(key, LOCAL);
  const value = client.getQueryData<T>(key);
  if (value !== undefined) return value;
  const fresh = initial();
  client.setQueryData(key, fresh);
  return fresh;
}

export function conflictsOf(client: QueryClient, partId: string): Conflict[] {
  return client.getQueryData<Conflict[]>(markingKeys.conflicts(partId)) ?? [];
}

function setConflicts(client: QueryClient, partId: string, update: (list: Conflict[]) => Conflict[]) {
  client.setQueryDefaults(markingKeys.conflicts(partId), LOCAL);
  client.setQueryData<Conflict[]>(markingKeys.conflicts(partId), update(conflictsOf(client, partId)));
}

/** One conflict per note: a newer refusal replaces the older one. */
export function addConflict(client: QueryClient, partId: string, conflict: Conflict): void {
  setConflicts(client, partId, (list) => [...list.filter((c) => c.noteKey !== conflict.noteKey), conflict]);
}

export function updateConflictMine(client: QueryClient, partId: string, noteKey: string, mine: MarkingValues | null): void {
  setConflicts(client, partId, (list) => list.map((c) => (c.noteKey === noteKey ? { ...c, mine } : c)));
}

export function resolveConflict(client: QueryClient, partId: string, noteKey: string): void {
  setConflicts(client, partId, (list) => list.filter((c) => c.noteKey !== noteKey));
}

export function useConflicts(client: QueryClient, partId: string): Conflict[] {
  return useQuery({ queryKey: markingKeys.conflicts(partId), queryFn: () => conflictsOf(client, partId), initialData: () => conflictsOf(client, partId), ...LOCAL }).data;
}

/**
 * The version the server last confirmed for each note written while the part is open (null:
 * deleted there). Not reactive: the write queue reads it when a request leaves, because the
 * optimistic cache may no longer hold the note (cleared) while an earlier write for it is in flight.
 */
export function serverVersions(client: QueryClient, partId: string): Map<string, number | null> {
  return local(client, markingKeys.versions(partId), () => new Map<string, number | null>());
}

export function setSaveError(client: QueryClient, partId: string, error: string | null): void {
  client.setQueryDefaults(markingKeys.saveError(partId), LOCAL);
  client.setQueryData<string | null>(markingKeys.saveError(partId), error);
}

export function saveErrorOf(client: QueryClient, partId: string): string | null {
  return client.getQueryData<string | null>(markingKeys.saveError(partId)) ?? null;
}

export function useSaveError(client: QueryClient, partId: string): string | null {
  return useQuery({ queryKey: markingKeys.saveError(partId), queryFn: () => saveErrorOf(client, partId), initialData: () => saveErrorOf(client, partId), ...LOCAL }).data;
}
