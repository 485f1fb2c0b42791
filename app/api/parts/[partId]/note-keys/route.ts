import { handle, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { partIdParams } from "@/lib/parts/schemas";
import { getPartNoteKeys } from "@/server/parts";

export const dynamic = "force-dynamic";

/** The chosen part's note keys: the notes a marking may attach to, as the server names them. */
export const GET = handle(async (_request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  return Response.json(await getPartNoteKeys(user, partId));
});
