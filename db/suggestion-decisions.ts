import "server-only";
import { eq } from "drizzle-orm";
import { db } from "./client";
import { suggestionDecisions } from "./schema";
import type { Role } from "@/lib/analysis/types";

export async function listDecisionsByPartId({ partId }: { partId: string }) {
  const rows = await db()
    .select({ noteKey: suggestionDecisions.noteKey, role: suggestionDecisions.role, decision: suggestionDecisions.decision })
    .from(suggestionDecisions)
    .where(eq(suggestionDecisions.partId, partId));
  return rows;
}

/** The last decision on a suggestion wins (a dismissed one can be accepted later). */
export async function upsertDecision(o: { partId: string; noteKey: string; role: Role; decision: "accepted" | "dismissed"; userId: string }) {
  await db()
    .insert(suggestionDecisions)
    .values(o)
    .onConflictDoUpdate({
      target: [suggestionDecisions.partId, suggestionDecisions.noteKey, suggestionDecisions.role],
      set: { decision: o.decision, userId: o.userId, createdAt: new Date() },
    });
}
