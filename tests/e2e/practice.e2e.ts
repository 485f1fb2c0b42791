import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { launchContext, OUTPUT_DIR, screenshotPath } from "../helpers/browser";
import { APP_URL } from "../helpers/env";
import { signInThroughForm } from "../helpers/pages";
import { createUser } from "../helpers/session";
import { vibratoTone, writeWav } from "../helpers/wav";

/** The microphone hears a 440 Hz tone with 6 Hz, ±30 cent vibrato (the check values' test signal). */
function fakeMicrophone(): string {
  const file = path.join(OUTPUT_DIR, "practice-a4-6hz-30c.wav");
  // 5 s is a whole number of vibrato cycles, so the loop Chromium plays has no jump in the pulse.
  writeWav(file, vibratoTone({ f0: 440, rateHz: 6, extentCents: 30, seconds: 5, sampleRate: 48_000 }), 48_000);
  return file;
}

const number = async (page: Page, testId: string) => Number((await page.getByTestId(testId).innerText()).replace(/[^0-9.+-]/g, ""));

describe("the practice page", () => {
  let context: BrowserContext;
  let page: Page;
  let partId: string;
  let markedKey: string;

  beforeAll(async () => {
    screenshotPath("practice-init"); // creates the output folder before the WAV is written
    const wav = fakeMicrophone();
    context = await launchContext({
      args: ["--use-fake-device-for-media-stream", "--use-fake-ui-for-media-stream", `--use-file-for-fake-audio-capture=${wav}`, "--autoplay-policy=no-user-gesture-required"],
    });
    await context.grantPermissions(["microphone"], { origin: APP_URL });
    page = await context.newPage();
    const user = await createUser({ role: "player" });
    await signInThroughForm(page, user.email, user.password, "/parts");
    const made = await page.evaluate(async () => {
      const res = await fetch("/api/parts/samples", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ name: "stone-bridge.musicxml" }) });
      const part = await res.json();
      const analysis = await (await fetch(`/api/parts/${part.id}/analysis`)).json();
      // An A4 if the part has one, so the take's pitch matches the fake microphone's.
      const note = analysis.notes.find((n: { midi: number }) => n.midi === 69) ?? analysis.notes[2];
      const marking = { depthCents: 30, speedHz: 6, placement: "centered", onset: "immediate", shape: "steady", role: "peak", comment: "" };
      const put = await fetch(`/api/parts/${part.id}/markings/${encodeURIComponent(note.key)}`, { method: "PUT", headers: { "content-type": "application/json" }, body: JSON.stringify(marking) });
      return { id: part.id as string, key: note.key as string, status: put.status };
    });
    expect(made.status).toBe(201);
    partId = made.id;
    markedKey = made.key;
  });
  afterAll(async () => {
    await context?.close();
  });

  it("opens from the workspace's Practise link with the marked note chosen and the cautions shown", async () => {
    await page.goto(`${APP_URL}/parts/${partId}`);
    await page.getByRole("link", { name: "Practise" }).click();
    await page.waitForURL((url) => url.pathname === `/parts/${partId}/practice`);
    await page.getByTestId("practice-room").waitFor();
    expect(await page.getByLabel("Note to practise").inputValue()).toBe(markedKey);
    await expect.poll(() => page.getByTestId("note-summary").innerText()).toMatch(/±30\s*¢/);
    // 6 Hz at the part's tempo, as pulses per beat, is on screen next to the marking.
    expect(await page.getByTestId("note-summary").innerText()).toMatch(/Pulses per beat/i);
    expect(await page.getByTestId("audio-caution").count()).toBeGreaterThanOrEqual(2);
    expect(await page.getByTestId("audio-caution").first().innerText()).toContain("Audio starts quiet; keep headphone volume moderate.");
    const caution = await page.getByTestId("hold-caution").innerText();
    expect(caution).toMatch(/light-headed/);
    expect(caution).toMatch(/stop and breathe normally/);
    expect(caution).toMatch(/qualified teacher or health professional/);
  });

  it("runs the pulse trainer up its steps to 6 Hz and stops", async () => {
    const steps = page.getByTestId("pulse-step");
    expect(await steps.count()).toBeGreaterThanOrEqual(3);
    expect(await steps.last().innerText()).toMatch(/6\.00 Hz/);
    await page.getByRole("button", { name: "Start clicks" }).click();
    await expect.poll(() => page.getByTestId("pulse-status").innerText()).toMatch(/^Clicking \d per beat/);
    const first = await page.getByTestId("pulse-status").innerText();
    await page.waitForTimeout(800);
    await page.getByRole("button", { name: "Next step" }).click();
    await expect.poll(() => page.getByTestId("pulse-status").innerText()).not.toBe(first);
    await page.getByRole("button", { name: "Stop clicks" }).click();
    expect(await page.getByTestId("pulse-status").innerText()).toBe("Stopped");
  });

  it("starts and stops the hold ladder with a visible timer", async () => {
    await page.getByRole("button", { name: "Start the ladder" }).click();
    const bar = page.getByTestId("hold-status").getByRole("progressbar");
    await bar.waitFor();
    await expect.poll(async () => Number(await bar.getAttribute("aria-valuenow"))).toBeGreaterThan(0.3);
    await page.getByRole("button", { name: "Stop", exact: true }).click();
    await bar.waitFor({ state: "detached" });
  });

  it("records a take, measures about 6 Hz and ±29 cents, and saves it", async () => {
    await page.getByRole("button", { name: "Record a take" }).click();
    await page.getByTestId("take-recording").waitFor();
    await expect.poll(async () => Number((await page.getByTestId("take-recording").innerText()).match(/Recording ([\d.]+)/)?.[1] ?? 0), { timeout: 10_000 }).toBeGreaterThan(2.2);
    await page.getByRole("button", { name: "Stop and measure" }).click();
    const result = page.getByTestId("take-result");
    await result.waitFor({ timeout: 15_000 });
    expect(await result.getAttribute("data-status")).toBe("measured");
    // The fake microphone plays 6 Hz, ±30 c; a 1024-sample window reads ≈29 c (check values §6).
    const speed = await number(page, "measured-speed");
    const depth = await number(page, "measured-depth");
    expect(Math.abs(speed - 6)).toBeLessThan(0.15);
    expect(depth).toBeGreaterThan(25);
    expect(depth).toBeLessThan(32);
    expect(await number(page, "voiced")).toBeGreaterThan(80);
    await page.getByTestId("contour-plot").waitFor();
    await page.getByTestId("marked-band").waitFor();

    await page.getByRole("button", { name: "Save this take" }).click();
    await page.getByRole("button", { name: "Take saved" }).waitFor();
    await page.getByTestId("saved-takes").waitFor();
    const stored = await page.evaluate(async (id) => (await (await fetch(`/api/parts/${id}/takes`)).json()).takes, partId);
    expect(stored).toHaveLength(1);
    expect(stored[0]).toMatchObject({ noteKey: markedKey, marked: { speedHz: 6, depthCents: 30 } });
    expect(Math.abs(stored[0].speedHz - 6)).toBeLessThan(0.15);
  });

  it("adds a practice-log entry that stays after a reload", async () => {
    const log = page.getByTestId("practice-log");
    await log.getByLabel("What").selectOption("pulse-trainer");
    await log.getByLabel("Minutes").fill("12");
    await log.getByLabel("Practice notes").fill("Climbed to four pulses at 90");
    await log.getByRole("button", { name: "Add to the log" }).click();
    await log.getByTestId("log-entries").getByText("Climbed to four pulses at 90").waitFor();
    expect(await page.getByTestId("total-minutes").innerText()).toBe("12 minutes in all");
    await page.screenshot({ path: screenshotPath("practice-desktop"), fullPage: true });

    await page.reload();
    await page.getByTestId("log-entries").getByText("Climbed to four pulses at 90").waitFor();
    // A bad entry names its problem and keeps what was typed.
    await page.getByTestId("practice-log").getByLabel("Minutes").fill("0");
    await page.getByTestId("practice-log").getByLabel("Practice notes").fill("kept");
    await page.getByTestId("practice-log").getByRole("button", { name: "Add to the log" }).click();
    await page.getByTestId("practice-log").getByRole("alert").waitFor();
    expect(await page.getByTestId("practice-log").getByRole("alert").innerText()).toMatch(/minute/i);
    expect(await page.getByTestId("practice-log").getByLabel("Practice notes").inputValue()).toBe("kept");
  });

  it("fits a phone screen", async () => {
    await page.setViewportSize({ width: 390, height: 844 });
    await page.reload();
    await page.getByTestId("practice-room").waitFor();
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow).toBeLessThanOrEqual(1);
    await page.screenshot({ path: screenshotPath("practice-phone"), fullPage: true });
  });
});
