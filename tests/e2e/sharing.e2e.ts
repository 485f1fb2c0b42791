import fs from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { launchContext, screenshotPath } from "../helpers/browser";
import { APP_URL } from "../helpers/env";
import { createUser, type TestUser } from "../helpers/session";
import { measureSideTabs } from "../helpers/pages";
import { passEmailWindow, waitForMails } from "../helpers/sharing";

const FIXTURE = path.resolve("tests/fixtures/sharing/two-bars.musicxml");
const DIGEST = /new(?: items)? on “/;

async function signInThroughForm(page: Page, user: TestUser) {
  await page.getByLabel("E-mail").fill(user.email);
  await page.getByLabel("Password").fill(user.password);
  await page.getByRole("button", { name: "Sign in" }).click();
}

async function waitForScore(page: Page) {
  await page.locator('[data-layer="hits"] rect[data-note-key]').first().waitFor({ timeout: 30_000 });
}

describe("sharing a part with a teacher", () => {
  let playerContext: BrowserContext;
  let teacherContext: BrowserContext;
  let player: TestUser;
  let teacher: TestUser;

  beforeAll(async () => {
    [player, teacher] = await Promise.all([createUser({ role: "player", name: "Pia Player" }), createUser({ role: "teacher", name: "Theo Teacher" })]);
    [playerContext, teacherContext] = await Promise.all([launchContext({ width: 1360, height: 900 }), launchContext({ width: 1360, height: 900 })]);
  });

  afterAll(async () => {
    await Promise.all([playerContext?.close(), teacherContext?.close()]);
  });

  it("invites, comments, proposes, accepts and revokes across two browsers", async () => {
    // ——— the player signs in, brings a part in and shares it ———
    const p = await playerContext.newPage();
    p.on("dialog", (d) => d.accept());
    await p.goto(`${APP_URL}/sign-in?callbackUrl=/parts`);
    await signInThroughForm(p, player);
    await p.waitForURL((u) => u.pathname === "/parts");
    const upload = await playerContext.request.post(`${APP_URL}/api/parts`, {
      multipart: { file: { name: "two-bars.musicxml", mimeType: "application/xml", buffer: fs.readFileSync(FIXTURE) } },
    });
    expect(upload.status()).toBe(201);
    const partId: string = (await upload.json()).id;

    await p.goto(`${APP_URL}/parts/${partId}`);
    await waitForScore(p);
    await p.getByRole("button", { name: "Share", exact: true }).click();
    const dialog = p.getByRole("dialog");
    await dialog.getByLabel("E-mail address").fill(teacher.email);
    await dialog.getByLabel("Comment and propose").check();
    await dialog.getByRole("button", { name: "Send invitation" }).click();
    await dialog.getByText(`Invitation sent to ${teacher.email}.`).waitFor();
    await dialog.getByTestId("share-row").getByText(/not accepted yet/).waitFor();
    await dialog.getByRole("button", { name: "Close" }).click();

    // ——— the teacher gets the e-mail and follows the link, signing in on the way ———
    const [invite] = await waitForMails(teacher.email, /shares/);
    expect(invite.subject).toContain("Pia Player");
    const link = invite.links.find((l) => l.includes("/share/accept?token="))!;
    const t = await teacherContext.newPage();
    await t.goto(link);
    await t.getByRole("heading", { name: /Pia Player shares/ }).waitFor();
    await t.getByRole("main").getByRole("link", { name: "Sign in" }).click();
    await t.waitForURL(/\/sign-in\?/);
    expect(await t.getByLabel("E-mail").inputValue()).toBe(teacher.email);
    await signInThroughForm(t, teacher);
    // Back on the invitation page: opening it accepted nothing; the button does (a POST).
    await t.getByRole("button", { name: "Accept and open the part" }).click();
    await t.waitForURL(new RegExp(`/parts/${partId}`), { timeout: 30_000 });
    await waitForScore(t);

    // ——— the player hears at once that the invitation was accepted ———
    const [accepted] = await waitForMails(player.email, DIGEST);
    expect(accepted.text).toContain("Theo Teacher accepted your invitation to Two Bars for Sharing");
    // So the comment below is e-mailed at once too, rather than waiting out the 10-minute batch.
    await passEmailWindow(player.id, partId);

    // ——— comment on a note and propose a change ———
    const noteKey = (await t.locator('[data-layer="hits"] rect[data-note-key]').nth(2).getAttribute("data-note-key"))!;
    await t.getByRole("tab", { name: /Discussion/ }).click();
    await t.locator(`[data-layer="hits"] rect[data-note-key="${noteKey}"]`).click();
    const tPanel = t.getByTestId("discussion-panel");
    await tPanel.getByLabel(/Add a comment/).fill("Let this note bloom.\nA little more depth, then relax.");
    await tPanel.getByRole("button", { name: "Comment", exact: true }).click();
    await tPanel.getByTestId("comment").filter({ hasText: "Let this note bloom." }).waitFor();
    await tPanel.getByRole("button", { name: "Propose a change to this marking" }).click();
    const form = tPanel.getByTestId("proposal-form");
    await form.getByLabel("Depth (¢)").fill("35");
    await form.getByLabel("Role").selectOption("peak");
    await form.getByLabel(/Why/).fill("This is the peak of the phrase.");
    await form.getByRole("button", { name: "Send proposal" }).click();
    await tPanel.getByTestId("proposal-card").waitFor();
    // The note's marker counts the comment and the open proposal.
    await t.locator(`[data-glyph="comment"][data-note-key="${noteKey}"][data-count="2"]`).waitFor();
    await t.screenshot({ path: screenshotPath("sharing-teacher-proposes"), fullPage: false });

    // ——— the player is notified (in the app and by e-mail with a link to the note) ———
    const [digest] = await waitForMails(player.email, DIGEST, 2);
    expect(digest.text).toContain("Theo Teacher commented");
    const noteLink = digest.links.find((l) => l.includes(`?note=${encodeURIComponent(noteKey)}`))!;
    expect(noteLink).toBeTruthy();
    await p.goto(`${APP_URL}/parts`);
    await p.getByRole("row").filter({ hasText: "Two Bars for Sharing" }).getByTestId("unread-badge").waitFor();
    await p.goto(noteLink);
    await waitForScore(p);
    // The Discussion tab's unread badge and the count of suggestions stay on one line beside the labels.
    await p.getByRole("tab", { name: /^Discussion \d+ unread$/ }).waitFor();
    expect(await measureSideTabs(p)).toMatchObject({ oneLine: true, clipped: [], rowOverflows: false });
    const pPanel = p.getByTestId("discussion-panel");
    const card = pPanel.getByTestId("proposal-card");
    await card.waitFor();
    expect(await card.locator('tr[data-changed="true"] th').allTextContents()).toEqual(expect.arrayContaining(["Depth", "Role"]));
    await pPanel.getByTestId("comment").filter({ hasText: "A little more depth, then relax." }).waitFor();
    await p.screenshot({ path: screenshotPath("sharing-player-compares"), fullPage: false });

    // ——— the player accepts: the marking and its history show the proposal ———
    await card.getByRole("button", { name: "Accept proposal" }).click();
    await p.locator(`[data-marking="${noteKey}"] [data-glyph="role"][data-role="peak"]`).waitFor();
    await pPanel.getByText(/Earlier proposals \(1\)/).waitFor();
    const markings = await (await playerContext.request.get(`${APP_URL}/api/parts/${partId}/markings`)).json();
    expect(markings.markings.find((m: { noteKey: string }) => m.noteKey === noteKey)).toMatchObject({ depthCents: 35, role: "peak" });
    const history = await (await playerContext.request.get(`${APP_URL}/api/parts/${partId}/history`)).json();
    expect(history.entries[0]).toMatchObject({ noteKey, proposedByName: "Theo Teacher", actorName: "Pia Player" });
    await p.getByRole("tab", { name: "Marking" }).click();
    expect(await p.getByLabel(/Depth/).first().inputValue()).toBe("35");
    await p.screenshot({ path: screenshotPath("sharing-player-accepted"), fullPage: false });

    // ——— the teacher's studio lists the part under the student, with the unread reply ———
    await t.goto(`${APP_URL}/studio`);
    const shared = t.getByTestId("shared-with-me");
    const row = shared.getByTestId("shared-part-row").filter({ hasText: "Two Bars for Sharing" });
    await row.waitFor();
    expect(await shared.getByRole("rowheader").first().textContent()).toContain("Pia Player");
    expect(await row.getByTestId("unread-badge").textContent()).toBe("1");
    await t.screenshot({ path: screenshotPath("sharing-teacher-studio"), fullPage: false });

    // ——— the teacher proposes on another note, then withdraws it ———
    const otherKey = (await p.locator('[data-layer="hits"] rect[data-note-key]').nth(4).getAttribute("data-note-key"))!;
    await t.goto(`${APP_URL}/parts/${partId}?note=${encodeURIComponent(otherKey)}`);
    await waitForScore(t);
    const tPanel2 = t.getByTestId("discussion-panel");
    await tPanel2.getByRole("button", { name: "Propose a change to this marking" }).click();
    const form2 = tPanel2.getByTestId("proposal-form");
    await form2.getByLabel("Depth (¢)").fill("18");
    await form2.getByLabel(/Why/).fill("Lighter, to leave room for the peak.");
    await form2.getByRole("button", { name: "Send proposal" }).click();
    const mine = tPanel2.getByRole("region", { name: "Proposals" }).getByTestId("proposal-card");
    await mine.getByRole("button", { name: "Withdraw", exact: true }).click();
    await mine.getByRole("button", { name: "Withdraw proposal" }).click();
    await tPanel2.locator('[data-testid="proposal-card"][data-status="withdrawn"]').waitFor();
    expect(await mine.getByTestId("proposal-status").textContent()).toBe("Withdrawn");
    expect(await mine.getByTestId("proposal-withdrawn").textContent()).toMatch(/^You withdrew this proposal/);
    expect(await mine.getByRole("button").count()).toBe(0);
    await mine.screenshot({ path: screenshotPath("sharing-proposal-withdrawn-teacher") });
    // The marker no longer counts a proposal on that note.
    await t.locator(`[data-glyph="comment"][data-note-key="${otherKey}"]`).waitFor({ state: "detached" });

    // The player sees it among the earlier proposals, as withdrawn, with nothing to decide.
    await p.goto(`${APP_URL}/parts/${partId}?note=${encodeURIComponent(otherKey)}`);
    await waitForScore(p);
    const earlier = p.getByTestId("discussion-panel").locator("details", { hasText: "Earlier proposals (1)" });
    await earlier.locator("summary").click();
    const theirs = earlier.getByTestId("proposal-card");
    expect(await theirs.getByTestId("proposal-status").textContent()).toBe("Withdrawn");
    expect(await theirs.getByTestId("proposal-withdrawn").textContent()).toMatch(/^Theo Teacher withdrew this proposal/);
    expect(await theirs.getByRole("button", { name: /Accept|Decline/ }).count()).toBe(0);
    await theirs.screenshot({ path: screenshotPath("sharing-proposal-withdrawn-owner") });

    // ——— the player revokes; the teacher's next request is refused ———
    await p.getByRole("button", { name: "Share", exact: true }).click();
    await p.getByRole("dialog").getByRole("button", { name: "Revoke access" }).click();
    await p.getByRole("dialog").getByText("Only you.").waitFor();
    const refused = await teacherContext.request.get(`${APP_URL}/api/parts/${partId}/comments/summary`);
    expect(refused.status()).toBe(404);
    await t.goto(`${APP_URL}/parts/${partId}`);
    await t.getByRole("heading", { name: "This part is not here" }).waitFor();
    await t.screenshot({ path: screenshotPath("sharing-teacher-revoked"), fullPage: false });
  });
});
