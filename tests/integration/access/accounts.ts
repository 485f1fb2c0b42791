import { db } from "@/db/client";
import { studioMembers } from "@/db/schema";
import { createInvitation } from "@/db/studios";
import { issueToken } from "@/db/tokens";
import { statuses, type AccessModule, type MatrixContext, type Persona } from "../../helpers/access-matrix";
import { createUser, uniqueAddress, uniqueEmail } from "../../helpers/session";

/** Accounts, sign-in, the admin table, studios and the local mailbox. */

const AUTH = "app/(auth)/actions.ts";
const SETTINGS = "app/(account)/settings/actions.ts";
const ADMIN = "app/(account)/admin/users/actions.ts";
const STUDIO = "app/(account)/studio/actions.ts";

const adminOnly = statuses(404, { anonymous: 401, admin: 200 });
const signedIn = statuses(200, { anonymous: 401 });

const emailOf = (ctx: MatrixContext, persona: Persona) => (persona === "anonymous" ? uniqueEmail("anon") : ctx.users[persona].email);

export const accessModule: AccessModule = {
  routes: [
    { method: "GET", route: "/api/auth/[...nextauth]", label: "session", request: () => ({ path: "/api/auth/session" }), expect: statuses(200) },
    {
      method: "POST",
      route: "/api/auth/[...nextauth]",
      label: "sign in with e-mail and password",
      request: async (_ctx, _persona, client) => {
        const probe = await createUser();
        const { csrfToken } = (await (await client.fetch("/api/auth/csrf")).json()) as { csrfToken: string };
        return {
          path: "/api/auth/callback/credentials",
          init: {
            method: "POST",
            headers: { "content-type": "application/x-www-form-urlencoded", "x-forwarded-for": uniqueAddress() },
            body: new URLSearchParams({ email: probe.email, password: probe.password, csrfToken, json: "true" }),
          },
        };
      },
      expect: statuses(200),
    },
    {
      method: "POST",
      route: "/api/auth/[...nextauth]",
      label: "sign in with an e-mailed link",
      request: async (_ctx, _persona, client) => {
        const probe = await createUser();
        const token = await issueToken({ purpose: "sign_in_link", userId: probe.id, email: probe.email });
        const { csrfToken } = (await (await client.fetch("/api/auth/csrf")).json()) as { csrfToken: string };
        return {
          path: "/api/auth/callback/sign-in-link",
          init: {
            method: "POST",
            headers: { "content-type": "application/x-www-form-urlencoded", "x-forwarded-for": uniqueAddress() },
            body: new URLSearchParams({ token, csrfToken, json: "true" }),
          },
        };
      },
      expect: statuses(200),
    },
    { method: "GET", route: "/api/dev/mail", request: () => ({ path: "/api/dev/mail?to=nobody%40test.ondula.test" }), expect: statuses(200) },
    { method: "GET", route: "/api/health", request: () => ({ path: "/api/health" }), expect: statuses(200) },
    { method: "GET", route: "/api/me", request: () => ({ path: "/api/me" }), expect: signedIn },
    { method: "GET", route: "/api/admin/users", request: () => ({ path: "/api/admin/users?q=matrix&sort=email" }), expect: adminOnly },
    {
      method: "PATCH",
      route: "/api/admin/users/[userId]",
      request: async () => {
        const target = await createUser();
        return {
          path: `/api/admin/users/${target.id}`,
          init: { method: "PATCH", headers: { "content-type": "application/json" }, body: JSON.stringify({ role: "teacher" }) },
        };
      },
      expect: adminOnly,
    },
  ],
  actions: [
    {
      action: `${AUTH}#signUpAction`,
      fields: () => ({ name: "Matrix sign-up", email: uniqueEmail("matrix"), password: "matrix-calm-passphrase", role: "player" }),
      expect: statuses(303),
    },
    {
      action: `${AUTH}#verifyEmailAction`,
      fields: async () => {
        const user = await createUser({ verified: false });
        return { token: await issueToken({ purpose: "verify_email", userId: user.id, email: user.email }) };
      },
      expect: statuses(200),
    },
    { action: `${AUTH}#resendVerificationAction`, fields: () => ({}), expect: signedIn },
    {
      action: `${AUTH}#forgotPasswordAction`,
      fields: () => ({ email: uniqueEmail("forgot") }),
      headers: { "x-forwarded-for": uniqueAddress() },
      expect: statuses(200),
    },
    {
      action: `${AUTH}#requestSignInLinkAction`,
      label: "the persona's own address (anonymous: an unknown one); the same answer for all",
      fields: (ctx, persona) => ({ email: emailOf(ctx, persona) }),
      headers: { "x-forwarded-for": uniqueAddress() },
      expect: statuses(200),
    },
    {
      action: `${AUTH}#resetPasswordAction`,
      fields: async () => {
        const user = await createUser();
        const token = await issueToken({ purpose: "reset_password", userId: user.id, email: user.email });
        return { token, password: "matrix-new-passphrase", confirm: "matrix-new-passphrase" };
      },
      expect: statuses(303),
    },
    { action: `${SETTINGS}#updateProfileAction`, fields: () => ({ name: "Matrix person", emailNotifications: "on" }), expect: signedIn },
    {
      action: `${SETTINGS}#changePasswordAction`,
      label: "with a wrong current password (a right one would end the persona's session)",
      fields: () => ({ current: "not-the-password", next: "matrix-next-passphrase", confirm: "matrix-next-passphrase" }),
      expect: statuses(400, { anonymous: 401 }),
    },
    {
      action: `${ADMIN}#setRoleAction`,
      fields: async () => ({ userId: (await createUser()).id, role: "teacher" }),
      expect: adminOnly,
    },
    {
      action: `${ADMIN}#setStatusAction`,
      fields: async () => ({ userId: (await createUser()).id, status: "disabled" }),
      expect: adminOnly,
    },
    {
      action: `${STUDIO}#inviteAction`,
      fields: () => ({ email: uniqueEmail("invited") }),
      expect: { anonymous: 401, otherPlayer: 404, owner: 404, teacherWithAccess: 200, teacherWithout: 200, admin: 404 },
    },
    {
      action: `${STUDIO}#removeMemberAction`,
      label: "a member of teacherWithAccess's studio",
      fields: async (ctx) => {
        const member = await createUser();
        await db().insert(studioMembers).values({ studioId: ctx.studioId, playerId: member.id });
        return { playerId: member.id };
      },
      expect: { anonymous: 401, otherPlayer: 404, owner: 404, teacherWithAccess: 200, teacherWithout: 404, admin: 404 },
    },
    {
      action: `${STUDIO}#leaveStudioAction`,
      label: "teacherWithAccess's studio",
      fields: async (ctx) => {
        // The owner may have left in an earlier cell; each cell starts with them in the studio.
        await db().insert(studioMembers).values({ studioId: ctx.studioId, playerId: ctx.users.owner.id }).onConflictDoNothing();
        return { studioId: ctx.studioId };
      },
      expect: { anonymous: 401, otherPlayer: 404, owner: 200, teacherWithAccess: 403, teacherWithout: 404, admin: 404 },
    },
    {
      action: `${STUDIO}#joinStudioAction`,
      label: "an invitation to teacherWithAccess's studio sent to the persona's own address",
      fields: async (ctx, persona) => ({ token: await createInvitation({ studioId: ctx.studioId, email: emailOf(ctx, persona) }) }),
      expect: { anonymous: 401, otherPlayer: 303, owner: 303, teacherWithAccess: 403, teacherWithout: 303, admin: 403 },
    },
    {
      action: `${STUDIO}#joinStudioAction`,
      label: "an invitation sent to someone else",
      fields: async (ctx) => ({ token: await createInvitation({ studioId: ctx.studioId, email: uniqueEmail("elsewhere") }) }),
      expect: statuses(403, { anonymous: 401 }),
    },
  ],
};
