import { handle, parseQuery } from "@/lib/http/handler";
import { receiveFile } from "@/lib/http/multipart";
import { assertCan } from "@/lib/auth/policy";
import { requireUser } from "@/lib/auth/session";
import { config } from "@/lib/config";
import { listPartsQuery } from "@/lib/parts/schemas";
import { createPartFromFile } from "@/lib/server/parts";
import { listPartsForViewer } from "@/db/parts";

export const dynamic = "force-dynamic";

export const GET = handle(async (request) => {
  const q = parseQuery(request, listPartsQuery);
  const user = await requireUser();
  const result = await listPartsForViewer({ viewerId: user.id, ...q });
  return Response.json({ ...result, page: q.page, pageSize: q.pageSize });
});

export const POST = handle(async (request) => {
  const user = await requireUser();
  assertCan(user, "part:create", { type: "site" });
  const { fileName, bytes } = await receiveFile(request, { field: "file", maxBytes: config().UPLOAD_MAX_BYTES });
  const { part, importedMarkings, unreadableMarkings } = await createPartFromFile(user, fileName, bytes);
  return Response.json(
    { id: part.id, url: `/parts/${part.id}`, parts: part.partList, chosenPart: part.chosenPartId, importedMarkings, unreadableMarkings, notices: part.readNotices },
    { status: 201 },
  );
});
