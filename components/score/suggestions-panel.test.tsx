import { cleanup, fireEvent, render, screen, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import type { Suggestion } from "@/lib/analysis/types";
import { SuggestionsPanel } from "./suggestions-panel";

afterEach(cleanup);

const s = (note: string, role: Suggestion["role"], confidence: number, reason = "A reason."): Suggestion => ({
  note, measure: "1", pitch: "A4", role, confidence, resolvesTo: role === "tension" ? "r" : null, reason,
});

function setup(pending: Suggestion[], canEdit = true) {
  const handlers = { onAccept: vi.fn(), onDismiss: vi.fn(), onShow: vi.fn(), onEdit: vi.fn() };
  render(<SuggestionsPanel pending={pending} decidedCount={2} labelOf={(k) => `Note ${k}`} canEdit={canEdit} {...handlers} />);
  return handlers;
}

describe("SuggestionsPanel", () => {
  it("groups by role with reasons and says how sure each one is", () => {
    setup([s("a", "tension", 0.9, "A is the leading tone."), s("b", "peak", 0.4), s("c", "tension", 0.45)]);
    const groups = screen.getAllByRole("heading", { level: 3 }).map((h) => h.textContent);
    expect(groups).toEqual(["Peak (1)", "Tension tone (2)"]);
    expect(screen.getByText("A is the leading tone.")).toBeTruthy();
    const a = document.querySelector('[data-suggestion="a"]') as HTMLElement;
    expect(within(a).getByText(/suggested · 90%/)).toBeTruthy();
    expect(within(a).getByText(/Resolves to Note r/)).toBeTruthy();
    const b = document.querySelector('[data-suggestion="b"]') as HTMLElement;
    expect(within(b).getByText(/possible · 40%/)).toBeTruthy();
  });

  it("accepts one, all of a kind, dismisses, and shows the note", () => {
    const h = setup([s("a", "tension", 0.9), s("c", "tension", 0.6), s("b", "peak", 0.8)]);
    fireEvent.click(screen.getByRole("button", { name: "Accept tension tone at Note a" }));
    expect(h.onAccept).toHaveBeenLastCalledWith([{ noteKey: "a", role: "tension" }]);
    fireEvent.click(screen.getByRole("button", { name: "Accept all 2" }));
    expect(h.onAccept).toHaveBeenLastCalledWith([
      { noteKey: "a", role: "tension" },
      { noteKey: "c", role: "tension" },
    ]);
    fireEvent.click(screen.getByRole("button", { name: "Accept and edit peak at Note b" }));
    expect(h.onEdit).toHaveBeenLastCalledWith({ noteKey: "b", role: "peak" });
    fireEvent.click(screen.getByRole("button", { name: "Dismiss peak at Note b" }));
    expect(h.onDismiss).toHaveBeenCalledWith({ noteKey: "b", role: "peak" });
    fireEvent.click(screen.getByRole("button", { name: "Show me Note c" }));
    expect(h.onShow).toHaveBeenCalledWith("c");
  });

  it("lets a reader look but not decide", () => {
    setup([s("a", "tension", 0.9)], false);
    expect(screen.queryByRole("button", { name: /Accept/ })).toBeNull();
    expect(screen.getByRole("button", { name: /Show me/ })).toBeTruthy();
  });
});

describe("SuggestionsPanel on a long part", () => {
  // Forty notes in two phrases (n0–n19, n20–n39); thirty suggestions, more than the panel's cap.
  const noteOrder = Array.from({ length: 40 }, (_, i) => `n${i}`);
  const phrases = [
    { start: "n0", peak: "n10", end: "n19" },
    { start: "n20", peak: "n30", end: "n39" },
  ];
  const many: Suggestion[] = Array.from({ length: 30 }, (_, i) => s(`n${i}`, i % 2 === 0 ? "tension" : "resolution", 0.3 + (i % 10) * 0.05));

  it("shows the strongest of each kind in each phrase, and the rest one click away", () => {
    render(<SuggestionsPanel pending={many} decidedCount={0} labelOf={(k) => k} canEdit onAccept={vi.fn()} onDismiss={vi.fn()} onShow={vi.fn()} phrases={phrases} noteOrder={noteOrder} />);
    const shown = () => [...document.querySelectorAll("[data-suggestion]")].map((e) => `${e.getAttribute("data-suggestion")}|${e.getAttribute("data-role")}`);
    // Phrase 1: tension n8 (0.7) and resolution n9 (0.75) are the strongest; phrase 2: n28 and n29.
    expect(shown().sort()).toEqual(["n28|tension", "n29|resolution", "n8|tension", "n9|resolution"]);
    expect(screen.getByTestId("suggestions-ranking").textContent).toMatch(/Showing the 4 strongest.*26 more/);
    fireEvent.click(screen.getByRole("button", { name: "Show all 30" }));
    expect(shown()).toHaveLength(30);
    fireEvent.click(screen.getByRole("button", { name: "Show the 4 strongest only" }));
    expect(shown()).toHaveLength(4);
  });

  it("ranks by the analysis' strength where it gives one", () => {
    const strong = many.map((x) => (x.note === "n2" ? { ...x, strength: 0.99 } : { ...x, strength: 0.1 }));
    render(<SuggestionsPanel pending={strong} decidedCount={0} labelOf={(k) => k} canEdit onAccept={vi.fn()} onDismiss={vi.fn()} onShow={vi.fn()} phrases={phrases} noteOrder={noteOrder} />);
    const tensions = [...document.querySelectorAll('[data-role="tension"]')].map((e) => e.getAttribute("data-suggestion"));
    expect(tensions).toContain("n2");
    expect(tensions).not.toContain("n8");
  });

  it("shows a short list whole", () => {
    render(<SuggestionsPanel pending={many.slice(0, 5)} decidedCount={0} labelOf={(k) => k} canEdit onAccept={vi.fn()} onDismiss={vi.fn()} onShow={vi.fn()} phrases={phrases} noteOrder={noteOrder} />);
    expect(document.querySelectorAll("[data-suggestion]")).toHaveLength(5);
    expect(screen.queryByTestId("suggestions-ranking")).toBeNull();
  });
});

describe("SuggestionsPanel while the analysis is not here", () => {
  const noop = { onAccept: vi.fn(), onDismiss: vi.fn(), onShow: vi.fn() };
  it("says it is reading the part while the analysis loads, never that nothing waits", () => {
    render(<SuggestionsPanel pending={[]} decidedCount={0} labelOf={(k) => k} canEdit status="loading" {...noop} />);
    expect(screen.getByRole("status").textContent).toMatch(/Reading the key and the melody/);
    expect(screen.queryByText(/Nothing waiting/)).toBeNull();
  });
  it("says the analysis failed, keeps the detail behind a toggle, and offers to try again", () => {
    const onRetry = vi.fn();
    render(<SuggestionsPanel pending={[]} decidedCount={0} labelOf={(k) => k} canEdit status="error" errorMessage="unavailable:server" onRetry={onRetry} {...noop} />);
    expect(screen.getByRole("alert").textContent).toMatch(/could not be made/);
    expect(screen.queryByText(/Nothing waiting/)).toBeNull();
    expect(screen.getByText("Details").closest("details")?.open).toBe(false);
    fireEvent.click(screen.getByRole("button", { name: "Try again" }));
    expect(onRetry).toHaveBeenCalledOnce();
  });
  it("explains the confidence words where they appear", () => {
    render(<SuggestionsPanel pending={[s("a", "peak", 0.9)]} decidedCount={0} labelOf={(k) => k} canEdit {...noop} />);
    expect(screen.getByTestId("confidence-explained").textContent).toMatch(/Suggested.*50 %.*Possible/);
  });
});
