import "server-only";
import type { CurrentUser } from "@/lib/auth/types";
import type { decisionBodySchema } from "@/lib/markings/schema";
import type { z } from "zod";
import { listDecisionsByPartId, upsertDecision } from "@/db/suggestion-decisions";
import { loadPart } from "./parts";

/** The suggestions the part's owner accepted or dismissed, so they are not offered again. */
export async function listDecisions(user: CurrentUser, partId: string) {
  await loadPart(user, partId, "part:view");
  return { decisions: await listDecisionsByPartId({ partId }) };
}

export async function decideSuggestion(user: CurrentUser, partId: string, body: z.infer<typeof decisionBodySchema>) {
  await loadPart(user, partId, "marking:write");
  await upsertDecision({ partId, ...body, userId: user.id });
  return { ok: true as const, ...body };
}
