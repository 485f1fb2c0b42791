import path from "node:path";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import { closeDb, db } from "./client";

/** Applies the committed SQL migrations; used by the start and test scripts. */
export async function runMigrations(): Promise<void> {
  await migrate(db(), { migrationsFolder: path.join(process.cwd(), "db", "migrations") });
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
