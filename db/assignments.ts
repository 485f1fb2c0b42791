import "server-only";
import { and, desc, eq, sql } from "drizzle-orm";
import type { AssignmentDrill, AssignmentDto } from "@/lib/assignments/schema";
import type { PartProgress } from "@/lib/assignments/progress";
import { db } from "./client";
import { practiceAssignments, practiceEntries, parts, shares, takes, users } from "./schema";

type Row = typeof practiceAssignments.$inferSelect;

const columns = { assignment: practiceAssignments, assignedByName: users.name };

function toDto({ assignment: a, assignedByName }: { assignment: Row; assignedByName: string }): AssignmentDto {
  return {
    id: a.id,
    partId: a.partId,
    noteKey: a.noteKey,
    drill: a.drill,
    instructions: a.instructions,
    minutesPerDay: a.minutesPerDay,
    dueOn: a.dueOn,
    doneAt: a.doneAt?.toISOString() ?? null,
    version: a.version,
    assignedById: a.assignedBy,
    assignedByName,
    createdAt: a.createdAt.toISOString(),
    updatedAt: a.updatedAt.toISOString(),
  };
}

/** A part has a handful of assignments at a time; the cap only guards the page against a flood. */
const LIST_LIMIT = 200;

export async function listAssignmentsByPartId({ partId }: { partId: string }): Promise<AssignmentDto[]> {
  const rows = await db()
    .select(columns)
    .from(practiceAssignments)
    .innerJoin(users, eq(users.id, practiceAssignments.assignedBy))
    .where(eq(practiceAssignments.partId, partId))
    .orderBy(desc(practiceAssignments.createdAt))
    .limit(LIST_LIMIT);
  return rows.map(toDto);
}

export async function getAssignmentById({ partId, assignmentId }: { partId: string; assignmentId: string }): Promise<AssignmentDto | null> {
  const [row] = await db()
    .select(columns)
    .from(practiceAssignments)
    .innerJoin(users, eq(users.id, practiceAssignments.assignedBy))
    .where(and(eq(practiceAssignments.id, assignmentId), eq(practiceAssignments.partId, partId)));
  return row ? toDto(row) : null;
}

export interface AssignmentFields {
  drill: AssignmentDrill;
  noteKey: string | null;
  instructions: string;
  minutesPerDay: number | null;
  dueOn: string | null;
}

export async function insertAssignment(values: AssignmentFields & { partId: string; assignedBy: string }): Promise<AssignmentDto> {
  const [row] = await db().insert(practiceAssignments).values(values).returning({ id: practiceAssignments.id });
  return (await getAssignmentById({ partId: values.partId, assignmentId: row.id }))!;
}

export type AssignmentWrite = { ok: true; assignment: AssignmentDto } | { ok: false; current: AssignmentDto | null };

/**
 * Changes an assignment only if it is still at `expectedVersion`, so two windows never overwrite
 * each other; otherwise answers the row as it is now (null: it is gone).
 */
export async function updateAssignmentById({ partId, assignmentId, expectedVersion, changes }: {
  partId: string;
  assignmentId: string;
  expectedVersion: number;
  changes: Partial<AssignmentFields> | { done: boolean };
}): Promise<AssignmentWrite> {
  const set =
    "done" in changes
      // The first tick's time stands when it is ticked again from another window.
      ? { doneAt: changes.done ? sql`coalesce(${practiceAssignments.doneAt}, now())` : null }
      : changes;
  const updated = await db()
    .update(practiceAssignments)
    .set({ ...set, version: sql`${practiceAssignments.version} + 1`, updatedAt: new Date() })
    .where(and(eq(practiceAssignments.id, assignmentId), eq(practiceAssignments.partId, partId), eq(practiceAssignments.version, expectedVersion)))
    .returning({ id: practiceAssignments.id });
  const current = await getAssignmentById({ partId, assignmentId });
  return updated.length && current ? { ok: true, assignment: current } : { ok: false, current };
}

export async function deleteAssignmentById({ partId, assignmentId, expectedVersion }: {
  partId: string;
  assignmentId: string;
  expectedVersion: number;
}): Promise<{ ok: true } | { ok: false; current: AssignmentDto | null }> {
  const deleted = await db()
    .delete(practiceAssignments)
    .where(and(eq(practiceAssignments.id, assignmentId), eq(practiceAssignments.partId, partId), eq(practiceAssignments.version, expectedVersion)))
    .returning({ id: practiceAssignments.id });
  if (deleted.length) return { ok: true };
  return { ok: false, current: await getAssignmentById({ partId, assignmentId }) };
}

/**
 * Practice progress of every part shared with the teacher, per student and part, in one
 * statement: the teacher's open and overdue assignments, the owner's practice-log minutes since
 * `since` and the owner's latest take. Each aggregate is grouped once over the shared parts only
 * (not per row), so the cost does not grow with a query per part.
 */
export async function listPracticeProgressForTeacher({ teacherId, today, since }: {
  teacherId: string;
  /** `YYYY-MM-DD`: assignments due before this day and still open are overdue. */
  today: string;
  since: Date;
}): Promise<PartProgress[]> {
  const result = await db().execute<{
    owner_id: string; owner_name: string; owner_email: string; part_id: string; title: string;
    open: number; overdue: number; asked: number; minutes: number; last_take: string | null;
  }>(sql`
    with shared as (
      select distinct ${parts.id} as part_id, ${parts.ownerId} as owner_id, ${parts.title} as title
      from ${shares} join ${parts} on ${parts.id} = ${shares.partId}
      where ${shares.userId} = ${teacherId} and ${shares.acceptedAt} is not null and ${shares.revokedAt} is null
        and ${parts.ownerId} <> ${teacherId}
    ),
    assigned as (
      select a.part_id,
        count(*) filter (where a.done_at is null)::int as open,
        count(*) filter (where a.done_at is null and a.due_on < ${today}::date)::int as overdue,
        coalesce(sum(a.minutes_per_day) filter (where a.done_at is null), 0)::int as asked
      from ${practiceAssignments} a join shared s on s.part_id = a.part_id
      where a.assigned_by = ${teacherId}
      group by a.part_id
    ),
    logged as (
      select e.part_id, sum(e.minutes)::float8 as minutes
      from ${practiceEntries} e join shared s on s.part_id = e.part_id and e.user_id = s.owner_id
      where e.created_at >= ${since.toISOString()}::timestamptz
      group by e.part_id
    ),
    recorded as (
      select t.part_id, max(t.created_at) as last_take
      from ${takes} t join shared s on s.part_id = t.part_id and t.user_id = s.owner_id
      group by t.part_id
    )
    select s.owner_id, u.name as owner_name, u.email as owner_email, s.part_id, s.title,
      coalesce(a.open, 0) as open, coalesce(a.overdue, 0) as overdue, coalesce(a.asked, 0) as asked,
      coalesce(l.minutes, 0) as minutes,
      to_char(r.last_take at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"') as last_take
    from shared s
    join ${users} u on u.id = s.owner_id
    left join assigned a on a.part_id = s.part_id
    left join logged l on l.part_id = s.part_id
    left join recorded r on r.part_id = s.part_id
    order by u.name, s.title
    limit 500`);
  return result.rows.map((r) => ({
    ownerId: r.owner_id,
    ownerName: r.owner_name,
    ownerEmail: r.owner_email,
    partId: r.part_id,
    title: r.title,
    openAssignments: Number(r.open),
    overdueAssignments: Number(r.overdue),
    minutesAskedPerDay: Number(r.asked),
    minutesLately: Number(r.minutes),
    lastTakeAt: r.last_take,
  }));
}
