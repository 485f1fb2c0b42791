import { describe, expect, it } from "vitest";
import { ConfigError, parseConfig } from "./config";

describe("parseConfig", () => {
  it("fills safe defaults outside production", () => {
    const c = parseConfig({ APP_ENV: "development" });
    expect(c.DATABASE_URL).toMatch(/^postgres:\/\/.*127\.0\.0\.1/);
    expect(c.UPLOAD_MAX_BYTES).toBe(10 * 1024 * 1024);
  });

  it("names every missing variable in production", () => {
    expect(() => parseConfig({ NODE_ENV: "production" })).toThrow(ConfigError);
    try {
      parseConfig({ NODE_ENV: "production" });
    } catch (e) {
      const msg = (e as Error).message;
      for (const name of ["DATABASE_URL", "AUTH_SECRET", "SMTP_URL", "APP_URL"]) expect(msg).toContain(`${name}: missing`);
    }
  });

  it("names a malformed variable", () => {
    expect(() =>
      parseConfig({ APP_ENV: "production", DATABASE_URL: "mysql://x", AUTH_SECRET: "x".repeat(40), SMTP_URL: "smtp://a:25", APP_URL: "https://a.example" }),
    ).toThrow(/DATABASE_URL: must be a postgres/);
  });

  it("reads upload limits as numbers", () => {
    expect(parseConfig({ APP_ENV: "test", UPLOAD_MAX_BYTES: "2048" }).UPLOAD_MAX_BYTES).toBe(2048);
    expect(() => parseConfig({ APP_ENV: "test", UPLOAD_MAX_BYTES: "-1" })).toThrow(/UPLOAD_MAX_BYTES/);
  });
});

describe("a development secret in production", () => {
  const prod = { APP_ENV: "production", DATABASE_URL: "postgres://a@b/c", SMTP_URL: "smtp://a:25", APP_URL: "https://a.example" };
  it("stops the configuration (ASVS 2.10.4, 6.4.1: no default secrets)", () => {
    for (const secret of ["local-production-secret-not-for-production-0123456789", "development-only-secret-change-me-0123456789"]) {
      expect(() => parseConfig({ ...prod, AUTH_SECRET: secret })).toThrow(/development secret/);
    }
    expect(parseConfig({ ...prod, AUTH_SECRET: "Zq8v3N1kP0s7W2e9R4t6Y5u1I3o8P7a6S5d4F3g2" }).APP_ENV).toBe("production");
  });
});
