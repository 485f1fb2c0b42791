import { requireUser } from "@/server/auth/session";
import { handle } from "@/lib/http/handler";

export const dynamic = "force-dynamic";

/** The signed-in account as the server sees it now (role and status re-read from the database). */
export const GET = handle(async () => {
  const user = await requireUser();
  return Response.json(user, { headers: { "cache-control": "no-store" } });
});
