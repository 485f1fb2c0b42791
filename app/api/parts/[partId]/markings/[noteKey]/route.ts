import { randomUUID } from "node:crypto";
import { z } from "zod";
import { handle, parseJson, parseParams, parseQuery } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { AppError } from "@/lib/errors";
import { putMarkingBodySchema } from "@/lib/markings/schema";
import { noteParams } from "@/lib/parts/note-params";
import { loadPart } from "@/server/parts";
import { writeMarking, type WriteResult } from "@/db/markings";
import type { Part } from "@/db/schema";

export const dynamic = "force-dynamic";

function assertNoteExists(part: Part, noteKey: string) {
  if (!part.noteKeys.includes(noteKey)) {
    throw new AppError("not_found:note", `There is no note ${noteKey} in this part. Reload the page: the part may have changed.`);
  }
}

function answer(result: WriteResult, created: boolean): Response {
  if (!result.ok) {
    return Response.json(
      {
        code: "conflict:marking",
        message: "This note's marking was changed elsewhere since you opened it. Choose which version to keep.",
        current: result.current,
      },
      { status: 409 },
    );
  }
  return Response.json({ marking: result.marking }, { status: created ? 201 : 200 });
}

export const PUT = handle(async (request, { params }) => {
  const { partId, noteKey } = await parseParams(params, noteParams);
  const user = await requireUser();
  const body = await parseJson(request, putMarkingBodySchema);
  const { part } = await loadPart(user, partId, "marking:write");
  assertNoteExists(part, noteKey);
  const { version, group, ...values } = body;
  const result = await writeMarking({ partId, noteKey, values, expectedVersion: version, actorId: user.id, groupId: group ?? randomUUID() });
  return answer(result, result.ok && version === undefined);
});

const deleteQuery = z.object({
  version: z.coerce.number().int().positive("Send the version of the marking you are removing."),
  group: z.string().uuid().optional(),
});

export const DELETE = handle(async (request, { params }) => {
  const { partId, noteKey } = await parseParams(params, noteParams);
  const user = await requireUser();
  const { version, group } = parseQuery(request, deleteQuery);
  const { part } = await loadPart(user, partId, "marking:write");
  assertNoteExists(part, noteKey);
  const result = await writeMarking({ partId, noteKey, values: null, expectedVersion: version, actorId: user.id, groupId: group ?? randomUUID() });
  if (!result.ok) return answer(result, false);
  return Response.json({ noteKey, deleted: true });
});
