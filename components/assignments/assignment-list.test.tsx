import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { cleanup, fireEvent, render, screen, waitFor, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { addDays, localIsoDate } from "@/lib/assignments/due";
import type { AssignmentDto, AssignmentListDto } from "@/lib/assignments/schema";
import { assignmentKeys } from "@/components/client/keys";
import { PracticeAssignments } from "./assignment-list";

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const PART = "2f6c1f5e-1111-4222-8333-444455556666";
const today = localIsoDate(new Date());

const assignment = (over: Partial<AssignmentDto>): AssignmentDto => ({
  id: "a1", partId: PART, noteKey: null, drill: "free", instructions: "", minutesPerDay: null, dueOn: null, doneAt: null, version: 1,
  assignedById: "teacher", assignedByName: "Tess Tutor", createdAt: "2026-01-01T10:00:00.000Z", updatedAt: "2026-01-01T10:00:00.000Z", ...over,
});

/** Renders the list with the given data in the cache; `fetch` answers requests the list sends. */
function setup(list: AssignmentListDto, answer: (url: string, init?: RequestInit) => unknown) {
  const calls: Array<{ url: string; init?: RequestInit }> = [];
  vi.stubGlobal("fetch", vi.fn(async (url: string, init?: RequestInit) => {
    calls.push({ url, init });
    return new Response(JSON.stringify(answer(url, init)), { status: 200, headers: { "content-type": "application/json" } });
  }));
  const client = new QueryClient({ defaultOptions: { queries: { retry: false, staleTime: Infinity } } });
  client.setQueryData(assignmentKeys.list(PART), list);
  const onPractise = vi.fn();
  render(
    <QueryClientProvider client={client}>
      <PracticeAssignments partId={PART} labelOf={(k) => (k === "K3" ? "Bar 3 · A5" : k)} chosenNote={{ key: "K3", label: "Bar 3 · A5" }} serverToday={today} onPractise={onPractise} />
    </QueryClientProvider>,
  );
  return { calls, onPractise };
}

describe("PracticeAssignments", () => {
  it("shows the player's open practice first with lateness in words, done practice folded below", () => {
    setup(
      {
        canAssign: false, canMarkDone: true, viewerId: "player",
        assignments: [
          assignment({ id: "soon", drill: "hold-ladder", noteKey: "K3", dueOn: addDays(today, 2), minutesPerDay: 10 }),
          assignment({ id: "late", drill: "take", dueOn: addDays(today, -2) }),
          assignment({ id: "done", drill: "pulse-trainer", doneAt: "2026-01-02T10:00:00.000Z" }),
        ],
      },
      () => ({ updated: 0 }),
    );
    expect(screen.getByRole("heading", { name: "From your teacher" })).toBeTruthy();
    const open = screen.getAllByTestId("assignment").filter((li) => li.dataset.state === "open");
    expect(open.map((li) => li.textContent)).toEqual([expect.stringContaining("Take"), expect.stringContaining("Hold ladder · Bar 3 · A5")]);
    expect(within(open[0]).getByTestId("due").textContent).toMatch(/Overdue by 2 days/);
    expect(within(open[1]).getByTestId("due").textContent).toMatch(/Due in 2 days/);
    expect(screen.getByTestId("done-assignments").textContent).toMatch(/Done \(1\)/);
    // No teacher's controls for the player.
    expect(screen.queryByRole("button", { name: "Edit" })).toBeNull();
    expect(screen.queryByRole("button", { name: "Assign practice" })).toBeNull();
  });

  it("ticks practice done with the version it was shown at, and opens its drill", async () => {
    const { calls, onPractise } = setup(
      { canAssign: false, canMarkDone: true, viewerId: "player", assignments: [assignment({ id: "a9", drill: "hold-ladder", noteKey: "K3", version: 4 })] },
      (url) => (url.includes("/assignments/") ? assignment({ id: "a9", version: 5, doneAt: "2026-01-03T10:00:00.000Z" }) : { updated: 1 }),
    );
    fireEvent.click(screen.getByRole("button", { name: "Practise this: Hold ladder, Bar 3 · A5" }));
    expect(onPractise).toHaveBeenCalledWith(expect.objectContaining({ id: "a9" }));
    const box = screen.getByLabelText<HTMLInputElement>("Done: Hold ladder, Bar 3 · A5");
    fireEvent.click(box);
    // Ticked in the same turn as the click, before the request has even left.
    expect(box.checked).toBe(true);
    await waitFor(() => expect(calls.some((c) => c.url.endsWith("/assignments/a9"))).toBe(true));
    const patch = calls.find((c) => c.url.endsWith("/assignments/a9"))!;
    expect(patch.init?.method).toBe("PATCH");
    expect(JSON.parse(String(patch.init?.body))).toEqual({ version: 4, done: true });
    // Seeing the list reads the practice notifications.
    expect(calls.some((c) => c.url === "/api/notifications/read" && JSON.parse(String(c.init?.body)).kind === "assignment")).toBe(true);
  });

  it("gives a teacher Edit and Remove on their own practice only, and the form to set more", () => {
    setup(
      {
        canAssign: true, canMarkDone: false, viewerId: "teacher",
        assignments: [assignment({ id: "mine", drill: "take" }), assignment({ id: "theirs", drill: "free", assignedById: "other", assignedByName: "Otto Other" })],
      },
      () => ({}),
    );
    expect(screen.getByRole("heading", { name: "Practice set on this part" })).toBeTruthy();
    expect(screen.getAllByRole("button", { name: "Edit" })).toHaveLength(1);
    expect(screen.queryByRole("checkbox")).toBeNull();
    fireEvent.click(screen.getByRole("button", { name: "Assign practice" }));
    expect((screen.getByLabelText("On Bar 3 · A5") as HTMLInputElement).checked).toBe(true);
  });
});
