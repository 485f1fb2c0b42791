import { and, eq } from "drizzle-orm";
import { addDays, utcIsoDate } from "@/lib/assignments/due";
import { db } from "./client";
import { markings, parts, practiceAssignments, type User } from "./schema";

const DEMO_SAMPLE = "harbour-song.musicxml";

/**
 * The demo teacher's practice for the demo player on the seeded part: the hold ladder on the
 * phrase's peak, so the practice page and the studio both show an assignment on a first visit.
 * Idempotent: nothing is added once the teacher has set any practice on that part.
 */
export async function seedDemoAssignment({ player, teacher }: { player: User; teacher: User }): Promise<void> {
  const [part] = await db().select({ id: parts.id }).from(parts).where(and(eq(parts.ownerId, player.id), eq(parts.sourceFileName, DEMO_SAMPLE)));
  if (!part) return;
  const [existing] = await db()
    .select({ id: practiceAssignments.id })
    .from(practiceAssignments)
    .where(and(eq(practiceAssignments.partId, part.id), eq(practiceAssignments.assignedBy, teacher.id)))
    .limit(1);
  if (existing) return;
  const [peak] = await db().select({ noteKey: markings.noteKey }).from(markings).where(and(eq(markings.partId, part.id), eq(markings.role, "peak"))).limit(1);
  await db().insert(practiceAssignments).values({
    partId: part.id,
    assignedBy: teacher.id,
    noteKey: peak?.noteKey ?? null,
    drill: "hold-ladder",
    instructions:
      "Climb the ladder on the peak note with the vibrato as marked. Keep the speed even as the holds get shorter; if it rushes, go back one rung. Log how far you got.",
    minutesPerDay: 10,
    dueOn: addDays(utcIsoDate(new Date()), 6),
  });
}
