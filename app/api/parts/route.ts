import { handle, parseQuery } from "@/lib/http/handler";
import { fileTooLarge, MULTIPART_OVERHEAD_BYTES, receiveFile } from "@/lib/http/multipart";
import { requireUser } from "@/server/auth/session";
import { config } from "@/lib/config";
import { listPartsQuery } from "@/lib/parts/schemas";
import { listParts, uploadPart } from "@/server/parts";
import { idempotent } from "@/server/http/idempotency";

export const dynamic = "force-dynamic";

export const GET = handle(async (request) => {
  const q = parseQuery(request, listPartsQuery);
  const user = await requireUser();
  return Response.json(await listParts(user, q));
});

export const POST = handle(async (request) => {
  const user = await requireUser();
  const maxBytes = config().UPLOAD_MAX_BYTES;
  return idempotent(
    request,
    user,
    async (request) => Response.json(await uploadPart(user, () => receiveFile(request, { field: "file", maxBytes })), { status: 201 }),
    { maxBytes: maxBytes + MULTIPART_OVERHEAD_BYTES, tooLarge: () => fileTooLarge(maxBytes) },
  );
});
