import type { MarkingDto, PutMarkingBody } from "@/lib/markings/schema";
import { fetchJson, partUrl } from "@/components/client/fetch-json";

/** PUT one note's marking; `version` is the one edited (absent for a new marking). 409 on a stale one. */
export function putMarking(partId: string, noteKey: string, body: PutMarkingBody): Promise<{ marking: MarkingDto }> {
  return fetchJson(`${partUrl(partId)}/markings/${encodeURIComponent(noteKey)}`, {
    method: "PUT",
    body: JSON.stringify(body),
  });
}
