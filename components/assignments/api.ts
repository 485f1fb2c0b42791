import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import type { AssignmentDto, AssignmentListDto, CreateAssignmentBody, PatchAssignmentBody } from "@/lib/assignments/schema";
import { ApiError, fetchJson, partUrl } from "@/components/client/fetch-json";
import { assignmentKeys, notificationKeys } from "@/components/client/keys";
import { useCreatingMutation } from "@/components/client/creating-mutation";

export const assignmentsQueryOptions = (partId: string) =>
  queryOptions({ queryKey: assignmentKeys.list(partId), queryFn: () => fetchJson<AssignmentListDto>(`${partUrl(partId)}/assignments`) });

export const useAssignments = (partId: string) => useQuery(assignmentsQueryOptions(partId));

/** The practice as it is now, when the server refused a change made against an older version. */
export function conflictCurrent(error: unknown): AssignmentDto | null {
  if (!(error instanceof ApiError) || !error.isConflict) return null;
  return ((error.body as { current?: AssignmentDto } | undefined)?.current) ?? null;
}

/** Every change re-reads the list, so a refused (stale) change shows the practice as it is now. */
function useAssignmentMutation<V, R>(partId: string, request: (v: V) => Promise<R>) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: request,
    onSettled: () => client.invalidateQueries({ queryKey: assignmentKeys.list(partId) }),
  });
}

export function useCreateAssignment(partId: string) {
  const client = useQueryClient();
  return useCreatingMutation({
    request: (body: CreateAssignmentBody, headers) =>
      fetchJson<AssignmentDto>(`${partUrl(partId)}/assignments`, { method: "POST", body: JSON.stringify(body), headers }),
    onSettled: () => client.invalidateQueries({ queryKey: assignmentKeys.list(partId) }),
  });
}

export const useUpdateAssignment = (partId: string) =>
  useAssignmentMutation(partId, ({ id, ...body }: PatchAssignmentBody & { id: string }) =>
    fetchJson<AssignmentDto>(`${partUrl(partId)}/assignments/${id}`, { method: "PATCH", body: JSON.stringify(body) }),
  );

export const useDeleteAssignment = (partId: string) =>
  useAssignmentMutation(partId, ({ id, version }: { id: string; version: number }) =>
    fetchJson<{ deleted: true }>(`${partUrl(partId)}/assignments/${id}?version=${version}`, { method: "DELETE" }),
  );

/** The player has seen the practice page: its practice notifications are read. */
export function useReadAssignmentNotifications(partId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: () => fetchJson<{ updated: number }>(`/api/notifications/read`, { method: "POST", body: JSON.stringify({ partId, kind: "assignment" }) }),
    onSuccess: (r) => {
      if (r.updated > 0) client.invalidateQueries({ queryKey: notificationKeys.all });
    },
  });
}
