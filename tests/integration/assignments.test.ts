import fs from "node:fs";
import path from "node:path";
import { and, eq, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { db, pool } from "@/db/client";
import { listPracticeProgressForTeacher } from "@/db/assignments";
import { seedDemoAssignment } from "@/db/seed-demo-assignment";
import { markings, notifications, parts, practiceAssignments, practiceEntries, shares, takes, users } from "@/db/schema";
import { addDays, utcIsoDate } from "@/lib/assignments/due";
import { progressWindowStart } from "@/lib/assignments/progress";
import { multipartFile } from "../helpers/parts";
import { DEMO_PASSWORD } from "../helpers/env";
import { createSignedInUser, signIn, type ApiClient, type TestUser } from "../helpers/session";
import { accept, invite, json, passEmailWindow, waitForMails } from "../helpers/sharing";

const FIXTURE = path.resolve("tests/fixtures/sharing/two-bars.musicxml");
const DIGEST = /new(?: items)? on “/;
const today = () => utcIsoDate(new Date());

type Person = { user: TestUser; client: ApiClient };

async function newPart(owner: ApiClient) {
  const res = await owner.fetch("/api/parts", { method: "POST", body: multipartFile("two-bars.musicxml", new Uint8Array(fs.readFileSync(FIXTURE))) });
  expect(res.status).toBe(201);
  const created = await res.json();
  const analysis = await (await owner.fetch(`/api/parts/${created.id}/analysis`)).json();
  return { partId: created.id as string, keys: analysis.notes.map((n: { key: string }) => n.key) as string[] };
}

/** An accepted share written straight to the table (the invitation flow is tested in sharing.test.ts). */
async function shareWith(partId: string, owner: TestUser, to: TestUser, permission: "comment" | "propose" = "comment") {
  const [row] = await db().insert(shares).values({
    partId, email: to.email, permission, tokenHash: `assignments-${partId}-${to.id}`, invitedBy: owner.id,
    userId: to.id, acceptedAt: new Date(), expiresAt: new Date(Date.now() + 86_400_000),
  }).returning();
  return row.id;
}

describe("practice assignments API", () => {
  let owner: Person;
  let teacher: Person;
  let otherTeacher: Person;
  let partId: string;
  let keys: string[];
  const url = () => `/api/parts/${partId}/assignments`;

  beforeAll(async () => {
    [owner, teacher, otherTeacher] = await Promise.all([
      createSignedInUser({ role: "player", name: "Assigned Player" }),
      createSignedInUser({ role: "teacher", name: "Assigning Teacher" }),
      createSignedInUser({ role: "teacher" }),
    ]);
    ({ partId, keys } = await newPart(owner.client));
    const { token } = await invite(owner.client, partId, teacher.user.email, "comment");
    expect((await accept(teacher.client, token)).status).toBe(200);
    await shareWith(partId, owner.user, otherTeacher.user, "propose");
  });

  it("lets the teacher set practice on a note; the player reads it, notified in the app and by e-mail", async () => {
    // Accepting the invitation told the owner by e-mail; the next notice waits out the batching
    // window unless it has passed.
    await waitForMails(owner.user.email, DIGEST);
    await passEmailWindow(owner.user.id, partId);
    const due = addDays(today(), 5);
    const res = await teacher.client.fetch(url(), json({ drill: "hold-ladder", noteKey: keys[2], instructions: "  Long tones, then shorter.  ", minutesPerDay: 10, dueOn: due }));
    expect(res.status).toBe(201);
    const created = await res.json();
    expect(created).toMatchObject({
      drill: "hold-ladder", noteKey: keys[2], instructions: "Long tones, then shorter.", minutesPerDay: 10, dueOn: due,
      doneAt: null, version: 1, assignedById: teacher.user.id, assignedByName: "Assigning Teacher",
    });

    const asOwner = await (await owner.client.fetch(url())).json();
    expect(asOwner).toMatchObject({ canAssign: false, canMarkDone: true });
    expect(asOwner.assignments.map((a: { id: string }) => a.id)).toContain(created.id);
    const asTeacher = await (await teacher.client.fetch(url())).json();
    expect(asTeacher).toMatchObject({ canAssign: true, canMarkDone: false });

    const feed = await (await owner.client.fetch(`/api/notifications?partId=${partId}`)).json();
    const note = feed.items.find((n: { kind: string }) => n.kind === "assignment");
    expect(note.summary).toBe(`Assigning Teacher set practice: Hold ladder on bar 1, 10 min a day, due ${due}`);
    expect(note.url).toBe(`/parts/${partId}/practice#assignments`);
    // The teacher is not told of their own practice.
    const teacherFeed = await (await teacher.client.fetch(`/api/notifications?partId=${partId}`)).json();
    expect(teacherFeed.items.some((n: { kind: string }) => n.kind === "assignment")).toBe(false);

    const mails = await waitForMails(owner.user.email, DIGEST, 2);
    const mail = mails.find((m) => m.text.includes("set practice"))!;
    expect(mail?.text).toContain("Assigning Teacher set practice: Hold ladder on bar 1");
    expect(mail.links.some((l) => l.endsWith(`/parts/${partId}/practice#assignments`))).toBe(true);

    // Opening the practice page reads practice notifications, and only those.
    const read = await owner.client.fetch("/api/notifications/read", json({ partId, kind: "assignment" }));
    expect((await read.json()).updated).toBe(1);
    const unread = await db().select({ kind: notifications.kind }).from(notifications)
      .where(and(eq(notifications.userId, owner.user.id), eq(notifications.partId, partId), sql`${notifications.readAt} is null`));
    // The notice that the teacher accepted the invitation stays unread.
    expect(unread.map((n) => n.kind)).toEqual(["invitation_accepted"]);
  });

  it("names the field of bad practice", async () => {
    const cases: Array<[Record<string, unknown>, string]> = [
      [{ drill: "scales" }, "drill"],
      [{ drill: "take", noteKey: "P1:m99:s1:v1:0/1:60" }, "noteKey"],
      [{ drill: "take", dueOn: "2026-02-30" }, "dueOn"],
      [{ drill: "take", dueOn: "next week" }, "dueOn"],
      [{ drill: "take", dueOn: addDays(today(), -5) }, "dueOn"],
      [{ drill: "take", minutesPerDay: 0 }, "minutesPerDay"],
      [{ drill: "take", minutesPerDay: 12.5 }, "minutesPerDay"],
      [{ drill: "take", instructions: "x".repeat(2001) }, "instructions"],
    ];
    for (const [body, field] of cases) {
      const res = await teacher.client.fetch(url(), json(body));
      expect(res.status, JSON.stringify(body)).toBe(400);
      const answer = await res.json();
      expect(answer.field, JSON.stringify(body)).toBe(field);
      expect(answer.message.length).toBeGreaterThan(10);
    }
  });

  it("keeps the owner to ticking practice done, and the teacher to its fields", async () => {
    const a = await (await teacher.client.fetch(url(), json({ drill: "take", noteKey: keys[1] }))).json();
    const ownerEdit = await owner.client.fetch(`${url()}/${a.id}`, json({ version: 1, instructions: "Mine now" }, "PATCH"));
    expect(ownerEdit.status).toBe(403);
    expect((await ownerEdit.json()).message).toMatch(/mark it done/);
    const both = await owner.client.fetch(`${url()}/${a.id}`, json({ version: 1, done: true, instructions: "and this" }, "PATCH"));
    expect(both.status).toBe(400);
    expect((await both.json()).field).toBe("done");
    const teacherTick = await teacher.client.fetch(`${url()}/${a.id}`, json({ version: 1, done: true }, "PATCH"));
    expect(teacherTick.status).toBe(403);
    const ownerDelete = await owner.client.fetch(`${url()}/${a.id}?version=1`, { method: "DELETE" });
    expect(ownerDelete.status).toBe(403);

    const done = await owner.client.fetch(`${url()}/${a.id}`, json({ version: 1, done: true }, "PATCH"));
    expect(done.status).toBe(200);
    const ticked = await done.json();
    expect(ticked.version).toBe(2);
    expect(Date.now() - Date.parse(ticked.doneAt)).toBeLessThan(60_000);
    const undone = await (await owner.client.fetch(`${url()}/${a.id}`, json({ version: 2, done: false }, "PATCH"))).json();
    expect(undone).toMatchObject({ doneAt: null, version: 3 });
  });

  it("lets the teacher reword late practice without moving its date, but not move a date into the past", async () => {
    const [late] = await db().insert(practiceAssignments).values({ partId, assignedBy: teacher.user.id, drill: "take", dueOn: addDays(today(), -4) }).returning();
    const reworded = await teacher.client.fetch(`${url()}/${late.id}`, json({ version: 1, instructions: "Still worth doing.", dueOn: late.dueOn }, "PATCH"));
    expect(reworded.status).toBe(200);
    const moved = await teacher.client.fetch(`${url()}/${late.id}`, json({ version: 2, dueOn: addDays(today(), -3) }, "PATCH"));
    expect(moved.status).toBe(400);
    expect((await moved.json()).field).toBe("dueOn");
  });

  it("lets only the teacher who set practice change or remove it", async () => {
    const a = await (await teacher.client.fetch(url(), json({ drill: "free", instructions: "Scales in the key" }))).json();
    const other = await otherTeacher.client.fetch(`${url()}/${a.id}`, json({ version: 1, instructions: "Something else" }, "PATCH"));
    expect(other.status).toBe(403);
    expect((await other.json()).code).toBe("forbidden:assignment");
    expect((await otherTeacher.client.fetch(`${url()}/${a.id}?version=1`, { method: "DELETE" })).status).toBe(403);
    // …while setting their own practice on the same part.
    expect((await otherTeacher.client.fetch(url(), json({ drill: "pulse-trainer", noteKey: keys[0] }))).status).toBe(201);
  });

  it("answers a stale version with 409 and the practice as it is now, for edits, ticks and removals", async () => {
    const a = await (await teacher.client.fetch(url(), json({ drill: "pulse-trainer", noteKey: keys[3], minutesPerDay: 5 }))).json();
    const first = await teacher.client.fetch(`${url()}/${a.id}`, json({ version: 1, minutesPerDay: 15, dueOn: addDays(today(), 3), noteKey: null }, "PATCH"));
    expect(first.status).toBe(200);
    expect(await first.json()).toMatchObject({ version: 2, minutesPerDay: 15, noteKey: null });

    const stale = await teacher.client.fetch(`${url()}/${a.id}`, json({ version: 1, minutesPerDay: 20 }, "PATCH"));
    expect(stale.status).toBe(409);
    const conflict = await stale.json();
    expect(conflict.code).toBe("conflict:assignment");
    expect(conflict.current).toMatchObject({ id: a.id, version: 2, minutesPerDay: 15 });

    const staleTick = await owner.client.fetch(`${url()}/${a.id}`, json({ version: 1, done: true }, "PATCH"));
    expect(staleTick.status).toBe(409);
    expect((await staleTick.json()).current.doneAt).toBeNull();

    const staleDelete = await teacher.client.fetch(`${url()}/${a.id}?version=1`, { method: "DELETE" });
    expect(staleDelete.status).toBe(409);
    const gone = await teacher.client.fetch(`${url()}/${a.id}?version=2`, { method: "DELETE" });
    expect(gone.status).toBe(200);
    const after = await teacher.client.fetch(`${url()}/${a.id}`, json({ version: 2, minutesPerDay: 1 }, "PATCH"));
    expect(after.status).toBe(404);
    expect((await after.json()).code).toBe("not_found:assignment");
  });

  it("does not find practice through another part, nor for a teacher whose share was revoked", async () => {
    const a = await (await teacher.client.fetch(url(), json({ drill: "free" }))).json();
    const { partId: elsewhere } = await newPart(owner.client);
    await shareWith(elsewhere, owner.user, teacher.user);
    const wrongPart = await teacher.client.fetch(`/api/parts/${elsewhere}/assignments/${a.id}`, json({ version: 1, instructions: "x" }, "PATCH"));
    expect(wrongPart.status).toBe(404);

    const { partId: revokedPart } = await newPart(owner.client);
    const shareId = await shareWith(revokedPart, owner.user, teacher.user);
    const b = await (await teacher.client.fetch(`/api/parts/${revokedPart}/assignments`, json({ drill: "free" }))).json();
    await db().update(shares).set({ revokedAt: new Date() }).where(eq(shares.id, shareId));
    expect((await teacher.client.fetch(`/api/parts/${revokedPart}/assignments/${b.id}`, json({ version: 1, instructions: "x" }, "PATCH"))).status).toBe(404);
    expect((await teacher.client.fetch(`/api/parts/${revokedPart}/assignments`)).status).toBe(404);
  });

  it("refuses practice from a player the part is shared with", async () => {
    const fellow = await createSignedInUser({ role: "player" });
    await shareWith(partId, owner.user, fellow.user, "propose");
    const res = await fellow.client.fetch(url(), json({ drill: "free" }));
    expect(res.status).toBe(403);
    expect((await res.json()).message).toMatch(/teacher/);
    expect((await fellow.client.fetch(url())).status).toBe(200);
  });
});

describe("studio progress", () => {
  it("sums each shared part's practice for the teacher in one grouped query, and shows it on /studio", async () => {
    const [teacher, otherTeacher, ilse, bram] = await Promise.all([
      createSignedInUser({ role: "teacher" }),
      createSignedInUser({ role: "teacher" }),
      createSignedInUser({ role: "player", name: "Ilse Progress" }),
      createSignedInUser({ role: "player", name: "Bram Progress" }),
    ]);
    const ilsePart = await newPart(ilse.client);
    const bramPart = await newPart(bram.client);
    const unshared = await newPart(bram.client);
    await shareWith(ilsePart.partId, ilse.user, teacher.user);
    await shareWith(bramPart.partId, bram.user, teacher.user);
    await shareWith(ilsePart.partId, ilse.user, otherTeacher.user);
    const t = today();
    const now = Date.now();
    const insert = (partId: string, by: TestUser, dueOn: string | null, extra: Partial<typeof practiceAssignments.$inferInsert> = {}) =>
      db().insert(practiceAssignments).values({ partId, assignedBy: by.id, drill: "take", dueOn, ...extra });
    // Ilse: two open (one overdue, 10 + 5 min a day), one done though overdue, one by another teacher.
    await insert(ilsePart.partId, teacher.user, addDays(t, -2), { minutesPerDay: 10 });
    await insert(ilsePart.partId, teacher.user, addDays(t, 4), { minutesPerDay: 5 });
    await insert(ilsePart.partId, teacher.user, addDays(t, -3), { doneAt: new Date() });
    await insert(ilsePart.partId, otherTeacher.user, addDays(t, -3));
    // Due today is not overdue yet.
    await insert(bramPart.partId, teacher.user, t);
    await insert(unshared.partId, teacher.user, addDays(t, -9));
    await db().insert(practiceEntries).values([
      { userId: ilse.user.id, partId: ilsePart.partId, kind: "take", minutes: 20 },
      { userId: ilse.user.id, partId: ilsePart.partId, kind: "free", minutes: 12.5, createdAt: new Date(now - 6 * 86_400_000) },
      // Older than the week: left out.
      { userId: ilse.user.id, partId: ilsePart.partId, kind: "free", minutes: 90, createdAt: new Date(now - 8 * 86_400_000) },
      { userId: bram.user.id, partId: unshared.partId, kind: "free", minutes: 30 },
    ]);
    const lastTake = new Date(now - 2 * 86_400_000);
    await db().insert(takes).values([
      { userId: ilse.user.id, partId: ilsePart.partId, measured: {}, createdAt: new Date(now - 5 * 86_400_000) },
      { userId: ilse.user.id, partId: ilsePart.partId, measured: {}, createdAt: lastTake },
    ]);

    const spy = vi.spyOn(pool(), "query");
    const rows = await listPracticeProgressForTeacher({ teacherId: teacher.user.id, today: t, since: progressWindowStart(new Date()) });
    const statements = spy.mock.calls.length;
    spy.mockRestore();
    expect(statements).toBe(1);

    expect(rows.map((r) => r.ownerName)).toEqual(["Bram Progress", "Ilse Progress"]);
    expect(rows.find((r) => r.partId === ilsePart.partId)).toMatchObject({
      ownerId: ilse.user.id, openAssignments: 2, overdueAssignments: 1, minutesAskedPerDay: 15, minutesLately: 32.5, lastTakeAt: lastTake.toISOString(),
    });
    expect(rows.find((r) => r.partId === bramPart.partId)).toMatchObject({ openAssignments: 1, overdueAssignments: 0, minutesLately: 0, lastTakeAt: null });

    // The other teacher sees only what they set.
    const theirs = await listPracticeProgressForTeacher({ teacherId: otherTeacher.user.id, today: t, since: progressWindowStart(new Date()) });
    expect(theirs).toHaveLength(1);
    expect(theirs[0]).toMatchObject({ openAssignments: 1, overdueAssignments: 1, minutesLately: 32.5 });

    const page = (await (await teacher.client.fetch("/studio")).text()).replaceAll("<!-- -->", "");
    expect(page).toContain("Practice progress");
    expect(page).toContain("Ilse Progress");
    expect(page).toMatch(/1 overdue/);
    expect(page).toContain("32.5 min");
  });
});

describe("demo seed", () => {
  it("has the demo teacher's practice on the demo player's Harbour Song, once however often it runs", async () => {
    const player = await signIn("player@demo.ondula.test", DEMO_PASSWORD);
    const [part] = await db().select({ id: parts.id }).from(parts).innerJoin(users, eq(users.id, parts.ownerId))
      .where(and(eq(users.email, "player@demo.ondula.test"), eq(parts.sourceFileName, "harbour-song.musicxml")));
    const list = await (await player.fetch(`/api/parts/${part.id}/assignments`)).json();
    expect(list.canMarkDone).toBe(true);
    const fromTeacher = list.assignments.filter((a: { assignedByName: string }) => a.assignedByName === "Teo Barral");
    expect(fromTeacher).toHaveLength(1);
    expect(fromTeacher[0]).toMatchObject({ drill: "hold-ladder", minutesPerDay: 10 });
    // On the note the seed marked as the phrase's peak.
    const [peak] = await db().select({ noteKey: markings.noteKey }).from(markings).where(and(eq(markings.partId, part.id), eq(markings.role, "peak")));
    expect(fromTeacher[0].noteKey).toBe(peak.noteKey);

    const [playerRow, teacherRow] = await Promise.all(
      ["player@demo.ondula.test", "teacher@demo.ondula.test"].map(async (email) => (await db().select().from(users).where(eq(users.email, email)))[0]),
    );
    await seedDemoAssignment({ player: playerRow, teacher: teacherRow });
    const [count] = await db().select({ n: sql<number>`count(*)::int` }).from(practiceAssignments)
      .where(and(eq(practiceAssignments.partId, part.id), eq(practiceAssignments.assignedBy, teacherRow.id)));
    expect(count.n).toBe(1);
  });
});
