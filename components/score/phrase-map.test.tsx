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
    // The band under the map says what its boxes are, once, for a first-time reader.
    expect(screen.getByTestId("phrase-map-keys-caption").textContent).toMatch(/another key/);
    fireEvent.click(key);
    expect(onJump).toHaveBeenCalledWith("n400");
  });
});

describe("PhraseMap names a local key's bars as the part writes them", () => {
  it("calls a span from the pickup 'the pickup to bar N'", () => {
    // Four bars: a pickup written number="0" implicit="yes", then bars 1–3, two notes each.
    const order = Array.from({ length: 8 }, (_, i) => `P1:m${Math.floor(i / 2)}:s1:v1:${i % 2}/2:60`);
    const measures = order.map((_, i) => String(Math.floor(i / 2)));
    const bars = [{ number: "0", implicit: true }, { number: "1" }, { number: "2" }, { number: "3" }];
    render(
      <PhraseMap
        noteOrder={order}
        noteMeasures={measures}
        phrases={[{ start: order[0], peak: order[3], end: order[7] }]}
        localKeys={[{ tonic: "G", mode: "major", fromMeasure: "0", toMeasure: "2" }]}
        bars={bars}
        markings={{}}
        labelOf={(k) => k}
        onJump={() => {}}
      />,
    );
    expect(screen.getByTitle("G major, the pickup to bar 2")).toBeTruthy();
  });
});
