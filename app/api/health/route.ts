import { checkHealth } from "@/server/health";

export const dynamic = "force-dynamic";

export async function GET() {
  const { ok, report } = await checkHealth();
  return Response.json(report, { status: ok ? 200 : 503, headers: { "cache-control": "no-store" } });
}
