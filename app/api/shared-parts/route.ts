import { handle } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { listSharedParts } from "@/server/sharing";

export const dynamic = "force-dynamic";

/** Parts other people shared with the viewer, grouped by student and sorted by what needs attention. */
export const GET = handle(async () => {
  const user = await requireUser();
  return Response.json(await listSharedParts(user));
});
