import path from "node:path";
import { eq, sql } from "drizzle-orm";
import { config } from "@/lib/config";
import { hashPassword } from "@/lib/auth/password";
import { closeDb, db } from "./client";
import { seedDemoAssignment } from "./seed-demo-assignment";
import { seedDemoPart } from "./seed-demo-part";
import { studioMembers, studios, users } from "./schema";

export const DEMO_ACCOUNTS = [
  { email: "player@demo.ondula.test", name: "Mira Solvang", role: "player" as const },
  { email: "teacher@demo.ondula.test", name: "Teo Barral", role: "teacher" as const },
  { email: "admin@demo.ondula.test", name: "Ada Quillon", role: "admin" as const },
];

async function upsertUser(a: (typeof DEMO_ACCOUNTS)[number], passwordHash: string) {
  const existing = await db().select().from(users).where(sql`lower(${users.email}) = ${a.email}`);
  if (existing[0]) return existing[0];
  const [row] = await db()
    .insert(users)
    .values({ email: a.email, name: a.name, role: a.role, passwordHash, emailVerifiedAt: new Date() })
    .returning();
  return row;
}

/** Idempotent: running it twice leaves one copy of everything. */
export async function seedDemo(): Promise<void> {
  const cfg = config();
  if (cfg.APP_ENV === "production" && cfg.SEED_DEMO !== "yes") return;
  const passwordHash = await hashPassword(cfg.DEMO_PASSWORD);
  const [player, teacher] = await Promise.all(DEMO_ACCOUNTS.slice(0, 2).map((a) => upsertUser(a, passwordHash)));
  await upsertUser(DEMO_ACCOUNTS[2], passwordHash);
  let [studio] = await db().select().from(studios).where(eq(studios.teacherId, teacher.id));
  if (!studio) [studio] = await db().insert(studios).values({ teacherId: teacher.id, name: `${teacher.name}'s studio` }).returning();
  await db().insert(studioMembers).values({ studioId: studio.id, playerId: player.id }).onConflictDoNothing();
  await seedDemoPart({ player, teacher });
  await seedDemoAssignment({ player, teacher });
}

if (process.argv[1] && import.meta.url.endsWith(path.basename(process.argv[1]))) {
  seedDemo()
    .then(() => closeDb())
    .catch(async (err) => {
      console.error(`seed failed: ${err instanceof Error ? err.message : String(err)}`);
      await closeDb();
      process.exit(1);
    });
}
