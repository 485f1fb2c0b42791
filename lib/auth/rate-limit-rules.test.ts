import { describe, expect, it } from "vitest";
import { describeWait, LIMITS, retryAt } from "./rate-limit-rules";

const now = new Date("2026-03-01T12:00:00Z");
const ago = (min: number) => new Date(now.getTime() - min * 60_000);

describe("rate-limit rules", () => {
  it("allows attempts below the limit", () => {
    expect(retryAt(LIMITS.signInAccount, [ago(1), ago(2), ago(3), ago(4)], now)).toBeNull();
  });

  it("blocks at the limit until the oldest counted attempt leaves the window", () => {
    const at = retryAt(LIMITS.signInAccount, [ago(1), ago(2), ago(3), ago(4), ago(10)], now);
    expect(at?.toISOString()).toBe(new Date(ago(10).getTime() + 15 * 60_000).toISOString());
    expect(describeWait(at!, now)).toBe("in 5 minutes");
  });

  it("ignores attempts older than the window", () => {
    expect(retryAt(LIMITS.signInAccount, [ago(1), ago(2), ago(3), ago(4), ago(16)], now)).toBeNull();
  });

  it("uses the most recent attempts when more than the limit are counted", () => {
    const at = retryAt(LIMITS.signInAccount, [ago(14), ago(1), ago(2), ago(3), ago(4), ago(5)], now);
    expect(at?.getTime()).toBe(ago(5).getTime() + 15 * 60_000);
  });

  it("never says zero minutes", () => {
    expect(describeWait(new Date(now.getTime() + 5_000), now)).toBe("in 1 minute");
  });
});
