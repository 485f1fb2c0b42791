import type { QueryClient } from "@tanstack/react-query";
import type { MarkingDto } from "@/lib/markings/schema";
import type { MarkingList } from "./get-markings";
import { markingKeys } from "@/components/client/keys";

/** Reads and writes single notes of the cached marking list (the optimistic view). */
export function cachedMarkings(client: QueryClient, partId: string): MarkingDto[] {
  return client.getQueryData<MarkingList>(markingKeys.list(partId))?.markings ?? [];
}

export function cachedMarking(client: QueryClient, partId: string, noteKey: string): MarkingDto | undefined {
  return cachedMarkings(client, partId).find((m) => m.noteKey === noteKey);
}

/** Puts `marking` in place of the note's entry (or removes the entry when null). */
export function writeCachedMarking(client: QueryClient, partId: string, noteKey: string, marking: MarkingDto | null): void {
  client.setQueryData<MarkingList>(markingKeys.list(partId), (old) => {
    const list = old?.markings ?? [];
    const rest = list.filter((m) => m.noteKey !== noteKey);
    if (!marking) return { markings: rest };
    const at = list.findIndex((m) => m.noteKey === noteKey);
    if (at < 0) return { markings: [...list, marking] };
    const next = [...list];
    next[at] = marking;
    return { markings: next };
  });
}

export function writeCachedMarkings(client: QueryClient, partId: string, markings: MarkingDto[]): void {
  client.setQueryData<MarkingList>(markingKeys.list(partId), { markings });
}
