import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { renderHook } from "@testing-library/react";
import type { ReactNode } from "react";
import { describe, expect, it } from "vitest";
import { commentKeys } from "@/components/client/keys";
import { useCommentCounts } from "./api";

const PART = "part-1";

function setup(threads: { threadKey: string; count: number; unresolved: boolean; openProposals: number }[]) {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false, staleTime: Infinity, refetchInterval: false } } });
  client.setQueryData(commentKeys.summary(PART), { threads });
  const wrapper = ({ children }: { children: ReactNode }) => <QueryClientProvider client={client}>{children}</QueryClientProvider>;
  return { client, ...renderHook(() => useCommentCounts(PART), { wrapper }) };
}

describe("useCommentCounts", () => {
  it("counts unresolved comments and open proposals per note, leaving out notes with neither", () => {
    const { result } = setup([
      { threadKey: "K1", count: 3, unresolved: true, openProposals: 1 },
      { threadKey: "K2", count: 2, unresolved: false, openProposals: 0 },
      { threadKey: "K3", count: 1, unresolved: false, openProposals: 2 },
    ]);
    expect(result.current).toEqual({ K1: 4, K3: 2 });
  });

  // The score's overlay re-places every note when the counts object changes; a click that only
  // selects a note re-renders the workspace and must hand the overlay the same object.
  it("gives the same object on every render until the summary changes", () => {
    const { result, rerender, client } = setup([{ threadKey: "K1", count: 1, unresolved: true, openProposals: 0 }]);
    const first = result.current;
    rerender();
    expect(result.current).toBe(first);
    client.setQueryData(commentKeys.summary(PART), { threads: [{ threadKey: "K1", count: 2, unresolved: true, openProposals: 0 }] });
    rerender();
    expect(result.current).not.toBe(first);
    expect(result.current).toEqual({ K1: 2 });
  });
});
