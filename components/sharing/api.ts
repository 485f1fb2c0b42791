"use client";

import { useMemo } from "react";
import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { fetchJson, jsonRequest as send } from "@/components/client/fetch-json";
import { useCreatingMutation } from "@/components/client/creating-mutation";
import { commentKeys, partKeys, proposalKeys, shareKeys, sharedPartKeys } from "@/components/client/keys";
import type { MarkingDto, MarkingValues } from "@/lib/markings/schema";
import type { CommentDto, ProposalWithCurrent, ShareDto, SharePermission, ThreadDto, ThreadMarker } from "@/lib/sharing/dto";
import type { StudentGroup } from "@/lib/sharing/attention";

export type { SharePermission } from "@/lib/sharing/dto";
export type ShareItem = ShareDto;
export type CommentItem = CommentDto;
export type Thread = ThreadDto;
export type ThreadSummary = ThreadMarker;
export type ProposalItem = ProposalWithCurrent;




// ——— shares (owner) ———

export function useShares(partId: string, enabled = true) {
  return useQuery({
    queryKey: shareKeys.list(partId),
    queryFn: () => fetchJson<{ shares: ShareItem[] }>(`/api/parts/${partId}/shares`),
    enabled,
  });
}

function useShareMutation<V, R>(partId: string, request: (v: V) => Promise<R>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: request,
    onSettled: () => {
      qc.invalidateQueries({ queryKey: shareKeys.list(partId) });
      qc.invalidateQueries({ queryKey: partKeys.lists() });
    },
  });
}

export function useInvite(partId: string) {
  const qc = useQueryClient();
  return useCreatingMutation({
    request: (v: { email: string; permission: SharePermission }, headers) =>
      fetchJson<ShareItem>(`/api/parts/${partId}/shares`, { ...send("POST", v), headers }),
    onSettled: () => {
      qc.invalidateQueries({ queryKey: shareKeys.list(partId) });
      qc.invalidateQueries({ queryKey: partKeys.lists() });
    },
  });
}
export const useResend = (partId: string) =>
  useShareMutation(partId, (shareId: string) => fetchJson<ShareItem>(`/api/parts/${partId}/shares/${shareId}/resend`, send("POST")));
export const useRevoke = (partId: string) =>
  useShareMutation(partId, (shareId: string) => fetchJson(`/api/parts/${partId}/shares/${shareId}`, send("DELETE")));
export const useChangePermission = (partId: string) =>
  useShareMutation(partId, (v: { shareId: string; permission: SharePermission }) =>
    fetchJson<ShareItem>(`/api/parts/${partId}/shares/${v.shareId}`, send("PATCH", { permission: v.permission })),
  );

// ——— comments ———

export const threadOptions = (partId: string, threadKey: string) =>
  queryOptions({
    queryKey: commentKeys.thread(partId, threadKey),
    queryFn: () => fetchJson<Thread>(`/api/parts/${partId}/comments?thread=${encodeURIComponent(threadKey)}`),
    staleTime: 5_000,
  });

export function useThread(partId: string, threadKey: string) {
  return useQuery(threadOptions(partId, threadKey));
}

export function useCommentSummary(partId: string, { enabled = true } = {}) {
  return useQuery({
    enabled,
    queryKey: commentKeys.summary(partId),
    queryFn: () => fetchJson<{ threads: ThreadSummary[] }>(`/api/parts/${partId}/comments/summary`),
    refetchInterval: 60_000,
  });
}

/** Comment and open-proposal counts per note: what the score's comment markers show. */
export function useCommentCounts(partId: string, { enabled = true } = {}): Record<string, number> {
  const threads = useCommentSummary(partId, { enabled }).data?.threads;
  // The same object until the summary changes: the overlay re-places every note when it changes.
  return useMemo(() => {
    const out: Record<string, number> = {};
    for (const t of threads ?? []) {
      const n = (t.unresolved ? t.count : 0) + t.openProposals;
      if (n > 0) out[t.threadKey] = n;
    }
    return out;
  }, [threads]);
}

function useThreadMutation<V, R>(partId: string, threadKey: string, request: (v: V) => Promise<R>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: request,
    onSettled: () => {
      qc.invalidateQueries({ queryKey: commentKeys.thread(partId, threadKey) });
      qc.invalidateQueries({ queryKey: commentKeys.summary(partId) });
    },
  });
}

export function usePostComment(partId: string, threadKey: string) {
  const qc = useQueryClient();
  return useCreatingMutation({
    request: (body: string, headers) =>
      fetchJson<CommentItem>(`/api/parts/${partId}/comments?thread=${encodeURIComponent(threadKey)}`, { ...send("POST", { body }), headers }),
    onSettled: () => {
      qc.invalidateQueries({ queryKey: commentKeys.thread(partId, threadKey) });
      qc.invalidateQueries({ queryKey: commentKeys.summary(partId) });
    },
  });
}
export const useEditComment = (partId: string, threadKey: string) =>
  useThreadMutation(partId, threadKey, (v: { commentId: string; body: string }) =>
    fetchJson<CommentItem>(`/api/parts/${partId}/comments/${v.commentId}`, send("PATCH", { body: v.body })),
  );
export const useDeleteComment = (partId: string, threadKey: string) =>
  useThreadMutation(partId, threadKey, (commentId: string) => fetchJson(`/api/parts/${partId}/comments/${commentId}`, send("DELETE")));
export const useResolveThread = (partId: string, threadKey: string) =>
  useThreadMutation(partId, threadKey, (resolved: boolean) =>
    fetchJson<Thread>(`/api/parts/${partId}/threads/resolve`, send("POST", { thread: threadKey, resolved })),
  );

// ——— proposals ———

export function useProposals(partId: string) {
  return useQuery({
    queryKey: proposalKeys.list(partId),
    queryFn: () => fetchJson<{ proposals: ProposalItem[] }>(`/api/parts/${partId}/proposals`),
    staleTime: 5_000,
  });
}

/** After a decision the marking, its history and the markers all change. */
function useProposalMutation<V, R>(partId: string, request: (v: V) => Promise<R>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: request,
    onSettled: () => {
      qc.invalidateQueries({ queryKey: proposalKeys.list(partId) });
      qc.invalidateQueries({ queryKey: commentKeys.summary(partId) });
      qc.invalidateQueries({ predicate: (q) => q.queryKey.includes(partId) });
    },
  });
}

export function useCreateProposal(partId: string) {
  const qc = useQueryClient();
  return useCreatingMutation({
    request: (v: { noteKey: string; baseVersion: number | null; marking: MarkingValues; comment: string }, headers) =>
      fetchJson<ProposalItem>(`/api/parts/${partId}/proposals`, { ...send("POST", v), headers }),
    onSettled: () => {
      qc.invalidateQueries({ queryKey: proposalKeys.list(partId) });
      qc.invalidateQueries({ queryKey: commentKeys.summary(partId) });
      qc.invalidateQueries({ predicate: (q) => q.queryKey.includes(partId) });
    },
  });
}
export const useAcceptProposal = (partId: string) =>
  useProposalMutation(partId, (proposalId: string) =>
    fetchJson<{ proposal: ProposalItem; marking: MarkingDto }>(`/api/parts/${partId}/proposals/${proposalId}/accept`, send("POST")),
  );
export const useDeclineProposal = (partId: string) =>
  useProposalMutation(partId, (v: { proposalId: string; reply: string }) =>
    fetchJson<ProposalItem>(`/api/parts/${partId}/proposals/${v.proposalId}/decline`, send("POST", { reply: v.reply })),
  );
export const useWithdrawProposal = (partId: string) =>
  useProposalMutation(partId, (proposalId: string) =>
    fetchJson<ProposalItem>(`/api/parts/${partId}/proposals/${proposalId}/withdraw`, send("POST")),
  );

export function useSharedWithMe() {
  return useQuery({
    queryKey: sharedPartKeys.all,
    queryFn: () => fetchJson<{ students: StudentGroup[] }>(`/api/shared-parts`),
    refetchInterval: 60_000,
  });
}
