import { z } from "zod";
import { handle, parseJson, parseParams, parseQuery } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { partIdParams } from "@/lib/parts/schemas";
import { proposalBody } from "@/lib/sharing/schemas";
import { createProposal, listProposals } from "@/server/proposals";
import { idempotent } from "@/server/http/idempotency";

export const dynamic = "force-dynamic";

const listQuery = z.object({
  note: z.string().min(1).max(200).optional(),
  status: z.enum(["open", "accepted", "declined", "stale", "withdrawn", "all"]).default("all"),
});

/** Proposals with the note's current marking beside each, so they can be compared. */
export const GET = handle(async (request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  const query = parseQuery(request, listQuery);
  return Response.json(await listProposals(user, { partId, noteKey: query.note, status: query.status }));
});

export const POST = handle(async (request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  return idempotent(request, user, async (request) => {
    const body = await parseJson(request, proposalBody);
    return Response.json(await createProposal(user, partId, body), { status: 201 });
  });
});
