import { handle, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { selectPartsXml } from "@/lib/musicxml";
import { partIdParams } from "@/lib/parts/schemas";
import { loadPartText } from "@/server/parts";

export const dynamic = "force-dynamic";

/** The normalized partwise text of the chosen part: the only MusicXML the browser receives. */
export const GET = handle(async (_request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  const { part } = await loadPartText(user, partId, "part:view");
  return new Response(selectPartsXml(part.musicxml, [part.chosenPartId]), {
    headers: {
      "content-type": "application/vnd.recordare.musicxml+xml; charset=utf-8",
      "cache-control": "private, no-store",
      // Opened directly, it downloads instead of rendering as a document of our origin.
      "content-disposition": `attachment; filename="part.musicxml"`,
    },
  });
});
