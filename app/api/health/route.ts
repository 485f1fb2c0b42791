import { checkDatabase } from "@/db/health";
import { getCurrentUser } from "@/lib/auth/session";
import { config } from "@/lib/config";
import { checkSmtp } from "@/lib/mail/health";
import pkg from "@/package.json";

export const dynamic = "force-dynamic";

/**
 * Anyone (a load balancer, a monitor) gets the status alone; only a signed-in administrator
 * sees the version, the migration level and the reason, which help an attacker as much as an
 * operator.
 */
export async function GET() {
  const [database, mail] = await Promise.all([checkDatabase(), checkSmtp(config().SMTP_URL)]);
  const ok = database.ok;
  const status = ok ? "ok" : "degraded";
  const headers = { "cache-control": "no-store", ...(ok ? {} : { "Retry-After": "5" }) };
  const viewer = ok ? await getCurrentUser().catch(() => null) : null;
  if (viewer?.role !== "admin") return Response.json({ status }, { status: ok ? 200 : 503, headers });
  return Response.json({ status, version: pkg.version, database, mail }, { status: 200, headers });
}
