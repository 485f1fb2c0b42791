import { QueryClient } from "@tanstack/react-query";
import { cleanup, render, screen } from "@testing-library/react";
import { afterEach, describe, expect, it } from "vitest";
import { ApiError, parseRetryAfter, retryUntilSaved, saveRetryDelay, SAVE_RETRY_MAX_MS } from "@/components/client/fetch-json";
import { markingKeys } from "@/components/client/keys";
import { DEFAULT_MARKING } from "@/lib/markings/schema";
import { SaveIndicator } from "../save-indicator";
import { K, marking } from "../test-fixtures";
import { keepPendingEdits } from "./get-markings";
import { deriveSaveState } from "./save-state";

afterEach(cleanup);

describe("Retry-After", () => {
  it("reads delay-seconds and an HTTP date (RFC 9110 §10.2.3)", () => {
    expect(parseRetryAfter("2")).toBe(2000);
    expect(parseRetryAfter(" 120 ")).toBe(120_000);
    const now = Date.parse("Fri, 04 Dec 2026 18:00:00 GMT");
    expect(parseRetryAfter("Fri, 04 Dec 2026 18:00:05 GMT", now)).toBe(5000);
    expect(parseRetryAfter("Fri, 04 Dec 2026 17:00:00 GMT", now)).toBe(0);
    expect(parseRetryAfter(null)).toBeUndefined();
    expect(parseRetryAfter("soon")).toBeUndefined();
  });
});

describe("retrying an edit", () => {
  const unavailable = (retryAfterMs?: number) => new ApiError(503, "unavailable:database", "Try again.", undefined, undefined, retryAfterMs);

  it("retries every failure that may pass later, without a limit, and never a refusal or a conflict", () => {
    expect(retryUntilSaved(50, new ApiError(0, "unavailable:network", "No answer."))).toBe(true);
    expect(retryUntilSaved(50, unavailable())).toBe(true);
    expect(retryUntilSaved(3, new ApiError(500, "unavailable:internal", "Oops."))).toBe(true);
    expect(retryUntilSaved(3, new ApiError(429, "rate_limited:x", "Slow down."))).toBe(true);
    expect(retryUntilSaved(0, new ApiError(409, "conflict:marking", "Changed elsewhere."))).toBe(false);
    expect(retryUntilSaved(0, new ApiError(404, "not_found:note", "No such note."))).toBe(false);
    expect(retryUntilSaved(0, new ApiError(400, "bad_request:validation", "depthCents: too deep"))).toBe(false);
    expect(retryUntilSaved(0, new Error("a bug"))).toBe(false);
  });

  it("backs off 1 s, 2 s, 4 s… up to a cap, and waits at least what Retry-After asks", () => {
    const none = () => 0;
    expect([0, 1, 2, 3, 4, 10].map((n) => saveRetryDelay(n, unavailable(), none))).toEqual([1000, 2000, 4000, 8000, SAVE_RETRY_MAX_MS, SAVE_RETRY_MAX_MS]);
    // Spread by up to a quarter so a crowd does not come back in step.
    expect(saveRetryDelay(0, unavailable(), () => 0.999)).toBe(1250);
    expect(saveRetryDelay(0, unavailable(5000), none)).toBe(5000);
    expect(saveRetryDelay(4, unavailable(2000), none)).toBe(SAVE_RETRY_MAX_MS);
    // A server asking for an hour is still tried again within a minute.
    expect(saveRetryDelay(0, unavailable(3_600_000), none)).toBe(60_000);
  });
});

describe("save state", () => {
  it("says not saved yet while writes have failed or wait offline, and offline only when nothing waits", () => {
    expect(deriveSaveState({ pending: 0, failing: 0, online: true, conflicts: 0 })).toBe("saved");
    expect(deriveSaveState({ pending: 2, failing: 0, online: true, conflicts: 0 })).toBe("saving");
    expect(deriveSaveState({ pending: 2, failing: 1, online: true, conflicts: 0 })).toBe("unsaved");
    expect(deriveSaveState({ pending: 1, failing: 0, online: false, conflicts: 0 })).toBe("unsaved");
    expect(deriveSaveState({ pending: 0, failing: 0, online: false, conflicts: 0 })).toBe("offline");
    expect(deriveSaveState({ pending: 1, failing: 1, online: false, conflicts: 1 })).toBe("conflict");
  });

  it("shows the waiting edits in plain words, with a shape as well as colour", () => {
    render(<SaveIndicator state="unsaved" waiting={3} online />);
    const status = screen.getByRole("status");
    expect(status.textContent).toContain("Not saved yet · trying again · 3 changes");
    expect(status.getAttribute("data-state")).toBe("unsaved");
    cleanup();
    render(<SaveIndicator state="unsaved" waiting={1} online={false} />);
    expect(screen.getByRole("status").textContent).toContain("Not saved yet · offline · 1 change");
  });
});

describe("a refetch while writes wait", () => {
  it("keeps the notes with pending writes as the page shows them", () => {
    const client = new QueryClient();
    const mine = marking(K[0], { depthCents: 70, version: 1 });
    client.setQueryData(markingKeys.list("p"), { markings: [mine] });
    // A write of K[0] waiting (paused offline) in the part's queue.
    client.getMutationCache().build(client, { mutationKey: markingKeys.write("p") }, {
      status: "pending", isPaused: true, variables: { noteKey: K[0], values: { ...DEFAULT_MARKING, depthCents: 70 } },
      context: undefined, data: undefined, error: null, failureCount: 0, failureReason: null, submittedAt: Date.now(),
    });
    const fetched = { markings: [marking(K[0], { depthCents: 10, version: 2 }), marking(K[1], { version: 4 })] };
    const kept = keepPendingEdits(client, "p", fetched);
    expect(kept.markings.find((m) => m.noteKey === K[0])).toEqual(mine);
    expect(kept.markings.find((m) => m.noteKey === K[1])?.version).toBe(4);
    // Nothing pending: the fetched list as it came.
    expect(keepPendingEdits(new QueryClient(), "p", fetched)).toBe(fetched);
  });
});
