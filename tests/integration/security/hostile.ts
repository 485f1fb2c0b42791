import { afterAll } from "vitest";
import { APP_URL } from "../../helpers/env";
import type { ApiClient } from "../../helpers/session";

/**
 * Every request the security suite sends as an attacker goes through `hostile()`, which counts
 * them; each file prints its count at the end (the suite's total is the sum).
 */
let count = 0;

export function countHostileRequests(file: string) {
  afterAll(() => {
    console.log(`[security] ${file}: ${count} hostile requests`);
  });
}

export async function hostile(path: string, init: RequestInit = {}, client?: ApiClient): Promise<Response> {
  count++;
  if (client) return client.fetch(path, init);
  return fetch(new URL(path, APP_URL), { redirect: "manual", ...init });
}

/** An origin that is not ours (RFC 2606 reserves .example). */
export const EVIL_ORIGIN = "https://evil.example";
export const APP_ORIGIN = new URL(APP_URL).origin;
