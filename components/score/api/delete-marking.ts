import { fetchJson, partUrl } from "@/components/client/fetch-json";

/** DELETE one note's marking at the version the player saw. 409 on a stale one. */
export function deleteMarking(partId: string, noteKey: string, version: number, group?: string): Promise<{ noteKey: string; deleted: true }> {
  const query = new URLSearchParams({ version: String(version) });
  if (group) query.set("group", group);
  return fetchJson(`${partUrl(partId)}/markings/${encodeURIComponent(noteKey)}?${query}`, { method: "DELETE" });
}
