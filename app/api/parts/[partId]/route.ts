import { handle, parseJson, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/lib/auth/session";
import { AppError } from "@/lib/errors";
import { readScoreFile } from "@/lib/musicxml";
import { partIdParams, patchPartBody } from "@/lib/parts/schemas";
import { summarizePart } from "@/lib/parts/ingest";
import { analysisOf, loadPart, partDto, readLimits } from "@/lib/server/parts";
import { deletePartById, updatePartById } from "@/db/parts";

export const dynamic = "force-dynamic";

export const GET = handle(async (_request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  return Response.json(partDto(await loadPart(user, partId, "part:view")));
});

export const PATCH = handle(async (request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  const body = await parseJson(request, patchPartBody);
  const access = await loadPart(user, partId, "part:edit");
  const changes: Parameters<typeof updatePartById>[0]["changes"] = {};
  if (body.title !== undefined) changes.title = body.title;
  if (body.composer !== undefined) changes.composer = body.composer;
  if (body.workingTempo !== undefined) changes.workingTempo = body.workingTempo;
  if (body.chosenPart !== undefined && body.chosenPart !== access.part.chosenPartId) {
    if (!access.part.partList.some((p) => p.id === body.chosenPart)) {
      throw new AppError("bad_request:chosen_part", `This score has no part "${body.chosenPart}". Choose one of: ${access.part.partList.map((p) => p.id).join(", ")}.`, { field: "chosenPart" });
    }
    const analysis = await analysisOf(access.part);
    const { score } = readScoreFile(new TextEncoder().encode(access.part.musicxml), "stored.musicxml", readLimits());
    Object.assign(changes, { chosenPartId: body.chosenPart, ...summarizePart(score, analysis, body.chosenPart) });
  }
  const part = await updatePartById({ partId, changes, expectedVersion: body.version });
  return Response.json(partDto({ part, permission: access.permission }));
});

export const DELETE = handle(async (_request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  await loadPart(user, partId, "part:delete");
  await deletePartById({ partId });
  return Response.json({ id: partId, deleted: true });
});
