import { describe, expect, it } from "vitest";
import { isCommonPassword, newPasswordSchema } from "./password-rules";

describe("password rules", () => {
  it("refuses passwords shorter than 10 characters", () => {
    expect(newPasswordSchema.safeParse("short-pw1").success).toBe(false);
    expect(newPasswordSchema.safeParse("calm-paper-ink-42").success).toBe(true);
  });

  it("refuses long passwords found in the common-password list, in any case", () => {
    // Both appear in the zxcvbn "passwords-common" frequency list (@zxcvbn-ts/language-common 4.1.3).
    expect(isCommonPassword("password123")).toBe(true);
    expect(isCommonPassword("QwertyUIOP")).toBe(true);
    const r = newPasswordSchema.safeParse("1234567890");
    expect(r.success).toBe(false);
    expect(r.error?.issues[0].message).toMatch(/common passwords/);
  });

  it("accepts an uncommon passphrase", () => {
    expect(isCommonPassword("ondula-wave-garden-7")).toBe(false);
  });
});
