import { describe, expect, it } from "vitest";
import { EMAIL_WINDOW_MS, emailDecision } from "./batching";

describe("e-mail batching window", () => {
  const now = new Date("2026-03-01T12:00:00Z");

  it("is ten minutes", () => {
    expect(EMAIL_WINDOW_MS).toBe(600_000);
  });

  it("sends at once when nothing was e-mailed for the pair", () => {
    expect(emailDecision(null, now).sendNow).toBe(true);
  });

  it("holds back within the window and says when it is due", () => {
    const last = new Date(now.getTime() - 4 * 60_000);
    const d = emailDecision(last, now);
    expect(d.sendNow).toBe(false);
    expect(d.dueAt.toISOString()).toBe("2026-03-01T12:06:00.000Z");
  });

  it("sends again once the window has passed, exactly at its end too", () => {
    expect(emailDecision(new Date(now.getTime() - EMAIL_WINDOW_MS), now).sendNow).toBe(true);
    expect(emailDecision(new Date(now.getTime() - EMAIL_WINDOW_MS - 1), now).sendNow).toBe(true);
    expect(emailDecision(new Date(now.getTime() - EMAIL_WINDOW_MS + 1), now).sendNow).toBe(false);
  });
});
