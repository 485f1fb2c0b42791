import { describe, expect, it } from "vitest";
import { messageIdFor } from "./message-id";

// RFC 5322 §3.6.4: msg-id = [CFWS] "<" id-left "@" id-right ">" [CFWS], with id-left and id-right
// dot-atom-text (atext: letters, digits and !#$%&'*+-/=?^_`{|}~, dots between them).
const ATEXT = "[A-Za-z0-9!#$%&'*+\\-/=?^_`{|}~]+";
const DOT_ATOM = `${ATEXT}(?:\\.${ATEXT})*`;
const MSG_ID = new RegExp(`^<${DOT_ATOM}@${DOT_ATOM}>$`);

describe("messageIdFor", () => {
  const job = "0b6f2f55-3c1e-4a8e-9d6b-2b1f4f6c9a10";

  it("is a valid RFC 5322 msg-id made of the job id and the app's host", () => {
    const id = messageIdFor(job, "https://ondula.example.org/app");
    expect(id).toBe(`<${job}@ondula.example.org>`);
    expect(id).toMatch(MSG_ID);
  });

  it("is the same for every attempt of one job and differs between jobs", () => {
    expect(messageIdFor(job, "http://127.0.0.1:3100")).toBe(messageIdFor(job, "http://127.0.0.1:3100"));
    expect(messageIdFor(job, "http://127.0.0.1:3100")).not.toBe(messageIdFor("1c7e0a44-0000-4000-8000-000000000001", "http://127.0.0.1:3100"));
  });

  it("falls back to a reserved name when the host is not dot-atom text (an IPv6 literal)", () => {
    // RFC 2606 §2: .invalid is reserved for names that must never resolve.
    const id = messageIdFor(job, "http://[::1]:3000");
    expect(id).toBe(`<${job}@ondula.invalid>`);
    expect(id).toMatch(MSG_ID);
  });
});
