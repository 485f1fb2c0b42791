import { AppError } from "@/lib/errors";
import type { CurrentUser } from "./types";

/**
 * The one authorization policy. Every route handler and server action asks it before touching
 * data; it is pure (the caller loads the resource and, for parts, the viewer's share), so it is
 * tested as a table.
 *
 * Decisions recorded here:
 * - Admins manage accounts (roles, disabling) and nothing else: they do not read players'
 *   parts, markings or studios. A part is visible only to its owner and to people it is shared with.
 * - A resource that is not visible answers 404, never 403, so its existence does not leak.
 * - Sending mail on someone's behalf (studio invitations) needs a confirmed e-mail address, so an
 *   unconfirmed account cannot use Ondula to mail strangers.
 * - Admins do not join studios (an invitation to an admin's address cannot be accepted).
 * - Admins cannot change their own role or disable themselves (no lock-out by accident).
 * - A part's practice log and takes are the owner's: only the owner writes them; a teacher the
 *   part is shared with may read them (following progress is part of teaching), nobody else —
 *   not a fellow player it is shared with.
 * - A proposal is withdrawn only by its author, and only while they still see the part (a
 *   downgraded share may still take back what it proposed). Whether it is still open is a
 *   question of state, answered 409 by the route, not of rights.
 * - Practice assignments are set by a teacher the part is shared with (either permission: setting
 *   practice changes nothing of the player's own work), for the part's owner. Only the teacher who
 *   set one edits or removes it; only the owner ticks it done or open again. Everyone who sees
 *   the part sees its assignments.
 */

export type SharePermission = "comment" | "propose";

export interface PartRef {
  id: string;
  ownerId: string;
}

/** The viewer's accepted, unrevoked share of the part (null when there is none). */
export interface ShareRef {
  permission: SharePermission;
}

export interface StudioRef {
  id: string;
  teacherId: string;
}

export type Resource =
  | { type: "site" }
  | { type: "account"; account: { id: string } }
  | { type: "studio"; studio: StudioRef; isMember: boolean }
  | { type: "studio_member"; studio: StudioRef; playerId: string }
  | { type: "invitation"; invitation: { email: string }; studio: StudioRef }
  | { type: "part"; part: PartRef; share?: ShareRef | null }
  | { type: "proposal"; part: PartRef; share?: ShareRef | null; proposal: { authorId: string } }
  | { type: "assignment"; part: PartRef; share?: ShareRef | null; assignment: { assignedBy: string } };

export type Action =
  | "admin:list_users"
  | "account:edit"
  | "account:change_role"
  | "account:set_status"
  | "studio:own"
  | "studio:view"
  | "studio:invite"
  | "studio:remove_member"
  | "studio:leave"
  | "invitation:accept"
  | "part:create"
  | "part:view"
  | "part:edit"
  | "part:delete"
  | "part:share"
  | "part:comment"
  | "part:propose"
  | "marking:write"
  | "proposal:withdraw"
  | "practice:view"
  | "practice:write"
  | "assignment:view"
  | "assignment:create"
  | "assignment:edit"
  | "assignment:delete"
  | "assignment:mark_done";

type ResourceType = Resource["type"];

/** Which resource each action applies to; a mismatch is a programming error, caught in tests. */
export const ACTION_RESOURCE: Record<Action, ResourceType> = {
  "admin:list_users": "site",
  "account:edit": "account",
  "account:change_role": "account",
  "account:set_status": "account",
  "studio:own": "site",
  "studio:view": "studio",
  "studio:invite": "studio",
  "studio:remove_member": "studio_member",
  "studio:leave": "studio",
  "invitation:accept": "invitation",
  "part:create": "site",
  "part:view": "part",
  "part:edit": "part",
  "part:delete": "part",
  "part:share": "part",
  "part:comment": "part",
  "part:propose": "part",
  "marking:write": "part",
  "proposal:withdraw": "proposal",
  "practice:view": "part",
  "practice:write": "part",
  "assignment:view": "part",
  "assignment:create": "part",
  "assignment:edit": "assignment",
  "assignment:delete": "assignment",
  "assignment:mark_done": "assignment",
};

const isAdmin = (u: CurrentUser) => u.role === "admin";
const sameEmail = (a: string, b: string) => a.trim().toLowerCase() === b.trim().toLowerCase();

/** Whether the resource exists as far as this user may know. */
function visible(user: CurrentUser, action: Action, resource: Resource): boolean {
  switch (resource.type) {
    case "site":
      if (action === "admin:list_users") return isAdmin(user);
      if (action === "studio:own") return user.role === "teacher";
      return true;
    case "account":
      return isAdmin(user) || resource.account.id === user.id;
    case "studio":
      return resource.studio.teacherId === user.id || resource.isMember;
    case "studio_member":
      return resource.studio.teacherId === user.id || resource.playerId === user.id;
    case "invitation":
      // Whoever holds the token may see where it leads; acceptance checks the address.
      return true;
    case "part":
    case "proposal":
    case "assignment":
      return resource.part.ownerId === user.id || !!resource.share;
  }
}

/** A teacher with a live share of someone else's part (studio membership alone grants nothing). */
const sharedTeacher = (user: CurrentUser, r: { part: PartRef; share?: ShareRef | null }) =>
  user.role === "teacher" && r.part.ownerId !== user.id && !!r.share;

function allowed(user: CurrentUser, action: Action, resource: Resource): boolean {
  switch (action) {
    case "admin:list_users":
      return isAdmin(user);
    case "account:edit":
      return resource.type === "account" && resource.account.id === user.id;
    case "account:change_role":
    case "account:set_status":
      return resource.type === "account" && isAdmin(user) && resource.account.id !== user.id;
    case "studio:own":
      return user.role === "teacher";
    case "studio:view":
      return resource.type === "studio" && (resource.studio.teacherId === user.id || resource.isMember);
    case "studio:invite":
      return (
        resource.type === "studio" && user.role === "teacher" && resource.studio.teacherId === user.id && user.emailVerified
      );
    case "studio:remove_member":
      return resource.type === "studio_member" && user.role === "teacher" && resource.studio.teacherId === user.id;
    case "studio:leave":
      return resource.type === "studio" && resource.isMember && resource.studio.teacherId !== user.id;
    case "invitation:accept":
      return (
        resource.type === "invitation" && !isAdmin(user) && sameEmail(resource.invitation.email, user.email) &&
        resource.studio.teacherId !== user.id
      );
    case "part:create":
      // Admins keep to accounts; players and teachers both work on their own parts.
      return !isAdmin(user);
    case "part:view":
    case "part:comment":
      return resource.type === "part" && (resource.part.ownerId === user.id || !!resource.share);
    case "practice:view":
      // Following progress is a teacher's; a fellow player the part is shared with sees the
      // music and the discussion, not the owner's practice log or recordings.
      return resource.type === "part" && (resource.part.ownerId === user.id || (!!resource.share && user.role === "teacher"));
    case "part:edit":
    case "part:delete":
    case "part:share":
    case "marking:write":
    case "practice:write":
      return resource.type === "part" && resource.part.ownerId === user.id;
    case "part:propose":
      return resource.type === "part" && resource.part.ownerId !== user.id && resource.share?.permission === "propose";
    case "proposal:withdraw":
      return resource.type === "proposal" && resource.proposal.authorId === user.id;
    case "assignment:view":
      return resource.type === "part" && (resource.part.ownerId === user.id || !!resource.share);
    case "assignment:create":
      return resource.type === "part" && sharedTeacher(user, resource);
    case "assignment:edit":
    case "assignment:delete":
      return resource.type === "assignment" && sharedTeacher(user, resource) && resource.assignment.assignedBy === user.id;
    case "assignment:mark_done":
      return resource.type === "assignment" && resource.part.ownerId === user.id;
  }
}

export function can(user: CurrentUser | null, action: Action, resource: Resource): boolean {
  if (!user) return false;
  if (ACTION_RESOURCE[action] !== resource.type) return false;
  return visible(user, action, resource) && allowed(user, action, resource);
}

const FORBIDDEN_MESSAGES: Partial<Record<Action, string>> = {
  "account:change_role": "Admins cannot change their own role.",
  "account:set_status": "Admins cannot disable their own account.",
  "studio:invite": "Only the studio's teacher can invite, once their e-mail address is confirmed.",
  "invitation:accept": "This invitation was sent to a different e-mail address.",
  "part:propose": "Proposals need a share with the propose permission.",
  "practice:write": "Only the part's owner keeps its practice log and takes.",
  "practice:view": "Only the part's owner and the teachers it is shared with see its practice log and takes.",
  "proposal:withdraw": "Only the person who made this proposal can withdraw it; the part's owner accepts or declines it.",
  "assignment:create": "Only a teacher this part is shared with can assign practice on it.",
  "assignment:edit": "Only the teacher who set this practice can change it; its player can mark it done.",
  "assignment:delete": "Only the teacher who set this practice can remove it.",
  "assignment:mark_done": "Only the player who owns the part marks its practice done.",
};

/**
 * Throws when `can` is false: 401 without a session, 404 when the resource is not visible to the
 * user (existence does not leak), 403 when it is visible but the action is not allowed.
 */
export function assertCan(user: CurrentUser | null, action: Action, resource: Resource): asserts user is CurrentUser {
  if (!user) throw new AppError("unauthorized:session", "Sign in to continue.");
  if (ACTION_RESOURCE[action] !== resource.type) {
    throw new Error(`policy: action ${action} does not apply to a ${resource.type}`);
  }
  const noun = resource.type === "site" ? "page" : resource.type;
  if (!visible(user, action, resource)) throw new AppError(`not_found:${noun}`, "Not found.");
  if (!allowed(user, action, resource)) {
    throw new AppError(`forbidden:${noun}`, FORBIDDEN_MESSAGES[action] ?? "You do not have permission to do that.");
  }
}
