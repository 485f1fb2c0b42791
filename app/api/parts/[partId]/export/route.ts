import { workingTempoOf } from "@/lib/parts/working-tempo";
import { z } from "zod";
import { handle, parseParams, parseQuery } from "@/lib/http/handler";
import { requireUser } from "@/lib/auth/session";
import { AppError } from "@/lib/errors";
import { embedMarkings } from "@/lib/export/musicxml-markings";
import { renderMidi } from "@/lib/export/midi";
import type { MarkingValues } from "@/lib/markings/schema";
import { readScoreFile } from "@/lib/musicxml";
import { partIdParams } from "@/lib/parts/schemas";
import { loadPart, readLimits } from "@/lib/server/parts";
import { listMarkingsByPartId } from "@/db/markings";

export const dynamic = "force-dynamic";

const exportQuery = z.object({ format: z.enum(["musicxml", "midi"], { error: "Choose format=musicxml or format=midi." }) });

function fileStem(title: string): string {
  return title.replace(/[^\w\- ]+/g, "").trim().replace(/\s+/g, "-").toLowerCase() || "part";
}

/** The part with its markings, as MusicXML any notation program opens, or as MIDI with the vibrato. */
export const GET = handle(async (request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const { format } = parseQuery(request, exportQuery);
  const user = await requireUser();
  const { part } = await loadPart(user, partId, "part:view");
  const markings = new Map<string, MarkingValues>(
    (await listMarkingsByPartId({ partId })).map(({ noteKey, version: _v, authorId: _a, updatedAt: _u, ...values }) => [noteKey, values]),
  );
  const stem = fileStem(part.title);
  if (format === "musicxml") {
    return new Response(embedMarkings(part.musicxml, markings), {
      headers: {
        "content-type": "application/vnd.recordare.musicxml+xml; charset=utf-8",
        "content-disposition": `attachment; filename="${stem}-marked.musicxml"`,
        "cache-control": "private, no-store",
      },
    });
  }
  const { score } = readScoreFile(new TextEncoder().encode(part.musicxml), "stored.musicxml", readLimits());
  const chosen = score.parts.find((p) => p.id === part.chosenPartId);
  if (!chosen) throw new AppError("not_found:part", "The chosen part is missing from the score. Choose the part again.");
  const bytes = renderMidi(chosen, markings, { workingTempo: workingTempoOf(part) });
  return new Response(new Uint8Array(bytes), {
    headers: {
      "content-type": "audio/midi",
      "content-disposition": `attachment; filename="${stem}-vibrato.mid"`,
      "cache-control": "private, no-store",
    },
  });
});
