import { timingSafeEqual } from "node:crypto";
import { handle } from "@/lib/http/handler";
import { config, isProduction } from "@/lib/config";
import { AppError } from "@/lib/errors";
import { flushDueNotifications } from "@/server/notify";

export const dynamic = "force-dynamic";

function authorized(request: Request): boolean {
  if (!isProduction()) return true;
  // In production a scheduler calls this with the shared secret; without one the route is hidden.
  const secret = config().NOTIFY_FLUSH_SECRET;
  if (!secret) return false;
  const given = Buffer.from(request.headers.get("authorization") ?? "");
  const expected = Buffer.from(`Bearer ${secret}`);
  return given.length === expected.length && timingSafeEqual(given, expected);
}

/** Sends the notification e-mails whose 10-minute window has passed. */
export const POST = handle(async (request) => {
  if (!authorized(request)) throw new AppError("not_found:page", "Not found.");
  const sent = await flushDueNotifications();
  return Response.json({ sent });
});
