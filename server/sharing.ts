import "server-only";
import type { CurrentUser } from "@/lib/auth/types";
import { hashToken, newToken } from "@/lib/auth/tokens";
import { config } from "@/lib/config";
import { AppError } from "@/lib/errors";
import { shareInviteMail } from "@/lib/mail/sharing-templates";
import { PART_THREAD } from "@/lib/sharing/schemas";
import { appLink } from "@/lib/mail/templates";
import {
  acceptShareById, getLiveShareByEmail, getShareById, getShareByTokenHash, getShareDtoById, insertShare, listSharedPartsForViewer, listSharesByPartId,
  renewShareTokenById, revokeShareById, updateSharePermissionById, type ShareByToken,
} from "@/db/shares";
import { groupByStudent } from "@/lib/sharing/attention";
import type { Part, Share } from "@/db/schema";
import { markEmailVerified } from "@/db/users";
import { transaction, type Executor } from "@/db/client";
import { queueMail } from "./outbox/queue";
import { admitMailOnBehalf } from "./auth/mail-limits";
import { notifyParticipants } from "./notify";
import { loadPart } from "./parts";

/** An invitation link works for 14 days. */
export const SHARE_TTL_MS = 14 * 24 * 3600_000;
/** A pending invitation can be sent again after a minute (keeps the owner from flooding a mailbox). */
export const RESEND_INTERVAL_MS = 60_000;

const sameEmail = (a: string, b: string) => a.trim().toLowerCase() === b.trim().toLowerCase();

export function acceptPath(token: string): string {
  return `/share/accept?token=${encodeURIComponent(token)}`;
}

/** Queues the invitation in the transaction that writes its token. */
async function mailInvitation(owner: CurrentUser, part: Pick<Part, "title">, share: Pick<Share, "email" | "permission">, token: string, tx: Executor) {
  await queueMail(
    share.email,
    shareInviteMail({ ownerName: owner.name, partTitle: part.title, permission: share.permission, url: appLink(config().APP_URL, acceptPath(token)) }),
    { tx },
  );
}

export async function inviteToPart(owner: CurrentUser, part: Part, email: string, permission: "comment" | "propose"): Promise<Share> {
  if (sameEmail(email, owner.email)) {
    throw new AppError("bad_request:share_self", "This is your own address: you already have the part. Enter your teacher's e-mail address.", { field: "email" });
  }
  if (await getLiveShareByEmail({ partId: part.id, email })) {
    throw new AppError("conflict:share_exists", `This part is already shared with ${email}. Resend the invitation or change its permission in the list.`, { field: "email" });
  }
  const { token, hash } = newToken();
  return transaction(async (tx) => {
    const share = await insertShare({
      partId: part.id,
      email,
      permission,
      tokenHash: hash,
      invitedBy: owner.id,
      expiresAt: new Date(Date.now() + SHARE_TTL_MS),
      tx,
    });
    await mailInvitation(owner, part, share, token, tx);
    return share;
  });
}

export async function resendInvitation(owner: CurrentUser, part: Part, share: Share): Promise<void> {
  if (share.acceptedAt) {
    throw new AppError("conflict:share_accepted", `${share.email} has already accepted this invitation; there is nothing to resend.`);
  }
  const wait = share.lastSentAt.getTime() + RESEND_INTERVAL_MS - Date.now();
  if (wait > 0) {
    throw new AppError("rate_limited:share_resend", `The invitation was sent a moment ago. You can send it again in ${Math.ceil(wait / 1000)} seconds.`, {
      headers: { "retry-after": String(Math.ceil(wait / 1000)) },
    });
  }
  const { token, hash } = newToken();
  await transaction(async (tx) => {
    const renewed = await renewShareTokenById({ shareId: share.id, tokenHash: hash, expiresAt: new Date(Date.now() + SHARE_TTL_MS), tx });
    if (!renewed) throw new AppError("conflict:share_accepted", "This invitation was accepted or withdrawn in the meantime. Reload the list.");
    await mailInvitation(owner, part, renewed, token, tx);
  });
}

export type InvitationLookup =
  | { state: "invalid" }
  | { state: "revoked" | "expired"; invitation: ShareByToken }
  | { state: "used"; invitation: ShareByToken; byViewer: boolean }
  | { state: "wrong_account"; invitation: ShareByToken }
  | { state: "own_part"; invitation: ShareByToken }
  | { state: "ready"; invitation: ShareByToken };

/** What opening an invitation link means for this viewer (null viewer: not signed in). */
export async function lookUpInvitation(token: string, viewer: CurrentUser | null): Promise<InvitationLookup> {
  const invitation = await getShareByTokenHash({ tokenHash: hashToken(token) });
  if (!invitation) return { state: "invalid" };
  const { share } = invitation;
  if (share.revokedAt) return { state: "revoked", invitation };
  if (share.acceptedAt) return { state: "used", invitation, byViewer: !!viewer && share.userId === viewer.id };
  if (share.expiresAt.getTime() <= Date.now()) return { state: "expired", invitation };
  if (viewer && invitation.ownerId === viewer.id) return { state: "own_part", invitation };
  if (viewer && !sameEmail(viewer.email, share.email)) return { state: "wrong_account", invitation };
  return { state: "ready", invitation };
}

/**
 * Accepts an invitation for the signed-in viewer. The token proves the mailbox; the session must
 * be the account with that address. A refusal leaves the token unused.
 */
export async function acceptInvitation(token: string, viewer: CurrentUser): Promise<{ partId: string }> {
  // Admins keep to accounts and never read players' parts (see the policy module).
  if (viewer.role === "admin") {
    throw new AppError("forbidden:invitation_admin", "Admin accounts do not take part in sharing. Sign in with a player or teacher account.");
  }
  const found = await lookUpInvitation(token, viewer);
  switch (found.state) {
    case "invalid":
      throw new AppError("not_found:invitation", "This invitation link is not valid. Check that you opened the whole link from the e-mail.");
    case "revoked":
      throw new AppError("not_found:invitation", `${found.invitation.ownerName} has withdrawn this invitation.`);
    case "expired":
      throw new AppError("bad_request:invitation_expired", `This invitation has expired. Ask ${found.invitation.ownerName} to send it again.`);
    case "used":
      throw new AppError(
        "conflict:invitation_used",
        found.byViewer ? "You have already accepted this invitation; the part is in your library." : "This invitation has already been used.",
        { details: found.byViewer ? { partId: found.invitation.share.partId } : undefined },
      );
    case "own_part":
      throw new AppError("bad_request:invitation_own_part", "This is your own part; there is nothing to accept.");
    case "wrong_account":
      throw new AppError(
        "forbidden:invitation_email",
        `This invitation was sent to ${found.invitation.share.email}, but you are signed in as ${viewer.email}. Sign out and sign in (or create an account) with ${found.invitation.share.email}.`,
      );
    case "ready": {
      const ok = await acceptShareById({ shareId: found.invitation.share.id, userId: viewer.id });
      if (!ok) throw new AppError("conflict:invitation_used", "This invitation has just been used or withdrawn.");
      // The link reached this mailbox, so the address is confirmed (as with studio invitations).
      if (!viewer.emailVerified) await markEmailVerified({ userId: viewer.id });
      const { partId } = found.invitation.share;
      // The owner learns the part is now seen; part-wide, so opening the part's thread reads it.
      await notifyParticipants({
        partId,
        actorId: viewer.id,
        kind: "invitation_accepted",
        threadKey: PART_THREAD,
        summary: `${viewer.name} accepted your invitation to ${found.invitation.partTitle}`,
        onlyUserIds: [found.invitation.ownerId],
      });
      return { partId };
    }
  }
}

/** A thread key is "part" or a key of one of the part's markable notes; anything else is 404. */
export function assertThreadKey(part: Pick<Part, "noteKeys">, threadKey: string): void {
  if (threadKey === PART_THREAD) return;
  if (!part.noteKeys.includes(threadKey)) {
    throw new AppError("not_found:note", "That note is not in this part. Reload the page: the part may have changed.");
  }
}

/**
 * Parts other people shared with the viewer, grouped by student and sorted by what needs
 * attention. Only the viewer's own live shares are read, so no further policy check applies.
 */
export async function listSharedParts(user: CurrentUser) {
  return { students: groupByStudent(await listSharedPartsForViewer({ viewerId: user.id })) };
}

export async function listShares(user: CurrentUser, partId: string) {
  await loadPart(user, partId, "part:share");
  return { shares: await listSharesByPartId({ partId }) };
}

export async function sharePart(user: CurrentUser, o: { partId: string; email: string; permission: "comment" | "propose" }) {
  const { part } = await loadPart(user, o.partId, "part:share");
  // Mail on the owner's behalf: a confirmed address and the per-sender/recipient limits first.
  const sent = await admitMailOnBehalf(user, o.email, `part:${o.partId}`);
  const share = await inviteToPart(user, part, o.email, o.permission);
  await sent();
  return getShareDtoById({ partId: o.partId, shareId: share.id });
}

async function loadShare(user: CurrentUser, partId: string, shareId: string) {
  const { part } = await loadPart(user, partId, "part:share");
  const share = await getShareById({ partId, shareId });
  if (!share) throw new AppError("not_found:share", "This invitation does not exist or has been withdrawn. Reload the list.");
  return { part, share };
}

export async function changeSharePermission(user: CurrentUser, o: { partId: string; shareId: string; permission: "comment" | "propose" }) {
  await loadShare(user, o.partId, o.shareId);
  await updateSharePermissionById({ shareId: o.shareId, permission: o.permission });
  return getShareDtoById({ partId: o.partId, shareId: o.shareId });
}

/** Revokes at once: every later request of that person is checked against the share and fails. */
export async function revokeShare(user: CurrentUser, o: { partId: string; shareId: string }): Promise<{ id: string; revoked: true }> {
  await loadShare(user, o.partId, o.shareId);
  await revokeShareById({ shareId: o.shareId });
  return { id: o.shareId, revoked: true };
}

export async function resendShare(user: CurrentUser, o: { partId: string; shareId: string }) {
  const { part, share } = await loadShare(user, o.partId, o.shareId);
  const sent = await admitMailOnBehalf(user, share.email, `part:${o.partId}`);
  await resendInvitation(user, part, share);
  await sent();
  return getShareDtoById({ partId: o.partId, shareId: o.shareId });
}
