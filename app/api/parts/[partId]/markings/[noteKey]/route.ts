import { z } from "zod";
import { handle, parseJson, parseParams, parseQuery } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { putMarkingBodySchema } from "@/lib/markings/schema";
import { noteParams } from "@/lib/parts/note-params";
import { removeMarking, saveMarking } from "@/server/markings";

export const dynamic = "force-dynamic";

export const PUT = handle(async (request, { params }) => {
  const { partId, noteKey } = await parseParams(params, noteParams);
  const user = await requireUser();
  const { version, group, ...values } = await parseJson(request, putMarkingBodySchema);
  const { marking, created } = await saveMarking(user, { partId, noteKey, values, version, group });
  return Response.json({ marking }, { status: created ? 201 : 200 });
});

const deleteQuery = z.object({
  version: z.coerce.number().int().positive("Send the version of the marking you are removing."),
  group: z.string().uuid().optional(),
});

export const DELETE = handle(async (request, { params }) => {
  const { partId, noteKey } = await parseParams(params, noteParams);
  const user = await requireUser();
  const { version, group } = parseQuery(request, deleteQuery);
  return Response.json(await removeMarking(user, { partId, noteKey, version, group }));
});
