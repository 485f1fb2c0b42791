import path from "node:path";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import { config } from "@/lib/config";
import { closeDb, db } from "./client";
import { installJobQueue } from "./job-queue";

/** Applies the committed SQL migrations and installs the job queue; used by the start and test scripts. */
export async function runMigrations(): Promise<void> {
  await migrate(db(), { migrationsFolder: path.join(process.cwd(), "db", "migrations") });
  await installJobQueue(config().DATABASE_URL);
}

if (process.argv[1] && import.meta.url.endsWith(path.basename(process.argv[1]))) {
  runMigrations()
    .then(() => closeDb())
    .catch(async (err) => {
      console.error(`migration failed: ${err instanceof Error ? err.message : String(err)}`);
      await closeDb();
      process.exit(1);
    });
}
