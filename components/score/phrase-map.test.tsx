import { cleanup, fireEvent, render, screen } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { PhraseMap } from "./phrase-map";

afterEach(cleanup);

// A long part: 1,000 bars of four notes, a phrase every four bars, and one move to the dominant.
const noteOrder = Array.from({ length: 4000 }, (_, i) => `n${i}`);
const noteMeasures = noteOrder.map((_, i) => String(Math.floor(i / 4) + 1));
const phrases = Array.from({ length: 250 }, (_, i) => ({ start: `n${i * 16}`, peak: `n${i * 16 + 8}`, end: `n${i * 16 + 15}` }));
const localKeys = [{ tonic: "D", mode: "major" as const, fromMeasure: "101", toMeasure: "400" }];

function glyphLefts(): number[] {
  return [...document.querySelectorAll<HTMLElement>('[data-testid="phrase-map"] button[aria-label*=" start,"], [data-testid="phrase-map"] button[aria-label*=" peak,"]')]
    .map((b) => b.getBoundingClientRect().left + Number.parseFloat(b.closest<HTMLElement>("div[style]")?.style.left ?? "0") + Number.parseFloat(b.style.left || "0"))
    .sort((a, b) => a - b);
}

describe("PhraseMap on a 1,000-bar part", () => {
  it("draws close phrases together, with no glyphs on top of each other, and zooms in to each", () => {
    const onJump = vi.fn();
    render(<PhraseMap noteOrder={noteOrder} noteMeasures={noteMeasures} phrases={phrases} localKeys={localKeys} markings={{}} labelOf={(k) => k} onJump={onJump} />);
    const groups = document.querySelectorAll("[data-phrase-group]");
    expect(groups.length).toBeGreaterThan(0);
    expect(groups.length).toBeLessThan(20);
    const lefts = glyphLefts();
    for (let i = 1; i < lefts.length; i++) expect(lefts[i] - lefts[i - 1]).toBeGreaterThanOrEqual(24);
    fireEvent.click(groups[0]);
    expect(onJump).toHaveBeenCalledWith("n0");
    fireEvent.click(screen.getByRole("button", { name: "Each phrase" }));
    expect(document.querySelectorAll("[data-phrase-group]").length).toBe(0);
    expect(screen.getAllByRole("button", { name: /^Phrase \d+ start/ }).length).toBe(250);
  }, 60_000);

  it("shows where the music moves to another key", () => {
    const onJump = vi.fn();
    render(<PhraseMap noteOrder={noteOrder} noteMeasures={noteMeasures} phrases={phrases} localKeys={localKeys} markings={{}} labelOf={(k) => k} onJump={onJump} />);
    const key = screen.getByRole("button", { name: "Local key: D major, bars 101 to 400" });
    fireEvent.click(key);
    expect(onJump).toHaveBeenCalledWith("n400");
  });
});
