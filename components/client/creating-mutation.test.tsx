import { describe, expect, it } from "vitest";
import { act, renderHook, waitFor } from "@testing-library/react";
import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import type { ReactNode } from "react";
import { ApiError } from "./fetch-json";
import { IDEMPOTENCY_HEADER, newIdempotencyKey, useCreatingMutation } from "./creating-mutation";

function wrapper({ children }: { children: ReactNode }) {
  return <QueryClientProvider client={new QueryClient()}>{children}</QueryClientProvider>;
}

describe("useCreatingMutation", () => {
  it("sends one key per action and the same key on that action's retries", async () => {
    const sent: Array<{ body: string; key: string }> = [];
    let failuresLeft = 1;
    const { result } = renderHook(
      () =>
        useCreatingMutation({
          request: async (body: string, headers) => {
            sent.push({ body, key: headers[IDEMPOTENCY_HEADER] });
            if (failuresLeft-- > 0) throw new ApiError(503, "unavailable:database", "Not answering.");
            return body;
          },
        }),
      { wrapper },
    );
    await act(() => result.current.mutateAsync("first"));
    await act(() => result.current.mutateAsync("second"));
    await waitFor(() => expect(sent).toHaveLength(3));
    // A 503 is retried (the answer may have been lost after the thing was created): same key.
    expect(sent[0].body).toBe("first");
    expect(sent[1]).toEqual(sent[0]);
    // A new action draws a new key.
    expect(sent[2].body).toBe("second");
    expect(sent[2].key).not.toBe(sent[0].key);
  });

  it("does not retry a refusal", async () => {
    let calls = 0;
    const { result } = renderHook(
      () => useCreatingMutation({ request: async () => { calls++; throw new ApiError(400, "bad_request:body", "Empty."); } }),
      { wrapper },
    );
    await act(() => result.current.mutateAsync("x").catch(() => undefined));
    expect(calls).toBe(1);
  });

  it("draws random keys in UUID v4 form (RFC 9562 §5.4)", () => {
    const keys = new Set(Array.from({ length: 100 }, newIdempotencyKey));
    expect(keys.size).toBe(100);
    for (const key of keys) expect(key).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
  });
});
