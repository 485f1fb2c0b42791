import { describe, expect, it } from "vitest";
import { AppError } from "@/lib/errors";
import { assertCan, can, type Action, type Resource } from "./policy";
import type { CurrentUser } from "./types";

const person = (id: string, role: CurrentUser["role"], emailVerified = true): CurrentUser => ({
  id, email: `${id}@example.test`, name: id, role, emailVerified,
});

const owner = person("owner", "player");
const otherPlayer = person("other", "player");
const teacherComment = person("t-comment", "teacher");
const teacherPropose = person("t-propose", "teacher");
const teacherNone = person("t-none", "teacher");
const teacherUnverified = person("t-unverified", "teacher", false);
const admin = person("admin", "admin");

const part = { id: "p1", ownerId: owner.id };
/** What the route would load: the viewer's own share of the part, if any. */
const shareOf = (viewer: CurrentUser | null) =>
  viewer === teacherComment ? { permission: "comment" as const } : viewer === teacherPropose ? { permission: "propose" as const } : null;
const partAs = (viewer: CurrentUser | null): Resource => ({ type: "part", part, share: shareOf(viewer) });

type Expect = "ok" | 401 | 403 | 404;
const viewers = [null, owner, otherPlayer, teacherComment, teacherPropose, teacherNone, admin] as const;
const cols = ["anon", "owner", "otherPlayer", "teacherComment", "teacherPropose", "teacherNone", "admin"];

// One row per part action: the expected outcome for each viewer column above.
const partTable: Array<[Action, Expect[]]> = [
  ["part:view", [401, "ok", 404, "ok", "ok", 404, 404]],
  ["part:edit", [401, "ok", 404, 403, 403, 404, 404]],
  ["part:delete", [401, "ok", 404, 403, 403, 404, 404]],
  ["part:share", [401, "ok", 404, 403, 403, 404, 404]],
  ["marking:write", [401, "ok", 404, 403, 403, 404, 404]],
  ["part:comment", [401, "ok", 404, "ok", "ok", 404, 404]],
  ["part:propose", [401, 403, 404, 403, "ok", 404, 404]],
  ["practice:view", [401, "ok", 404, "ok", "ok", 404, 404]],
  ["practice:write", [401, "ok", 404, 403, 403, 404, 404]],
  ["assignment:view", [401, "ok", 404, "ok", "ok", 404, 404]],
  ["assignment:create", [401, 403, 404, "ok", "ok", 404, 404]],
];

function outcome(user: CurrentUser | null, action: Action, resource: Resource): Expect {
  try {
    assertCan(user, action, resource);
    return "ok";
  } catch (e) {
    if (e instanceof AppError) return e.status as Expect;
    throw e;
  }
}

describe("policy: parts", () => {
  for (const [action, expected] of partTable) {
    viewers.forEach((viewer, i) => {
      it(`${action} as ${cols[i]} → ${expected[i]}`, () => {
        const resource = partAs(viewer);
        expect(outcome(viewer, action, resource)).toBe(expected[i]);
        expect(can(viewer, action, resource)).toBe(expected[i] === "ok");
      });
    });
  }

  it("a share on a part never lets an admin read it without one (privacy)", () => {
    expect(can(admin, "part:view", { type: "part", part, share: null })).toBe(false);
  });
});

describe("policy: withdrawing a proposal", () => {
  /** A proposal on the owner's part, made by the teacher with the propose permission. */
  const proposalAs = (viewer: CurrentUser | null, authorId = teacherPropose.id): Resource => {
    const { share } = partAs(viewer) as Extract<Resource, { type: "part" }>;
    return { type: "proposal", part, share, proposal: { authorId } };
  };
  // Columns as in the part table: anon, owner, otherPlayer, teacherComment, teacherPropose, teacherNone, admin.
  const expected: Expect[] = [401, 403, 404, 403, "ok", 404, 404];
  viewers.forEach((viewer, i) => {
    it(`proposal:withdraw as ${cols[i]} → ${expected[i]}`, () => {
      expect(outcome(viewer, "proposal:withdraw", proposalAs(viewer))).toBe(expected[i]);
      expect(can(viewer, "proposal:withdraw", proposalAs(viewer))).toBe(expected[i] === "ok");
    });
  });

  it("lets an author whose share was narrowed to comment still take back their own proposal", () => {
    expect(can(teacherComment, "proposal:withdraw", proposalAs(teacherComment, teacherComment.id))).toBe(true);
  });

  it("refuses an author who no longer sees the part, as if it did not exist", () => {
    expect(outcome(teacherNone, "proposal:withdraw", proposalAs(teacherNone, teacherNone.id))).toBe(404);
  });

  it("does not apply to a part resource", () => {
    expect(can(teacherPropose, "proposal:withdraw", partAs(teacherPropose))).toBe(false);
  });
});

describe("policy: practice assignments", () => {
  /** An assignment on the owner's part set by `by`, as the route would load it for `viewer`. */
  const assignmentAs = (viewer: CurrentUser | null, by: CurrentUser): Resource => ({
    type: "assignment",
    part,
    share: shareOf(viewer),
    assignment: { assignedBy: by.id },
  });
  // Columns as above: anon, owner, otherPlayer, teacherComment, teacherPropose, teacherNone, admin.
  const table: Array<[Action, CurrentUser, Expect[]]> = [
    ["assignment:edit", teacherComment, [401, 403, 404, "ok", 403, 404, 404]],
    ["assignment:delete", teacherComment, [401, 403, 404, "ok", 403, 404, 404]],
    ["assignment:edit", teacherPropose, [401, 403, 404, 403, "ok", 404, 404]],
    ["assignment:mark_done", teacherComment, [401, "ok", 404, 403, 403, 404, 404]],
  ];
  for (const [action, by, expected] of table) {
    viewers.forEach((viewer, i) => {
      it(`${action} of ${by.id}'s assignment as ${cols[i]} → ${expected[i]}`, () => {
        const resource = assignmentAs(viewer, by);
        expect(outcome(viewer, action, resource)).toBe(expected[i]);
        expect(can(viewer, action, resource)).toBe(expected[i] === "ok");
      });
    });
  }

  it("refuses practice from a player the part is shared with, and from a teacher on their own part", () => {
    const sharedPlayer = person("shared-player", "player");
    expect(can(sharedPlayer, "assignment:create", { type: "part", part, share: { permission: "propose" } })).toBe(false);
    const teachersPart = { id: "p2", ownerId: teacherNone.id };
    expect(can(teacherNone, "assignment:create", { type: "part", part: teachersPart, share: null })).toBe(false);
  });

  it("keeps an assignment's author from editing once their share is gone (then it is not found)", () => {
    expect(outcome(teacherNone, "assignment:edit", { type: "assignment", part, share: null, assignment: { assignedBy: teacherNone.id } })).toBe(404);
  });
});

describe("policy: accounts and studios", () => {
  const studio = { id: "s1", teacherId: teacherNone.id };
  const member = person("member", "player");
  const studioAs = (u: CurrentUser | null): Resource => ({ type: "studio", studio, isMember: u === member });

  const table: Array<[string, CurrentUser | null, Action, Resource, Expect]> = [
    ["anonymous lists users", null, "admin:list_users", { type: "site" }, 401],
    ["a player lists users", owner, "admin:list_users", { type: "site" }, 404],
    ["a teacher lists users", teacherNone, "admin:list_users", { type: "site" }, 404],
    ["an admin lists users", admin, "admin:list_users", { type: "site" }, "ok"],
    ["an admin changes a player's role", admin, "account:change_role", { type: "account", account: { id: owner.id } }, "ok"],
    ["an admin changes their own role", admin, "account:change_role", { type: "account", account: { id: admin.id } }, 403],
    ["an admin disables a teacher", admin, "account:set_status", { type: "account", account: { id: teacherNone.id } }, "ok"],
    ["a player changes another's role", owner, "account:change_role", { type: "account", account: { id: otherPlayer.id } }, 404],
    ["a player changes their own role", owner, "account:change_role", { type: "account", account: { id: owner.id } }, 403],
    ["a player edits their own account", owner, "account:edit", { type: "account", account: { id: owner.id } }, "ok"],
    ["an admin edits another's settings", admin, "account:edit", { type: "account", account: { id: owner.id } }, 403],
    ["a teacher owns a studio", teacherNone, "studio:own", { type: "site" }, "ok"],
    ["a player owns a studio", owner, "studio:own", { type: "site" }, 404],
    ["the teacher views the studio", teacherNone, "studio:view", studioAs(teacherNone), "ok"],
    ["a member views the studio", member, "studio:view", studioAs(member), "ok"],
    ["a stranger views the studio", otherPlayer, "studio:view", studioAs(otherPlayer), 404],
    ["an admin views a studio", admin, "studio:view", studioAs(admin), 404],
    ["the teacher invites", teacherNone, "studio:invite", studioAs(teacherNone), "ok"],
    ["a member invites", member, "studio:invite", studioAs(member), 403],
    ["another teacher invites", teacherComment, "studio:invite", studioAs(teacherComment), 404],
    ["an unverified teacher invites to their studio", teacherUnverified, "studio:invite",
      { type: "studio", studio: { id: "s2", teacherId: teacherUnverified.id }, isMember: false }, 403],
    ["the teacher removes a member", teacherNone, "studio:remove_member", { type: "studio_member", studio, playerId: member.id }, "ok"],
    ["a member removes another member", member, "studio:remove_member", { type: "studio_member", studio, playerId: otherPlayer.id }, 404],
    ["a member removes themselves (use leave)", member, "studio:remove_member", { type: "studio_member", studio, playerId: member.id }, 403],
    ["a member leaves", member, "studio:leave", studioAs(member), "ok"],
    ["the teacher leaves their own studio", teacherNone, "studio:leave", studioAs(teacherNone), 403],
    ["a stranger leaves", otherPlayer, "studio:leave", studioAs(otherPlayer), 404],
    ["the invitee accepts (address differs in case only)", owner, "invitation:accept", { type: "invitation", invitation: { email: "OWNER@example.test" }, studio }, "ok"],
    ["someone else accepts", otherPlayer, "invitation:accept", { type: "invitation", invitation: { email: owner.email }, studio }, 403],
    ["anonymous accepts", null, "invitation:accept", { type: "invitation", invitation: { email: owner.email }, studio }, 401],
    ["the teacher accepts an invitation to their own studio", teacherNone, "invitation:accept",
      { type: "invitation", invitation: { email: teacherNone.email }, studio }, 403],
    ["an admin accepts an invitation sent to them", admin, "invitation:accept",
      { type: "invitation", invitation: { email: admin.email }, studio }, 403],
    ["a player creates a part", owner, "part:create", { type: "site" }, "ok"],
    ["a teacher creates a part", teacherNone, "part:create", { type: "site" }, "ok"],
    ["an admin creates a part", admin, "part:create", { type: "site" }, 403],
  ];

  for (const [name, user, action, resource, expected] of table) {
    it(`${name} → ${expected}`, () => {
      expect(outcome(user, action, resource)).toBe(expected);
      expect(can(user, action, resource)).toBe(expected === "ok");
    });
  }

  it("answers false for an action applied to the wrong kind of resource", () => {
    expect(can(owner, "part:view", { type: "site" })).toBe(false);
    expect(() => assertCan(owner, "part:view", { type: "site" })).toThrow(/does not apply/);
  });

  it("uses error codes whose kind gives the HTTP status", () => {
    try {
      assertCan(otherPlayer, "part:view", partAs(otherPlayer));
    } catch (e) {
      expect((e as AppError).code).toBe("not_found:part");
    }
    try {
      assertCan(teacherComment, "part:edit", partAs(teacherComment));
    } catch (e) {
      expect((e as AppError).code).toBe("forbidden:part");
    }
  });
});

describe("practice log and takes (docs/accounts.md: a teacher the part is shared with may read them, nobody else)", () => {
  it("lets a player the part is shared with see the part but not the owner's practice", () => {
    const shared: Resource = { type: "part", part, share: { permission: "comment" } };
    expect(can(otherPlayer, "part:view", shared)).toBe(true);
    expect(can(otherPlayer, "practice:view", shared)).toBe(false);
    expect(() => assertCan(otherPlayer, "practice:view", shared)).toThrow(/teachers it is shared with/);
    expect(can(teacherComment, "practice:view", shared)).toBe(true);
  });
});
