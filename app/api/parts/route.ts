import { handle, parseQuery } from "@/lib/http/handler";
import { receiveFile } from "@/lib/http/multipart";
import { requireUser } from "@/server/auth/session";
import { config } from "@/lib/config";
import { listPartsQuery } from "@/lib/parts/schemas";
import { listParts, uploadPart } from "@/server/parts";

export const dynamic = "force-dynamic";

export const GET = handle(async (request) => {
  const q = parseQuery(request, listPartsQuery);
  const user = await requireUser();
  return Response.json(await listParts(user, q));
});

export const POST = handle(async (request) => {
  const user = await requireUser();
  const upload = await uploadPart(user, () => receiveFile(request, { field: "file", maxBytes: config().UPLOAD_MAX_BYTES }));
  return Response.json(upload, { status: 201 });
});
