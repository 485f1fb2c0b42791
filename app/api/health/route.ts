import { getCurrentUser } from "@/server/auth/session";
import { checkHealth } from "@/server/health";

export const dynamic = "force-dynamic";

/**
 * Anyone (a load balancer, a monitor) gets the status alone; only a signed-in administrator
 * sees the version, the migration level and the reason, which help an attacker as much as an
 * operator.
 */
export async function GET() {
  const { ok, report } = await checkHealth();
  const headers = { "cache-control": "no-store", ...(ok ? {} : { "Retry-After": "5" }) };
  const viewer = ok ? await getCurrentUser().catch(() => null) : null;
  if (viewer?.role !== "admin") return Response.json({ status: report.status }, { status: ok ? 200 : 503, headers });
  return Response.json(report, { status: 200, headers });
}
