import { afterEach, describe, expect, it, vi } from "vitest";
import { cleanup, fireEvent, render, screen } from "@testing-library/react";
import type { AnalyzedNote } from "@/lib/analysis/types";
import { DEFAULT_MARKING } from "@/lib/markings/schema";

const calls: { notes: { midi: number; startSeconds: number; marking?: unknown }[]; volume?: number }[] = [];
const stop = vi.fn();
vi.mock("@/lib/export/audition", async (original) => ({
  ...(await original<typeof import("@/lib/export/audition")>()),
  auditionNotes: (_ctx: unknown, notes: never[], options: { volume?: number }) => {
    calls.push({ notes, volume: options.volume });
    return { stop, finished: new Promise<void>(() => {}) };
  },
}));
// jsdom has no Web Audio; the control only needs a context to hand over.
vi.stubGlobal("AudioContext", class { state = "running"; resume = async () => {}; close = async () => {}; });

const { AuditionControl } = await import("./audition-control");
const { AUDITION_CAUTION } = await import("@/lib/practice/cautions");
const { DEFAULT_VOLUME } = await import("@/lib/export/audition");

const note = (m: number, onset: string, midi: number): AnalyzedNote => ({ key: `P1:m${m}:s1:v1:${onset}:${midi}`, measure: String(m + 1), pitch: "C4", midi, onset, duration: "1/2", degree: null });
const notes = [note(0, "0/1", 62), note(0, "1/2", 64), note(1, "0/1", 65), note(1, "1/2", 67)];
const phrases = [{ start: notes[0].key, peak: notes[2].key, end: notes[3].key }];

afterEach(() => {
  cleanup();
  calls.length = 0;
});

describe("AuditionControl", () => {
  it("shows the caution and waits for a selection", () => {
    render(<AuditionControl keys={[]} notes={notes} phrases={phrases} markings={{}} tempo={120} />);
    expect(screen.getByTestId("audition-caution").textContent).toContain(AUDITION_CAUTION);
    expect(screen.getByRole("button", { name: "Audition" })).toHaveProperty("disabled", true);
    expect(screen.getByRole("button", { name: /Stop/ })).toHaveProperty("disabled", true);
  });

  it("plays the selected note quietly with its marking, and stops", async () => {
    const marking = { ...DEFAULT_MARKING, depthCents: 25 };
    render(<AuditionControl keys={[notes[1].key]} notes={notes} phrases={phrases} markings={{ [notes[1].key]: marking }} tempo={120} />);
    const slider = screen.getByRole("slider") as HTMLInputElement;
    expect(Number(slider.value)).toBe(DEFAULT_VOLUME);
    fireEvent.click(screen.getByRole("button", { name: "Audition the selected note" }));
    await vi.waitFor(() => expect(calls).toHaveLength(1));
    expect(calls[0].volume).toBe(DEFAULT_VOLUME);
    expect(calls[0].notes).toEqual([expect.objectContaining({ midi: 64, startSeconds: 0, marking })]);
    await vi.waitFor(() => expect(screen.getByRole("button", { name: /Stop/ })).toHaveProperty("disabled", false));
    fireEvent.click(screen.getByRole("button", { name: /Stop/ }));
    expect(stop).toHaveBeenCalled();
  });

  it("plays the whole phrase around one note on request", async () => {
    render(<AuditionControl keys={[notes[2].key]} notes={notes} phrases={phrases} markings={{}} tempo={120} />);
    fireEvent.click(screen.getByRole("checkbox", { name: "Whole phrase" }));
    fireEvent.change(screen.getByRole("slider"), { target: { value: "0.3" } });
    fireEvent.click(screen.getByRole("button", { name: "Audition the phrase (4 notes)" }));
    await vi.waitFor(() => expect(calls).toHaveLength(1));
    // Half notes at 120 bpm: one every second (arithmetic).
    expect(calls[0].notes.map((n) => [n.midi, n.startSeconds])).toEqual([[62, 0], [64, 1], [65, 2], [67, 3]]);
    expect(calls[0].volume).toBe(0.3);
  });
});
