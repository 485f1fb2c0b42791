import "server-only";
import { and, desc, eq, inArray, sql } from "drizzle-orm";
import type { MarkingValues } from "@/lib/markings/schema";
import type { ProposalDto, ProposalStatus } from "@/lib/sharing/dto";
import { db, type Executor } from "./client";

export type { ProposalDto, ProposalStatus };
import { proposals, users, type Proposal } from "./schema";

const columns = { proposal: proposals, authorName: users.name };

function toDto(r: { proposal: Proposal; authorName: string }): ProposalDto {
  const p = r.proposal;
  return {
    id: p.id,
    noteKey: p.noteKey,
    authorId: p.authorId,
    authorName: r.authorName,
    baseVersion: p.baseVersion,
    proposed: p.proposed as MarkingValues,
    comment: p.comment,
    status: p.status,
    reply: p.reply,
    decidedAt: p.decidedAt?.toISOString() ?? null,
    createdAt: p.createdAt.toISOString(),
  };
}

export async function insertProposal(values: {
  partId: string;
  noteKey: string;
  authorId: string;
  baseVersion: number | null;
  proposed: MarkingValues;
  comment: string;
}): Promise<Proposal> {
  const [row] = await db().insert(proposals).values(values).returning();
  return row;
}

export async function listProposalsByPartId({ partId, noteKey, statuses }: {
  partId: string;
  noteKey?: string;
  statuses?: ProposalStatus[];
}): Promise<ProposalDto[]> {
  const rows = await db()
    .select(columns)
    .from(proposals)
    .innerJoin(users, eq(users.id, proposals.authorId))
    .where(
      and(
        eq(proposals.partId, partId),
        noteKey ? eq(proposals.noteKey, noteKey) : undefined,
        statuses?.length ? inArray(proposals.status, statuses) : undefined,
      ),
    )
    .orderBy(desc(proposals.createdAt))
    .limit(200);
  return rows.map(toDto);
}

export async function getProposalById({ partId, proposalId, tx }: { partId: string; proposalId: string; tx?: Executor }): Promise<ProposalDto | null> {
  const [row] = await (tx ?? db())
    .select(columns)
    .from(proposals)
    .innerJoin(users, eq(users.id, proposals.authorId))
    .where(and(eq(proposals.id, proposalId), eq(proposals.partId, partId)));
  return row ? toDto(row) : null;
}

/**
 * Moves a proposal from one of `from` to `to`. The guard makes the first decision win when two
 * windows decide at once; null means it had already been decided.
 */
export async function transitionProposal({ proposalId, from, to, reply, tx }: {
  proposalId: string;
  from: ProposalStatus[];
  to: ProposalStatus;
  reply?: string | null;
  tx?: Executor;
}): Promise<Proposal | null> {
  const [row] = await (tx ?? db())
    .update(proposals)
    .set({ status: to, decidedAt: to === "open" ? null : new Date(), ...(reply !== undefined ? { reply } : {}) })
    .where(and(eq(proposals.id, proposalId), inArray(proposals.status, from)))
    .returning();
  return row ?? null;
}

/** Open proposals per note, for the score's markers. */
export async function countOpenProposalsByPartId({ partId }: { partId: string }): Promise<{ noteKey: string; count: number }[]> {
  return db()
    .select({ noteKey: proposals.noteKey, count: sql<number>`count(*)::int` })
    .from(proposals)
    .where(and(eq(proposals.partId, partId), eq(proposals.status, "open")))
    .groupBy(proposals.noteKey);
}
