import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { cleanup, fireEvent, render, screen, waitFor, within } from "@testing-library/react";
import type { ReactNode } from "react";
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { DEFAULT_MARKING } from "@/lib/markings/schema";
import type { ProposalWithCurrent } from "@/lib/sharing/dto";
import { DiscussionPanel } from "./discussion-panel";
import { ProposalCard } from "./proposal-card";

const NOTE = "P1:m0:s1:v1:0/1:72";

const proposal = (over: Partial<ProposalWithCurrent> = {}): ProposalWithCurrent => ({
  id: "prop-1",
  noteKey: NOTE,
  authorId: "teacher-1",
  authorName: "Theo Teacher",
  baseVersion: null,
  proposed: { ...DEFAULT_MARKING, depthCents: 30 },
  comment: "More depth here.",
  status: "open",
  reply: null,
  decidedAt: null,
  createdAt: "2026-03-01T10:00:00.000Z",
  current: null,
  stale: false,
  ...over,
});

/** The proposal routes as the server answers them, with the stored proposal's state. */
class FakeServer {
  stored = proposal();
  requests: string[] = [];
  fetch = async (input: string, init: RequestInit = {}): Promise<Response> => {
    const method = init.method ?? "GET";
    const path = new URL(input, "http://local").pathname;
    this.requests.push(`${method} ${path}`);
    const json = (data: unknown, status = 200) => new Response(JSON.stringify(data), { status, headers: { "content-type": "application/json" } });
    if (path.endsWith("/withdraw")) {
      this.stored = { ...this.stored, status: "withdrawn", decidedAt: "2026-03-01T11:00:00.000Z" };
      return json(this.stored);
    }
    if (path.endsWith("/accept") && this.stored.status === "withdrawn") {
      return json({ code: "conflict:proposal_withdrawn", message: "Theo Teacher withdrew this proposal, so there is nothing to accept." }, 409);
    }
    if (path.endsWith("/proposals")) return json({ proposals: [this.stored] });
    if (path.includes("/comments")) return json({ threadKey: NOTE, resolved: false, resolvedAt: null, resolvedByName: null, comments: [] });
    if (path.startsWith("/api/notifications")) return json({ unread: 0, parts: [], items: [], updated: 0 });
    return json({ code: "not_found:route", message: `no fake for ${method} ${path}` }, 404);
  };
}

let server: FakeServer;

function wrap(children: ReactNode) {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
  return <QueryClientProvider client={client}>{children}</QueryClientProvider>;
}

beforeEach(() => {
  server = new FakeServer();
  vi.stubGlobal("fetch", vi.fn(server.fetch));
});
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe("ProposalCard", () => {
  it("offers Withdraw only to the proposal's author while it is undecided", () => {
    const { rerender } = render(wrap(<ProposalCard partId="part-1" proposal={proposal()} isOwner={false} viewerId="teacher-1" label="Bar 1" />));
    expect(screen.getByRole("button", { name: "Withdraw" })).toBeTruthy();
    rerender(wrap(<ProposalCard partId="part-1" proposal={proposal()} isOwner={false} viewerId="teacher-2" label="Bar 1" />));
    expect(screen.queryByRole("button", { name: "Withdraw" })).toBeNull();
    rerender(wrap(<ProposalCard partId="part-1" proposal={proposal({ status: "accepted" })} isOwner={false} viewerId="teacher-1" label="Bar 1" />));
    expect(screen.queryByRole("button", { name: "Withdraw" })).toBeNull();
    rerender(wrap(<ProposalCard partId="part-1" proposal={proposal()} isOwner viewerId="owner-1" label="Bar 1" />));
    expect(screen.queryByRole("button", { name: "Withdraw" })).toBeNull();
    expect(screen.getByRole("button", { name: "Accept proposal" })).toBeTruthy();
  });

  it("shows a withdrawn proposal to the owner as such, with nothing to accept or decline", () => {
    render(wrap(<ProposalCard partId="part-1" proposal={proposal({ status: "withdrawn", decidedAt: "2026-03-01T11:00:00.000Z" })} isOwner viewerId="owner-1" label="Bar 1" />));
    const card = screen.getByTestId("proposal-card");
    expect(within(card).getByTestId("proposal-status").textContent).toBe("Withdrawn");
    expect(within(card).getByTestId("proposal-withdrawn").textContent).toMatch(/^Theo Teacher withdrew this proposal · .+\. It will not be applied\.$/);
    expect(within(card).queryByRole("button")).toBeNull();
  });
});

describe("DiscussionPanel and a withdrawn proposal", () => {
  const panel = (permission: "owner" | "propose", viewerId: string) => (
    <DiscussionPanel partId="part-1" permission={permission} viewerId={viewerId} noteKey={NOTE} currentMarking={null} labelOf={() => "Bar 1 · C5"} />
  );

  it("lets the author withdraw after confirming, and keeps the card in view shown as withdrawn", async () => {
    render(wrap(panel("propose", "teacher-1")));
    const proposals = await screen.findByRole("region", { name: "Proposals" });
    fireEvent.click(within(proposals).getByRole("button", { name: "Withdraw" }));
    // A second step, so a stray tap at the stand takes nothing back.
    expect(server.requests.some((r) => r.endsWith("/withdraw"))).toBe(false);
    fireEvent.click(within(proposals).getByRole("button", { name: "Withdraw proposal" }));
    await waitFor(() => expect(within(proposals).getByTestId("proposal-status").textContent).toBe("Withdrawn"));
    expect(server.requests).toContain("POST /api/parts/part-1/proposals/prop-1/withdraw");
    expect(within(proposals).getByTestId("proposal-withdrawn").textContent).toMatch(/^You withdrew this proposal/);
    expect(within(proposals).queryByRole("button", { name: /Withdraw/ })).toBeNull();
  });

  it("files a withdrawn proposal under earlier ones for the owner, with no accept or decline", async () => {
    server.stored = { ...server.stored, status: "withdrawn", decidedAt: "2026-03-01T11:00:00.000Z" };
    render(wrap(panel("owner", "owner-1")));
    const earlier = await screen.findByText(/Earlier proposals \(1\)/);
    expect(screen.queryByRole("region", { name: "Proposals" })).toBeNull();
    expect(within(earlier.closest("details")!).getByTestId("proposal-status").textContent).toBe("Withdrawn");
    expect(screen.queryByRole("button", { name: "Accept proposal" })).toBeNull();
  });

  it("keeps the card and its message when the author withdrew while the owner was looking", async () => {
    render(wrap(panel("owner", "owner-1")));
    const proposals = await screen.findByRole("region", { name: "Proposals" });
    // The author withdraws in another browser; the owner's list is not refreshed yet.
    server.stored = { ...server.stored, status: "withdrawn", decidedAt: "2026-03-01T11:00:00.000Z" };
    fireEvent.click(within(proposals).getByRole("button", { name: "Accept proposal" }));
    await waitFor(() => expect(within(proposals).getByRole("alert").textContent).toBe("Theo Teacher withdrew this proposal, so there is nothing to accept."));
    await waitFor(() => expect(within(proposals).getByTestId("proposal-status").textContent).toBe("Withdrawn"));
    expect(within(proposals).getByRole("alert")).toBeTruthy();
    expect(within(proposals).queryByRole("button", { name: "Accept proposal" })).toBeNull();
  });
});
