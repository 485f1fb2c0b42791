import fs from "node:fs";
import path from "node:path";
import { randomUUID } from "node:crypto";
import { and, eq } from "drizzle-orm";
import { DEFAULT_MARKING, type MarkingValues } from "@/lib/markings/schema";
import { ingestScore } from "@/lib/parts/ingest";
import { db } from "./client";
import { writeMarking } from "./markings";
import { insertPart, newPartValues } from "./parts";
import { parts, shares, type User } from "./schema";

const DEMO_SAMPLE = "harbour-song.musicxml";

/**
 * The demo player's first part, with a few markings taken from the analysis' suggestions and
 * shared with the demo teacher, so a first visit shows every area with something in it.
 * Idempotent: nothing is added when the player already has this part.
 */
export async function seedDemoPart({ player, teacher }: { player: User; teacher: User }): Promise<void> {
  const file = path.join(process.cwd(), "samples", DEMO_SAMPLE);
  if (!fs.existsSync(file)) return;
  const existing = await db().select({ id: parts.id }).from(parts).where(and(eq(parts.ownerId, player.id), eq(parts.sourceFileName, DEMO_SAMPLE)));
  if (existing.length) return;

  const bytes = new Uint8Array(fs.readFileSync(file));
  const ingested = ingestScore(bytes, DEMO_SAMPLE, {});
  const { part } = await insertPart({
    quota: { maxParts: Number.MAX_SAFE_INTEGER, maxBytes: Number.MAX_SAFE_INTEGER },
    values: newPartValues({ ownerId: player.id, fileName: DEMO_SAMPLE, bytes, ingested }),
  });

  const suggestions = ingested.analysis.parts.find((p) => p.id === part.chosenPartId)?.suggestions ?? [];
  const first = (role: string) => suggestions.find((s) => s.role === role && s.confidence >= 0.5);
  const picks: Array<[string | undefined, Partial<MarkingValues>]> = [
    [first("phrase-start")?.note, { role: "phrase-start", depthCents: 10, speedHz: 5, onset: "delayed", shape: "growing" }],
    [first("peak")?.note, { role: "peak", depthCents: 30, speedHz: 6, comment: "Let the line open here." }],
    [first("tension")?.note, { role: "tension", depthCents: 25, speedHz: 5.5, shape: "fading" }],
  ];
  for (const [noteKey, values] of picks) {
    if (!noteKey) continue;
    await writeMarking({ partId: part.id, noteKey, values: { ...DEFAULT_MARKING, ...values }, expectedVersion: undefined, actorId: player.id, groupId: randomUUID() });
  }

  await db().insert(shares).values({
    partId: part.id,
    email: teacher.email,
    permission: "propose",
    // Never e-mailed: the demo share is accepted from the start, so its token is unusable.
    tokenHash: `demo-${randomUUID()}`,
    invitedBy: player.id,
    userId: teacher.id,
    acceptedAt: new Date(),
    expiresAt: new Date(Date.now() + 14 * 86_400_000),
  });
}
