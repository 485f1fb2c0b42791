"use client";

import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";

export type { ListedPart } from "@/lib/parts/dto";
import type { ListedPart } from "@/lib/parts/dto";
import type { MarkingImport } from "@/lib/parts/import-report";

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

/** An error from our API: `{ code, message, field? }`. */
export class ApiError extends Error {
  constructor(readonly status: number, readonly code: string, message: string, readonly field?: string, readonly body?: unknown) {
    super(message);
  }
}

export async function apiFetch<T>(input: string, init?: RequestInit): Promise<T> {
  let res: Response;
  try {
    res = await fetch(input, { ...init, headers: { accept: "application/json", ...(init?.headers ?? {}) } });
  } catch {
    throw new ApiError(0, "unavailable:offline", "Ondula cannot be reached. Check your connection; nothing was lost.");
  }
  const body = await res.json().catch(() => null);
  if (!res.ok) {
    throw new ApiError(res.status, body?.code ?? "unavailable:server", body?.message ?? `The server answered ${res.status}.`, body?.field, body);
  }
  return body as T;
}

export const partKeys = {
  all: ["parts"] as const,
  list: (p: ListParams) => ["parts", "list", p] as const,
  detail: (partId: string) => ["parts", "detail", partId] as const,
  samples: () => ["parts", "samples"] as const,
};

export const partListOptions = (p: ListParams) =>
  queryOptions({
    queryKey: partKeys.list(p),
    queryFn: () => apiFetch<PartListPage>(`/api/parts?${new URLSearchParams({ query: p.query, sort: p.sort, page: String(p.page) })}`),
    placeholderData: keepPreviousData,
  });

export function usePartList(p: ListParams) {
  return useQuery(partListOptions(p));
}

export function useSamples() {
  return useQuery({ queryKey: partKeys.samples(), queryFn: () => apiFetch<{ samples: string[] }>("/api/parts/samples") });
}

export function useRenamePart() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ partId, title }: { partId: string; title: string }) =>
      apiFetch(`/api/parts/${partId}`, { method: "PATCH", headers: { "content-type": "application/json" }, body: JSON.stringify({ title }) }),
    onSettled: () => qc.invalidateQueries({ queryKey: partKeys.all }),
  });
}

export function useDeletePart() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (partId: string) => apiFetch(`/api/parts/${partId}`, { method: "DELETE" }),
    onSettled: () => qc.invalidateQueries({ queryKey: partKeys.all }),
  });
}

export function useChoosePart() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ partId, chosenPart }: { partId: string; chosenPart: string }) =>
      apiFetch(`/api/parts/${partId}`, { method: "PATCH", headers: { "content-type": "application/json" }, body: JSON.stringify({ chosenPart }) }),
    onSettled: () => qc.invalidateQueries({ queryKey: partKeys.all }),
  });
}

export function useTrySample() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (name: string) =>
      apiFetch<UploadResult>("/api/parts/samples", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ name }) }),
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
    xhr.responseType = "json";
    xhr.upload.onprogress = (e) => e.lengthComputable && onProgress(e.loaded / e.total);
    xhr.upload.onload = () => onSent();
    xhr.onload = () => {
      const body = xhr.response;
      if (xhr.status === 201) resolve(body as UploadResult);
      else reject(new ApiError(xhr.status, body?.code ?? "unavailable:server", body?.message ?? `The server answered ${xhr.status}.`));
    };
    xhr.onerror = () => reject(new ApiError(0, "unavailable:offline", "The upload was interrupted. Check your connection and try again."));
    const form = new FormData();
    form.append("file", file);
    xhr.send(form);
  });
}
