import fs from "node:fs";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { shares } from "@/db/schema";
import { multipartFile, SAMPLES_DIR } from "../helpers/parts";
import { createSignedInUser, type ApiClient, type TestUser } from "../helpers/session";
import { json, passEmailWindow, waitForMails } from "../helpers/sharing";

type Person = { user: TestUser; client: ApiClient };
const DIGEST = /new(?: items)? on “/;

/**
 * Our sample harbour-song.musicxml opens with a pickup written <measure number="0" implicit="yes">,
 * so the bar printed "1" is its second measure (index 1): messages must say "the pickup" and
 * "bar 1", never count measures from 1.
 */
describe("notifications and e-mail name bars as the part writes them", () => {
  let owner: Person;
  let teacher: Person;
  let partId: string;
  let notes: { key: string; measure: string }[];

  beforeAll(async () => {
    [owner, teacher] = await Promise.all([
      createSignedInUser({ role: "player", name: "Pickup Player" }),
      createSignedInUser({ role: "teacher", name: "Pickup Teacher" }),
    ]);
    const bytes = new Uint8Array(fs.readFileSync(path.join(SAMPLES_DIR, "harbour-song.musicxml")));
    const res = await owner.client.fetch("/api/parts", { method: "POST", body: multipartFile("harbour-song.musicxml", bytes) });
    expect(res.status).toBe(201);
    partId = (await res.json()).id;
    notes = (await (await owner.client.fetch(`/api/parts/${partId}/analysis`)).json()).notes;
    await db().insert(shares).values({
      partId, email: teacher.user.email, permission: "propose", tokenHash: `bar-names-${partId}`, invitedBy: owner.user.id,
      userId: teacher.user.id, acceptedAt: new Date(), expiresAt: new Date(Date.now() + 86_400_000),
    });
  });

  it("says 'the pickup' and 'bar 1' in the app and in the e-mail", async () => {
    const inPickup = notes.find((n) => n.key.includes(":m0:"))!;
    const inBar1 = notes.find((n) => n.key.includes(":m1:"))!;
    // The analysis keeps the written number of each note's bar.
    expect(inPickup.measure).toBe("0");
    expect(inBar1.measure).toBe("1");

    const thread = (key: string) => `/api/parts/${partId}/comments?thread=${encodeURIComponent(key)}`;
    expect((await teacher.client.fetch(thread(inPickup.key), json({ body: "Breathe before the pickup." }))).status).toBe(201);
    const first = await waitForMails(owner.user.email, DIGEST);
    expect(first[0].text).toContain("Pickup Teacher commented on the pickup: “Breathe before the pickup.”");
    expect(first[0].text).toContain("(the pickup)");

    await passEmailWindow(owner.user.id, partId);
    expect((await teacher.client.fetch(thread(inBar1.key), json({ body: "Lean on the downbeat." }))).status).toBe(201);
    const feed = await (await owner.client.fetch(`/api/notifications?partId=${partId}`)).json();
    const summaries = feed.items.map((n: { summary: string }) => n.summary);
    expect(summaries).toContain("Pickup Teacher commented on the pickup: “Breathe before the pickup.”");
    expect(summaries).toContain("Pickup Teacher commented on bar 1: “Lean on the downbeat.”");
    expect(summaries.join(" ")).not.toContain("bar 2");

    const mails = await waitForMails(owner.user.email, DIGEST, 2);
    const second = mails.find((m) => m.text.includes("Lean on the downbeat"))!;
    expect(second.text).toContain("Pickup Teacher commented on bar 1");
    expect(second.text).toContain("(bar 1)");
    expect(second.text).not.toContain("bar 2");
  });
});
