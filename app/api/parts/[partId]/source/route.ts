import { handle, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { partIdParams } from "@/lib/parts/schemas";
import { loadPart } from "@/server/parts";

export const dynamic = "force-dynamic";

/** The file exactly as it was uploaded. */
export const GET = handle(async (_request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  const { part } = await loadPart(user, partId, "part:view");
  const type = part.sourceFormat === "mxl" ? "application/vnd.recordare.musicxml" : "application/vnd.recordare.musicxml+xml";
  const safeName = part.sourceFileName.replace(/[^\w.\- ]+/g, "_");
  return new Response(new Uint8Array(part.sourceBytes), {
    headers: {
      "content-type": type,
      "content-disposition": `attachment; filename="${safeName}"`,
      "cache-control": "private, no-store",
    },
  });
});
