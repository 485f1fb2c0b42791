"use client";

import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";

export type { ListedPart } from "@/lib/parts/dto";
import type { ListedPart } from "@/lib/parts/dto";
import type { MarkingImport } from "@/lib/parts/import-report";
import { ApiError, fetchJson, jsonRequest } from "@/components/client/fetch-json";
import { partKeys } from "@/components/client/keys";
import { IDEMPOTENCY_HEADER, newIdempotencyKey, useCreatingMutation } from "@/components/client/creating-mutation";

export interface PartListPage {
  items: ListedPart[];
  total: number;
  page: number;
  pageSize: number;
}

export interface ListParams {
  query: string;
  sort: string;
  page: number;
}

export const partListOptions = (p: ListParams) =>
  queryOptions({
    queryKey: partKeys.list(p),
    queryFn: () => fetchJson<PartListPage>(`/api/parts?${new URLSearchParams({ query: p.query, sort: p.sort, page: String(p.page) })}`),
    placeholderData: keepPreviousData,
  });

export function usePartList(p: ListParams) {
  return useQuery(partListOptions(p));
}

export function useSamples() {
  return useQuery({ queryKey: partKeys.samples(), queryFn: () => fetchJson<{ samples: string[] }>("/api/parts/samples") });
}

export function useRenamePart() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ partId, title }: { partId: string; title: string }) =>
      fetchJson(`/api/parts/${partId}`, jsonRequest("PATCH", { title })),
    onSettled: () => qc.invalidateQueries({ queryKey: partKeys.all }),
  });
}

export function useDeletePart() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (partId: string) => fetchJson(`/api/parts/${partId}`, { method: "DELETE" }),
    onSettled: () => qc.invalidateQueries({ queryKey: partKeys.all }),
  });
}

export function useChoosePart() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ partId, chosenPart }: { partId: string; chosenPart: string }) =>
      fetchJson(`/api/parts/${partId}`, jsonRequest("PATCH", { chosenPart })),
    onSettled: () => qc.invalidateQueries({ queryKey: partKeys.all }),
  });
}

export function useTrySample() {
  const qc = useQueryClient();
  return useCreatingMutation({
    request: (name: string, headers) => fetchJson<UploadResult>("/api/parts/samples", { ...jsonRequest("POST", { name }), headers }),
    onSettled: () => qc.invalidateQueries({ queryKey: partKeys.all }),
  });
}

export interface UploadResult extends MarkingImport {
  id: string;
  url: string;
  parts: { id: string; name: string }[];
  chosenPart: string;
  /** Bars read as written although they disagree with their time signature, in player's words. */
  notices: string[];
}

/** XHR rather than fetch: only XHR reports upload progress. */
export function uploadPart(file: File, onProgress: (fraction: number) => void, onSent: () => void): Promise<UploadResult> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open("POST", "/api/parts");
    // One upload is one action; trying again after an error is a new one.
    xhr.setRequestHeader(IDEMPOTENCY_HEADER, newIdempotencyKey());
    xhr.responseType = "json";
    xhr.upload.onprogress = (e) => e.lengthComputable && onProgress(e.loaded / e.total);
    xhr.upload.onload = () => onSent();
    xhr.onload = () => {
      const body = xhr.response;
      if (xhr.status === 201) resolve(body as UploadResult);
      else reject(ApiError.fromAnswer(xhr.status, body));
    };
    xhr.onerror = () => reject(new ApiError(0, "unavailable:offline", "The upload was interrupted. Check your connection and try again."));
    const form = new FormData();
    form.append("file", file);
    xhr.send(form);
  });
}
