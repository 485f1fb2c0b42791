"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { Line } from "@/lib/musicxml/lines";
import { fetchJson, jsonRequest, partUrl } from "@/components/client/fetch-json";
import { partKeys } from "@/components/client/keys";
import type { PartDetail } from "./get-part";

/**
 * Stores the player's line. The part's cache takes the answer at once, so the workspace asks for
 * that line's analysis (its own query key) while the server already follows it.
 */
export function useSetLine(partId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (line: Line) => fetchJson<PartDetail>(partUrl(partId), jsonRequest("PATCH", { line })),
    onSuccess: (part) => {
      queryClient.setQueryData(partKeys.detail(partId), part);
      // The practice page and anything else asking for "the player's line" asks again.
      void queryClient.invalidateQueries({ queryKey: partKeys.analysis(partId, "chosen") });
    },
  });
}
