import "server-only";
import { checkDatabase } from "@/db/health";
import { config } from "@/lib/config";
import { checkSmtp } from "@/lib/mail/health";
import pkg from "@/package.json";

/** Whether the database and the mail server answer; the app is degraded without the database. */
export async function checkHealth() {
  const [database, mail] = await Promise.all([checkDatabase(), checkSmtp(config().SMTP_URL)]);
  const ok = database.ok;
  return {
    ok,
    report: {
      status: ok ? "ok" : "degraded",
      version: pkg.version,
      database,
      mail,
      ...(ok ? {} : { reason: `database unreachable: ${database.error}` }),
    },
  };
}
