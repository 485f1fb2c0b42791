"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import type { NotificationDto } from "@/lib/sharing/dto";
import { fetchJson, jsonRequest } from "./fetch-json";
import { notificationKeys, sharedPartKeys } from "./keys";

export type NotificationItem = NotificationDto & { url: string };

export interface NotificationsPage {
  unread: number;
  parts: { partId: string; unread: number }[];
  items: NotificationItem[];
}

/** The viewer's notifications (of one part, or all); read by the header, the library and the workspace. */
export function useNotifications(partId?: string, { enabled = true } = {}) {
  return useQuery({
    enabled,
    queryKey: notificationKeys.list(partId),
    queryFn: () => fetchJson<NotificationsPage>(`/api/notifications${partId ? `?partId=${partId}` : ""}`),
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
    mutationFn: (v: { partId: string; thread?: string }) => fetchJson<{ updated: number }>(`/api/notifications/read`, jsonRequest("POST", v)),
    onSuccess: (r) => {
      if (r.updated > 0) {
        qc.invalidateQueries({ queryKey: notificationKeys.all });
        qc.invalidateQueries({ queryKey: sharedPartKeys.all });
      }
    },
  });
}
