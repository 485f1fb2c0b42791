import { requireUser } from "@/lib/auth/session";
import { handler } from "@/lib/http/handler";

export const dynamic = "force-dynamic";

/** The signed-in account as the server sees it now (role and status re-read from the database). */
export const GET = handler(async () => {
  const user = await requireUser();
  return Response.json(user, { headers: { "cache-control": "no-store" } });
});
