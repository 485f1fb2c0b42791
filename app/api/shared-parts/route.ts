import { handle } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { groupByStudent } from "@/lib/sharing/attention";
import { listSharedPartsForViewer } from "@/db/shares";

export const dynamic = "force-dynamic";

/**
 * Parts other people shared with the viewer, grouped by student and sorted by what needs
 * attention. Only the viewer's own live shares are read, so no further policy check applies.
 */
export const GET = handle(async () => {
  const user = await requireUser();
  const rows = await listSharedPartsForViewer({ viewerId: user.id });
  return Response.json({ students: groupByStudent(rows) });
});
