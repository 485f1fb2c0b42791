import type { MarkingDto, MarkingValues } from "@/lib/markings/schema";

/** Shapes the sharing routes send, shared by the data layer and the browser. */

export type SharePermission = "comment" | "propose";
export type ShareStatus = "pending" | "accepted" | "expired";

export interface ShareDto {
  id: string;
  email: string;
  permission: SharePermission;
  status: ShareStatus;
  userName: string | null;
  acceptedAt: string | null;
  expiresAt: string;
  lastSentAt: string;
  createdAt: string;
}

export interface CommentDto {
  id: string;
  threadKey: string;
  authorId: string;
  authorName: string;
  body: string;
  createdAt: string;
  updatedAt: string;
  edited: boolean;
}

export interface ThreadDto {
  threadKey: string;
  resolved: boolean;
  resolvedAt: string | null;
  resolvedByName: string | null;
  comments: CommentDto[];
}

export interface ThreadSummary {
  threadKey: string;
  count: number;
  unresolved: boolean;
}

/** What the score's comment markers draw: a thread's counts and the note's open proposals. */
export interface ThreadMarker extends ThreadSummary {
  openProposals: number;
}

/** `withdrawn`: its author took it back before the owner decided. */
export type ProposalStatus = "open" | "accepted" | "declined" | "stale" | "withdrawn";

export interface ProposalDto {
  id: string;
  noteKey: string;
  authorId: string;
  authorName: string;
  baseVersion: number | null;
  proposed: MarkingValues;
  comment: string;
  status: ProposalStatus;
  reply: string | null;
  decidedAt: string | null;
  createdAt: string;
}

/** A proposal as the owner compares it: with the note's marking now, and whether that moved on. */
export interface ProposalWithCurrent extends ProposalDto {
  current: MarkingDto | null;
  stale: boolean;
}

export interface NotificationDto {
  id: string;
  partId: string;
  kind: string;
  threadKey: string | null;
  actorName: string | null;
  summary: string;
  read: boolean;
  createdAt: string;
}
