import "server-only";
import { admitMailOnBehalf } from "@/server/auth/mail-limits";
import {
  acceptInvitation, createInvitation, ensureStudioForTeacher, getInvitationByToken, getStudioById, isStudioMember,
  listOpenInvitations, listStudioMembers, listStudiosByPlayerId, removeStudioMember,
} from "@/db/studios";
import { listPracticeProgressForTeacher } from "@/db/assignments";
import { utcIsoDate } from "@/lib/assignments/due";
import { groupProgressByStudent, progressWindowStart } from "@/lib/assignments/progress";
import { getUserByEmail, markEmailVerified } from "@/db/users";
import { assertCan } from "@/lib/auth/policy";
import type { CurrentUser } from "@/lib/auth/types";
import { config } from "@/lib/config";
import { AppError } from "@/lib/errors";
import { transaction } from "@/db/client";
import { queueMail } from "@/server/outbox/queue";
import { appLink, studioInviteMail } from "@/lib/mail/templates";

/** The teacher's own studio (created on first use); 404 for anyone who is not a teacher. */
export async function ownStudio(user: CurrentUser | null) {
  assertCan(user, "studio:own", { type: "site" });
  return ensureStudioForTeacher({ teacherId: user.id, teacherName: user.name });
}

export async function inviteToStudio(user: CurrentUser, { email }: { email: string }) {
  const studio = await ownStudio(user);
  assertCan(user, "studio:invite", { type: "studio", studio, isMember: false });
  if (email.trim().toLowerCase() === user.email.toLowerCase()) {
    throw new AppError("bad_request:email", "You cannot invite yourself.", { field: "email" });
  }
  const existing = await getUserByEmail({ email });
  if (existing && (await isStudioMember({ studioId: studio.id, playerId: existing.id }))) {
    throw new AppError("conflict:member", "This person is already in your studio.", { field: "email" });
  }
  const sent = await admitMailOnBehalf(user, email, `studio:${studio.id}`);
  // The invitation and its e-mail are kept together or not at all.
  await transaction(async (tx) => {
    const token = await createInvitation({ studioId: studio.id, email, tx });
    await queueMail(email, studioInviteMail({
      teacherName: user.name, studioName: studio.name, url: appLink(config().APP_URL, "/studio/join", { token }),
    }), { tx });
  });
  await sent();
}

export async function removeMember(user: CurrentUser, { playerId }: { playerId: string }) {
  const studio = await ownStudio(user);
  assertCan(user, "studio:remove_member", { type: "studio_member", studio, playerId });
  if (!(await removeStudioMember({ studioId: studio.id, playerId }))) {
    throw new AppError("not_found:member", "This person is not in your studio.");
  }
}

export async function leaveStudio(user: CurrentUser, { studioId }: { studioId: string }) {
  const studio = await getStudioById({ studioId });
  if (!studio) throw new AppError("not_found:studio", "Not found.");
  assertCan(user, "studio:leave", { type: "studio", studio, isMember: await isStudioMember({ studioId, playerId: user.id }) });
  await removeStudioMember({ studioId, playerId: user.id });
}

export type InvitationView =
  | { state: "invalid" | "used" | "expired" }
  | { state: "open"; email: string; studioName: string; teacherName: string; studioId: string; teacherId: string; id: string };

export async function viewInvitation({ token }: { token: string }): Promise<InvitationView> {
  const inv = await getInvitationByToken({ token });
  if (!inv) return { state: "invalid" };
  if (inv.acceptedAt) return { state: "used" };
  if (inv.expiresAt <= new Date()) return { state: "expired" };
  return { state: "open", email: inv.email, studioName: inv.studioName, teacherName: inv.teacherName, studioId: inv.studioId, teacherId: inv.teacherId, id: inv.id };
}

export async function joinStudio(user: CurrentUser | null, { token }: { token: string }) {
  const inv = await viewInvitation({ token });
  if (inv.state !== "open") {
    throw new AppError("not_found:invitation", inv.state === "invalid" ? "This invitation link is not valid." : `This invitation has been ${inv.state === "used" ? "used already" : "expired"}.`);
  }
  assertCan(user, "invitation:accept", { type: "invitation", invitation: { email: inv.email }, studio: { id: inv.studioId, teacherId: inv.teacherId } });
  if (!(await acceptInvitation({ invitationId: inv.id, studioId: inv.studioId, userId: user.id }))) {
    throw new AppError("conflict:invitation", "This invitation has been used already.");
  }
  // The link reached this address, which confirms it.
  await markEmailVerified({ userId: user.id });
  return inv;
}

/** A player's studios: the teachers whose studios they belong to. */
export async function listMyStudios(user: CurrentUser) {
  return listStudiosByPlayerId({ playerId: user.id });
}

/** A teacher's studio page: members, open invitations and their students' practice progress. */
export async function loadOwnStudio(user: CurrentUser) {
  const studio = await ownStudio(user);
  const now = new Date();
  const [members, invitations, progress] = await Promise.all([
    listStudioMembers({ studioId: studio.id }),
    listOpenInvitations({ studioId: studio.id }),
    // The server's calendar is UTC: a due date counts as passed once the UTC day has moved on.
    listPracticeProgressForTeacher({ teacherId: user.id, today: utcIsoDate(now), since: progressWindowStart(now) }),
  ]);
  return { studio, members, invitations, students: groupProgressByStudent(progress) };
}
