import { describe, expect, it } from "vitest";
import { callAction } from "../helpers/actions";
import { linkTo, waitForMail } from "../helpers/mailbox";
import { ApiClient, createSignedInUser, signIn, uniqueEmail } from "../helpers/session";

const STUDIO = "app/(account)/studio/actions.ts";

async function inviteAndGetToken(teacher: ApiClient, email: string): Promise<string> {
  const sent = await callAction(teacher, STUDIO, "inviteAction", { email });
  expect(sent).toMatchObject({ status: 200, state: { ok: true } });
  const mail = await waitForMail(email, /invites you to their Ondula studio/);
  expect(mail.text).toContain("14 days");
  return new URL(linkTo(mail, "/studio/join")).searchParams.get("token")!;
}

describe("studios", () => {
  it("a teacher invites by e-mail; the invitee joins once with that address; the teacher sees and removes them", async () => {
    const { user: teacherUser, client: teacher } = await createSignedInUser({ role: "teacher" });
    const { user: player, client } = await createSignedInUser({ role: "player" });
    const token = await inviteAndGetToken(teacher, player.email.toUpperCase());

    const joinPage = await (await client.fetch(`/studio/join?token=${token}`)).text();
    expect(joinPage).toContain(`Join ${teacherUser.name}`);
    const joined = await callAction(client, STUDIO, "joinStudioAction", { token });
    expect(joined).toMatchObject({ status: 303, redirect: "/studio?joined=1" });
    expect(await (await client.fetch("/studio")).text()).toContain(teacherUser.email);
    expect(await (await teacher.fetch("/studio")).text()).toContain(player.email);

    const reuse = await callAction(client, STUDIO, "joinStudioAction", { token });
    expect(reuse.status).toBe(404);
    expect(reuse.state?.message).toMatch(/used already/);

    const removed = await callAction(teacher, STUDIO, "removeMemberAction", { playerId: player.id });
    expect(removed.status).toBe(200);
    expect(await (await teacher.fetch("/studio")).text()).not.toContain(player.email);
  });

  it("says clearly when the invitation was sent to another address, and lets nobody else use it", async () => {
    const { client: teacher } = await createSignedInUser({ role: "teacher" });
    const invitee = uniqueEmail("invitee");
    const token = await inviteAndGetToken(teacher, invitee);
    const { client: someoneElse } = await createSignedInUser({ role: "player" });
    // React separates text runs with comments in server HTML.
    const page = (await (await someoneElse.fetch(`/studio/join?token=${token}`)).text()).replaceAll("<!-- -->", "");
    expect(page).toContain(`This invitation was sent to ${invitee}`);
    const refused = await callAction(someoneElse, STUDIO, "joinStudioAction", { token });
    expect(refused.status).toBe(403);
    expect(refused.state?.message).toBe("This invitation was sent to a different e-mail address.");
    // Signed out, the page offers sign-in and sign-up with the address filled in.
    const anonymous = (await (await new ApiClient().fetch(`/studio/join?token=${token}`)).text()).replaceAll("&amp;", "&");
    expect(anonymous).toContain(`/sign-up?callbackUrl=%2Fstudio%2Fjoin%3Ftoken%3D${token}`);
  });

  it("signing up with the invited address and following the link makes the new account a member", async () => {
    const { user: teacherUser, client: teacher } = await createSignedInUser({ role: "teacher" });
    const email = uniqueEmail("newcomer");
    const token = await inviteAndGetToken(teacher, email);
    const anon = new ApiClient();
    const signUp = await callAction(anon, "app/(auth)/actions.ts", "signUpAction", {
      name: "Newcomer", email, password: "new-student-passphrase", role: "player", callbackUrl: `/studio/join?token=${token}`,
    });
    // Sign-up signs the new account in and goes straight on to the invitation.
    expect(signUp.redirect).toContain(`/studio/join?token=${token}`);
    const client = await signIn(email, "new-student-passphrase");
    expect((await callAction(client, STUDIO, "joinStudioAction", { token })).status).toBe(303);
    const me = await (await client.fetch("/api/me")).json();
    // The invitation reached this address, which confirms it.
    expect(me.emailVerified).toBe(true);
    expect(await (await client.fetch("/studio")).text()).toContain(teacherUser.name);
  });

  it("a player leaves a studio; an unconfirmed teacher cannot invite yet", async () => {
    const { client: teacher } = await createSignedInUser({ role: "teacher" });
    const { user: player, client } = await createSignedInUser({ role: "player" });
    const token = await inviteAndGetToken(teacher, player.email);
    await callAction(client, STUDIO, "joinStudioAction", { token });
    const html = await (await client.fetch("/studio")).text();
    const studioId = /name="studioId" value="([0-9a-f-]{36})"/.exec(html)?.[1];
    expect(studioId).toBeDefined();
    expect((await callAction(client, STUDIO, "leaveStudioAction", { studioId: studioId! })).status).toBe(200);
    expect(await (await teacher.fetch("/studio")).text()).not.toContain(player.email);

    const { client: unconfirmed } = await createSignedInUser({ role: "teacher", verified: false });
    const refused = await callAction(unconfirmed, STUDIO, "inviteAction", { email: uniqueEmail() });
    expect(refused.status).toBe(403);
    expect(refused.state?.message).toMatch(/confirmed/);
  });
});
