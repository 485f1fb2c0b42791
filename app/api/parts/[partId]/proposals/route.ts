import { z } from "zod";
import { handle, parseJson, parseParams, parseQuery } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { AppError } from "@/lib/errors";
import { partIdParams } from "@/lib/parts/schemas";
import { excerpt } from "@/lib/sharing/comment-text";
import { threadLabel } from "@/lib/sharing/note-label";
import { proposalBody } from "@/lib/sharing/schemas";
import { notifyParticipants } from "@/server/notify";
import { loadPart } from "@/server/parts";
import { proposalView } from "@/server/proposals";
import { getMarkingByNoteKey, listMarkingsByPartId } from "@/db/markings";
import { getProposalById, insertProposal, listProposalsByPartId } from "@/db/proposals";

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
  await loadPart(user, partId, "part:view");
  const [list, markings] = await Promise.all([
    listProposalsByPartId({ partId, noteKey: query.note, statuses: query.status === "all" ? undefined : [query.status] }),
    listMarkingsByPartId({ partId }),
  ]);
  const current = new Map(markings.map((m) => [m.noteKey, m]));
  return Response.json({ proposals: list.map((p) => proposalView(p, current.get(p.noteKey) ?? null)) });
});

export const POST = handle(async (request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  const body = await parseJson(request, proposalBody);
  const { part } = await loadPart(user, partId, "part:propose");
  if (!part.noteKeys.includes(body.noteKey)) {
    throw new AppError("not_found:note", `There is no note ${body.noteKey} in this part. Reload the page: the part may have changed.`, { field: "noteKey" });
  }
  const current = await getMarkingByNoteKey({ partId, noteKey: body.noteKey });
  if ((current?.version ?? null) !== body.baseVersion) {
    return Response.json(
      {
        code: "conflict:marking",
        message: "This note's marking changed since you opened it. Look at the current marking, then make your proposal again.",
        current,
      },
      { status: 409 },
    );
  }
  const row = await insertProposal({
    partId,
    noteKey: body.noteKey,
    authorId: user.id,
    baseVersion: body.baseVersion,
    proposed: body.marking,
    comment: body.comment,
  });
  await notifyParticipants({
    partId,
    actorId: user.id,
    kind: "proposal",
    threadKey: body.noteKey,
    summary: `${user.name} proposed a marking for ${threadLabel(body.noteKey)}${body.comment ? `: “${excerpt(body.comment)}”` : ""}`,
    onlyUserIds: [part.ownerId],
  });
  const created = await getProposalById({ partId, proposalId: row.id });
  return Response.json(proposalView(created!, current), { status: 201 });
});
