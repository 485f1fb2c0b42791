"use client";

import { useMemo } from "react";
import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "@/components/library/api";
import type { MarkingDto, MarkingValues } from "@/lib/markings/schema";
import type { CommentDto, NotificationDto, ProposalWithCurrent, ShareDto, SharePermission, ThreadDto, ThreadMarker } from "@/lib/sharing/dto";
import type { StudentGroup } from "@/lib/sharing/attention";

export type { SharePermission } from "@/lib/sharing/dto";
export type ShareItem = ShareDto;
export type CommentItem = CommentDto;
export type Thread = ThreadDto;
export type ThreadSummary = ThreadMarker;
export type ProposalItem = ProposalWithCurrent;
export type NotificationItem = NotificationDto & { url: string };

export interface NotificationsPage {
  unread: number;
  parts: { partId: string; unread: number }[];
  items: NotificationItem[];
}

/** Query keys of the sharing area, one factory so invalidation stays precise. */
export const sharingKeys = {
  shares: (partId: string) => ["sharing", partId, "shares"] as const,
  part: (partId: string) => ["sharing", partId] as const,
  thread: (partId: string, threadKey: string) => ["sharing", partId, "thread", threadKey] as const,
  summary: (partId: string) => ["sharing", partId, "summary"] as const,
  proposals: (partId: string) => ["sharing", partId, "proposals"] as const,
  notifications: (partId?: string) => ["notifications", partId ?? "all"] as const,
  allNotifications: ["notifications"] as const,
  sharedWithMe: ["shared-parts"] as const,
};

const send = (method: string, body?: unknown): RequestInit => ({
  method,
  headers: body === undefined ? undefined : { "content-type": "application/json" },
  body: body === undefined ? undefined : JSON.stringify(body),
});

// ——— shares (owner) ———

export function useShares(partId: string, enabled = true) {
  return useQuery({
    queryKey: sharingKeys.shares(partId),
    queryFn: () => apiFetch<{ shares: ShareItem[] }>(`/api/parts/${partId}/shares`),
    enabled,
  });
}

function useShareMutation<V, R>(partId: string, request: (v: V) => Promise<R>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: request,
    onSettled: () => {
      qc.invalidateQueries({ queryKey: sharingKeys.shares(partId) });
      qc.invalidateQueries({ queryKey: ["parts"] });
    },
  });
}

export const useInvite = (partId: string) =>
  useShareMutation(partId, (v: { email: string; permission: SharePermission }) => apiFetch<ShareItem>(`/api/parts/${partId}/shares`, send("POST", v)));
export const useResend = (partId: string) =>
  useShareMutation(partId, (shareId: string) => apiFetch<ShareItem>(`/api/parts/${partId}/shares/${shareId}/resend`, send("POST")));
export const useRevoke = (partId: string) =>
  useShareMutation(partId, (shareId: string) => apiFetch(`/api/parts/${partId}/shares/${shareId}`, send("DELETE")));
export const useChangePermission = (partId: string) =>
  useShareMutation(partId, (v: { shareId: string; permission: SharePermission }) =>
    apiFetch<ShareItem>(`/api/parts/${partId}/shares/${v.shareId}`, send("PATCH", { permission: v.permission })),
  );

// ——— comments ———

export const threadOptions = (partId: string, threadKey: string) =>
  queryOptions({
    queryKey: sharingKeys.thread(partId, threadKey),
    queryFn: () => apiFetch<Thread>(`/api/parts/${partId}/comments?thread=${encodeURIComponent(threadKey)}`),
    staleTime: 5_000,
  });

export function useThread(partId: string, threadKey: string) {
  return useQuery(threadOptions(partId, threadKey));
}

export function useCommentSummary(partId: string, { enabled = true } = {}) {
  return useQuery({
    enabled,
    queryKey: sharingKeys.summary(partId),
    queryFn: () => apiFetch<{ threads: ThreadSummary[] }>(`/api/parts/${partId}/comments/summary`),
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
      qc.invalidateQueries({ queryKey: sharingKeys.thread(partId, threadKey) });
      qc.invalidateQueries({ queryKey: sharingKeys.summary(partId) });
    },
  });
}

export const usePostComment = (partId: string, threadKey: string) =>
  useThreadMutation(partId, threadKey, (body: string) =>
    apiFetch<CommentItem>(`/api/parts/${partId}/comments?thread=${encodeURIComponent(threadKey)}`, send("POST", { body })),
  );
export const useEditComment = (partId: string, threadKey: string) =>
  useThreadMutation(partId, threadKey, (v: { commentId: string; body: string }) =>
    apiFetch<CommentItem>(`/api/parts/${partId}/comments/${v.commentId}`, send("PATCH", { body: v.body })),
  );
export const useDeleteComment = (partId: string, threadKey: string) =>
  useThreadMutation(partId, threadKey, (commentId: string) => apiFetch(`/api/parts/${partId}/comments/${commentId}`, send("DELETE")));
export const useResolveThread = (partId: string, threadKey: string) =>
  useThreadMutation(partId, threadKey, (resolved: boolean) =>
    apiFetch<Thread>(`/api/parts/${partId}/threads/resolve`, send("POST", { thread: threadKey, resolved })),
  );

// ——— proposals ———

export function useProposals(partId: string) {
  return useQuery({
    queryKey: sharingKeys.proposals(partId),
    queryFn: () => apiFetch<{ proposals: ProposalItem[] }>(`/api/parts/${partId}/proposals`),
    staleTime: 5_000,
  });
}

/** After a decision the marking, its history and the markers all change. */
function useProposalMutation<V, R>(partId: string, request: (v: V) => Promise<R>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: request,
    onSettled: () => {
      qc.invalidateQueries({ queryKey: sharingKeys.proposals(partId) });
      qc.invalidateQueries({ queryKey: sharingKeys.summary(partId) });
      qc.invalidateQueries({ predicate: (q) => q.queryKey.includes(partId) });
    },
  });
}

export const useCreateProposal = (partId: string) =>
  useProposalMutation(partId, (v: { noteKey: string; baseVersion: number | null; marking: MarkingValues; comment: string }) =>
    apiFetch<ProposalItem>(`/api/parts/${partId}/proposals`, send("POST", v)),
  );
export const useAcceptProposal = (partId: string) =>
  useProposalMutation(partId, (proposalId: string) =>
    apiFetch<{ proposal: ProposalItem; marking: MarkingDto }>(`/api/parts/${partId}/proposals/${proposalId}/accept`, send("POST")),
  );
export const useDeclineProposal = (partId: string) =>
  useProposalMutation(partId, (v: { proposalId: string; reply: string }) =>
    apiFetch<ProposalItem>(`/api/parts/${partId}/proposals/${v.proposalId}/decline`, send("POST", { reply: v.reply })),
  );
export const useWithdrawProposal = (partId: string) =>
  useProposalMutation(partId, (proposalId: string) =>
    apiFetch<ProposalItem>(`/api/parts/${partId}/proposals/${proposalId}/withdraw`, send("POST")),
  );

// ——— notifications ———

export function useNotifications(partId?: string, { enabled = true } = {}) {
  return useQuery({
    enabled,
    queryKey: sharingKeys.notifications(partId),
    queryFn: () => apiFetch<NotificationsPage>(`/api/notifications${partId ? `?partId=${partId}` : ""}`),
    refetchInterval: 30_000,
  });
}

/** Unread counts per part for the viewer (one request for the whole library). */
export function useUnreadByPart(): Record<string, number> {
  const q = useNotifications();
  return Object.fromEntries((q.data?.parts ?? []).map((p) => [p.partId, p.unread]));
}

export function useMarkRead() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (v: { partId: string; thread?: string }) => apiFetch<{ updated: number }>(`/api/notifications/read`, send("POST", v)),
    onSuccess: (r) => {
      if (r.updated > 0) {
        qc.invalidateQueries({ queryKey: sharingKeys.allNotifications });
        qc.invalidateQueries({ queryKey: sharingKeys.sharedWithMe });
      }
    },
  });
}

export function useSharedWithMe() {
  return useQuery({
    queryKey: sharingKeys.sharedWithMe,
    queryFn: () => apiFetch<{ students: StudentGroup[] }>(`/api/shared-parts`),
    refetchInterval: 60_000,
  });
}
