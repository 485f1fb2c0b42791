import { z } from "zod";
import { handle, parseParams, parseQuery } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { partIdParams } from "@/lib/parts/schemas";
import { exportPart } from "@/server/parts";

export const dynamic = "force-dynamic";

const exportQuery = z.object({ format: z.enum(["musicxml", "midi"], { error: "Choose format=musicxml or format=midi." }) });

/** The part with its markings, as MusicXML any notation program opens, or as MIDI with the vibrato. */
export const GET = handle(async (request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const { format } = parseQuery(request, exportQuery);
  const user = await requireUser();
  const file = await exportPart(user, partId, format);
  return new Response(file.body as BodyInit, {
    headers: {
      "content-type": file.contentType,
      "content-disposition": `attachment; filename="${file.fileName}"`,
      "cache-control": "private, no-store",
    },
  });
});
