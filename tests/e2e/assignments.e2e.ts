import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { db } from "@/db/client";
import { practiceAssignments, shares, studioMembers } from "@/db/schema";
import { ensureStudioForTeacher } from "@/db/studios";
import { addDays, localIsoDate } from "@/lib/assignments/due";
import { launchContext, screenshotPath } from "../helpers/browser";
import { APP_URL } from "../helpers/env";
import { signInThroughForm } from "../helpers/pages";
import { createUser, type TestUser } from "../helpers/session";

async function waitForScore(page: Page) {
  await page.locator('[data-layer="hits"] rect[data-note-key]').first().waitFor({ timeout: 30_000 });
}

describe("practice assignments", () => {
  let teacherContext: BrowserContext;
  let playerContext: BrowserContext;
  let teacher: TestUser;
  let player: TestUser;
  let partId: string;
  let noteKey: string;
  let noteLabel: string;
  // The browser and this process share the machine's clock and time zone.
  const today = localIsoDate(new Date());

  beforeAll(async () => {
    [teacher, player] = await Promise.all([createUser({ role: "teacher", name: "Tove Teacher" }), createUser({ role: "player", name: "Pello Player" })]);
    [teacherContext, playerContext] = await Promise.all([launchContext({ width: 1360, height: 900 }), launchContext({ width: 1280, height: 1000 })]);
    const p = await playerContext.newPage();
    await signInThroughForm(p, player.email, player.password, "/parts");
    const made = await p.evaluate(async () => {
      const res = await fetch("/api/parts/samples", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ name: "stone-bridge.musicxml" }) });
      return (await res.json()).id as string;
    });
    partId = made;
    const studio = await ensureStudioForTeacher({ teacherId: teacher.id, teacherName: teacher.name });
    await db().insert(studioMembers).values({ studioId: studio.id, playerId: player.id });
    await db().insert(shares).values({
      partId, email: teacher.email, permission: "comment", tokenHash: `e2e-assignments-${partId}`, invitedBy: player.id,
      userId: teacher.id, acceptedAt: new Date(), expiresAt: new Date(Date.now() + 86_400_000),
    });
    // Practice set a while ago and now late, as a teacher could have done last week.
    await db().insert(practiceAssignments).values({
      partId, assignedBy: teacher.id, drill: "free", instructions: "Play the whole part through once, slowly.", dueOn: addDays(today, -3),
    });
  });

  afterAll(async () => {
    await Promise.all([teacherContext?.close(), playerContext?.close()]);
  });

  it("the teacher sets practice on a note from the score's discussion", async () => {
    const t = await teacherContext.newPage();
    await signInThroughForm(t, teacher.email, teacher.password, `/parts/${partId}`);
    await waitForScore(t);
    noteKey = (await t.locator('[data-layer="hits"] rect[data-note-key]').nth(3).getAttribute("data-note-key"))!;
    await t.locator(`[data-layer="hits"] rect[data-note-key="${noteKey}"]`).click();
    await t.getByRole("tab", { name: /Discussion/ }).click();
    const panel = t.getByTestId("discussion-panel");
    noteLabel = (await panel.getByRole("group", { name: "Discussion of" }).getByRole("button").first().innerText()).trim();
    expect(noteLabel).toMatch(/^Bar \d+ · [A-G]/);
    await panel.getByRole("button", { name: "Assign practice on this note" }).click();
    const form = panel.getByTestId("assignment-form");
    await form.getByLabel("Drill").selectOption("hold-ladder");
    expect(await form.getByLabel(`On ${noteLabel}`).isChecked()).toBe(true);
    await form.getByLabel("Instructions").fill("Three rungs a day; keep the vibrato even as the holds get shorter.");
    await form.getByLabel(/Minutes a day/).fill("15");
    await form.getByLabel(/Due on/).fill(addDays(today, 3));
    await form.getByRole("button", { name: "Assign practice" }).click();
    await panel.getByText(`Practice set: Hold ladder on ${noteLabel}.`).waitFor();
    await t.screenshot({ path: screenshotPath("assignments-teacher-workspace"), fullPage: false });
  });

  it("the player sees it at the top of the practice page, opens its drill on the note and ticks it done", async () => {
    const p = await playerContext.newPage();
    await p.goto(`${APP_URL}/parts/${partId}/practice`);
    const section = p.getByTestId("assignments");
    await section.getByRole("heading", { name: "From your teacher" }).waitFor();
    const cards = section.getByTestId("assignment");
    expect(await cards.count()).toBe(2);
    // The late one first, its lateness in words.
    const late = cards.nth(0);
    expect(await late.innerText()).toContain("Free practice");
    expect(await late.getByTestId("due").innerText()).toMatch(/^!?\s*Overdue by 3 days/);
    const ladder = cards.nth(1);
    const ladderText = await ladder.innerText();
    expect(ladderText).toContain(`Hold ladder · ${noteLabel}`);
    expect(ladderText).toContain("Due in 3 days");
    expect(ladderText).toContain("15 min a day · Set by Tove Teacher");
    expect(ladderText).toContain("Three rungs a day");

    await ladder.getByRole("button", { name: /Practise this/ }).click();
    expect(await p.getByLabel("Note to practise").inputValue()).toBe(noteKey);
    await expect.poll(() => p.getByRole("heading", { name: "Hold ladder" }).evaluate((h) => Math.round(h.getBoundingClientRect().top))).toBeLessThan(300);
    await p.evaluate(() => window.scrollTo(0, 0));
    await p.screenshot({ path: screenshotPath("assignments-practice-page"), fullPage: true });

    await ladder.getByLabel(`Done: Hold ladder, ${noteLabel}`).check();
    const done = section.getByTestId("done-assignments");
    await done.getByText("Done (1)").waitFor();
    expect(await section.locator('[data-testid="assignment"][data-state="open"]').count()).toBe(1);
    await done.getByText("Done (1)").click();
    expect(await done.getByTestId("assignment").innerText()).toContain("Hold ladder");
    await p.screenshot({ path: screenshotPath("assignments-practice-done"), fullPage: false });

    // Twenty minutes in the practice log, for the teacher's progress.
    const log = p.getByTestId("practice-log");
    await log.getByLabel("Minutes").fill("20");
    await log.getByRole("button", { name: "Add to the log" }).click();
    await log.getByTestId("total-minutes").filter({ hasText: "20 minutes in all" }).waitFor();
  });

  it("the teacher sees the ticked practice on the practice page and sets a take there", async () => {
    const t = await teacherContext.newPage();
    await t.goto(`${APP_URL}/parts/${partId}/practice?note=${encodeURIComponent(noteKey)}`);
    const section = t.getByTestId("assignments");
    await section.getByRole("heading", { name: "Practice set on this part" }).waitFor();
    expect(await section.getByText("1 open · 1 done").count()).toBe(1);
    // The player's tick is theirs alone: the teacher sees no Done box.
    expect(await section.getByRole("checkbox").count()).toBe(0);
    await section.getByRole("button", { name: "Assign practice" }).click();
    const form = section.getByTestId("assignment-form");
    await form.getByLabel("Drill").selectOption("take");
    await form.getByLabel(`On ${noteLabel}`).waitFor();
    await form.getByLabel(/Minutes a day/).fill("5");
    await form.getByLabel("Instructions").fill("Record two takes and compare the speed with the marking.");
    await t.screenshot({ path: screenshotPath("assignments-teacher-practice-page"), fullPage: false });
    await form.getByRole("button", { name: "Assign practice" }).click();
    await section.getByText(`Practice set: Take on ${noteLabel}. The player has been told.`).waitFor();
    expect(await section.getByTestId("assignment").filter({ hasText: "Take" }).getByRole("button", { name: "Edit" }).count()).toBe(1);
  });

  it("the teacher follows the progress on the studio page", async () => {
    const t = await teacherContext.newPage();
    await t.goto(`${APP_URL}/studio`);
    const progress = t.getByTestId("practice-progress");
    const row = progress.getByTestId("progress-row").filter({ hasText: "Stone Bridge" });
    await row.waitFor();
    expect(await progress.getByRole("rowheader").filter({ hasText: "Pello Player" }).count()).toBe(1);
    expect((await row.getByTestId("progress-open").innerText()).replace(/\s+/g, " ")).toMatch(/^2 open\s*!?\s*1 overdue$/);
    // 5 minutes a day asked by the open take, over the 7-day window: 35.
    expect(await row.getByTestId("progress-minutes").innerText()).toBe("20 min of 35 asked");
    expect(await row.getByTestId("progress-take").innerText()).toBe("none yet");
    await progress.scrollIntoViewIfNeeded();
    await t.screenshot({ path: screenshotPath("assignments-studio"), fullPage: true });
  });
});
