import { checkDatabase } from "@/db/health";
import { config } from "@/lib/config";
import { checkSmtp } from "@/lib/mail/health";
import pkg from "@/package.json";

export const dynamic = "force-dynamic";

export async function GET() {
  const [database, mail] = await Promise.all([checkDatabase(), checkSmtp(config().SMTP_URL)]);
  const ok = database.ok;
  return Response.json(
    {
      status: ok ? "ok" : "degraded",
      version: pkg.version,
      database,
      mail,
      ...(ok ? {} : { reason: `database unreachable: ${database.error}` }),
    },
    { status: ok ? 200 : 503, headers: { "cache-control": "no-store" } },
  );
}
