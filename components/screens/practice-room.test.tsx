import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { cleanup, render, screen } from "@testing-library/react";
import type { ReactNode } from "react";
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";

vi.mock("next/navigation", () => ({ useRouter: () => ({ refresh: () => {}, push: () => {} }) }));
const { PracticeRoom } = await import("./practice-room");

const notes = [{ key: "P1:m1:s1:v1:0/1:74", label: "Bar 1 · D5", midi: 74, beats: 2, marking: { depthCents: 20, speedHz: 6, placement: "centered" as const, onset: "immediate" as const, shape: "steady" as const, role: null, comment: "" } }];

beforeEach(() => {
  // The room's lists (practice, log, takes) ask the server; they answer empty here.
  vi.stubGlobal("fetch", vi.fn(async () => new Response(JSON.stringify({ assignments: [], entries: [], takes: [], canAssign: false, canMarkDone: true }), { status: 200, headers: { "content-type": "application/json" } })));
});
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

function open(tempo: number | null, canSetTempo: boolean) {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  const wrap = ({ children }: { children: ReactNode }) => <QueryClientProvider client={client}>{children}</QueryClientProvider>;
  render(<PracticeRoom partId="p" title="Air" tempo={tempo} canSetTempo={canSetTempo} notes={notes} canWrite serverToday="2026-12-04" />, { wrapper: wrap });
}

describe("PracticeRoom and the working tempo", () => {
  it("asks the owner for a tempo once and assumes none: no metronome drill, no pulses per beat", () => {
    open(null, true);
    expect(screen.getByText("This part gives no tempo. Working tempo: ♩ =")).toBeTruthy();
    expect(screen.getByTestId("drills-need-tempo").textContent).toContain("Set its working tempo above");
    expect(screen.queryByText("Pulse trainer")).toBeNull();
    expect(screen.getByTestId("practice-room").textContent).not.toMatch(/♩ = 72/);
    expect(screen.getByText("no tempo yet")).toBeTruthy();
  });

  it("tells someone who cannot set it that the player has not set one", () => {
    open(null, false);
    expect(screen.getByTestId("practice-tempo").textContent).toContain("has not set a working tempo yet");
    expect(screen.getByTestId("drills-need-tempo").textContent).toContain("Its player sets the working tempo");
  });

  it("uses the stored working tempo for the drills and pulses per beat", () => {
    open(96, true);
    expect(screen.getByTestId("practice-tempo").textContent).toBe("Working tempo ♩ = 96");
    expect(screen.getByText("Pulse trainer")).toBeTruthy();
    // 6 Hz at ♩ = 96: 6 × 60 / 96 = 3.75 pulses per beat (arithmetic).
    expect(screen.getByTestId("note-summary").textContent).toContain("3.75");
  });
});
