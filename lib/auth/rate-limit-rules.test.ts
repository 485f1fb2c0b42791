import { describe, expect, it } from "vitest";
import { describeWait, LIMITS, limitKey } from "./rate-limit-rules";

const now = new Date("2026-03-01T12:00:00Z");

describe("rate-limit rules", () => {
  it("says the wait in whole minutes, rounded up", () => {
    expect(describeWait(new Date(now.getTime() + 14 * 60_000 + 1), now)).toBe("in 15 minutes");
    expect(describeWait(new Date(now.getTime() + 5 * 60_000), now)).toBe("in 5 minutes");
  });

  it("never says zero minutes", () => {
    expect(describeWait(new Date(now.getTime() + 5_000), now)).toBe("in 1 minute");
  });

  it("keys an address typed in any case and with spaces as one subject", () => {
    expect(limitKey(LIMITS.signInAccount, " Flute@Example.org ")).toBe(limitKey(LIMITS.signInAccount, "flute@example.org"));
    expect(limitKey(LIMITS.signInAccount, "a@b.c")).not.toBe(limitKey(LIMITS.signInAddress, "a@b.c"));
  });
});
