import { handle, parseJson } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { readBody } from "@/lib/sharing/schemas";
import { markRead } from "@/server/notifications";

export const dynamic = "force-dynamic";

/** Marks the viewer's notifications of a part (or of one thread in it) read. */
export const POST = handle(async (request) => {
  const user = await requireUser();
  const body = await parseJson(request, readBody);
  return Response.json(await markRead(user, body));
});
