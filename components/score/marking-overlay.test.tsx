import { cleanup, fireEvent, render } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { toState } from "@/lib/markings/changes";
import { glyphSlots } from "@/lib/markings/glyph-geometry";
import { EMPTY_SELECTION } from "@/lib/markings/selection";
import { MarkingOverlay, type MarkingOverlayProps } from "./marking-overlay";
import { K, fakeBoxes, marking } from "./test-fixtures";

afterEach(cleanup);

function draw(over: Partial<MarkingOverlayProps> = {}) {
  return render(
    <div style={{ position: "relative" }}>
      <MarkingOverlay boxes={fakeBoxes} width={800} height={400} scale={1} markings={{}} selection={EMPTY_SELECTION} {...over} />
    </div>,
  );
}

const ys = (d: string) => [...d.matchAll(/[ML](-?[\d.]+),(-?[\d.]+)/g)].map((m) => Number(m[2]));
const xs = (d: string) => [...d.matchAll(/[ML](-?[\d.]+),(-?[\d.]+)/g)].map((m) => Number(m[1]));

describe("MarkingOverlay", () => {
  it("draws a marked note's wave above its staff, starting at the note", () => {
    const { container } = draw({ markings: toState([marking(K[1], { depthCents: 50, speedHz: 6 })]) });
    const wave = container.querySelector(`[data-glyph="wave"][data-note-key="${K[1]}"] path`)!;
    const d = wave.getAttribute("d")!;
    expect(Math.max(...ys(d))).toBeLessThan(fakeBoxes[1].staffTop);
    // The first system's highest note (y 80) lifts the whole band of that system.
    expect(Math.max(...ys(d))).toBeLessThan(80);
    expect(Math.min(...xs(d))).toBeCloseTo(fakeBoxes[1].x, 0);
  });

  it("keeps glyphs of one system on one band and moves with the notes on another", () => {
    const { container } = draw({ markings: toState([marking(K[0], { role: "peak" }), marking(K[3], { role: "peak" })]) });
    const role = (k: string) => container.querySelector(`[data-glyph="role"][data-note-key="${k}"]`)!.getAttribute("d")!;
    const top0 = Math.min(...ys(role(K[0])));
    const top3 = Math.min(...ys(role(K[3])));
    expect(top3 - top0).toBeCloseTo(glyphSlots(fakeBoxes[3]).roleY - glyphSlots({ y: 80, staffTop: 100 }).roleY, 0);
  });

  it("draws each role with its own shape and numbers next to the wave", () => {
    const { container } = draw({
      markings: toState([
        marking(K[0], { role: "phrase-start", depthCents: 20, speedHz: 5.5 }),
        marking(K[1], { role: "tension" }),
        marking(K[2], { role: "resolution", depthCents: 0 }),
      ]),
    });
    const roles = [...container.querySelectorAll('[data-glyph="role"]')].map((e) => e.getAttribute("data-role"));
    expect(roles).toEqual(["phrase-start", "tension", "resolution"]);
    expect(container.querySelector(`[data-glyph="wave"][data-note-key="${K[2]}"]`)!.getAttribute("data-kind")).toBe("none");
    expect(container.querySelector('[data-glyph="numbers"]')!.textContent).toBe("20¢ 5.5");
    // The tension tone and the following resolution are joined by an arc.
    expect(container.querySelector(`[data-glyph="arc"][data-note-key="${K[1]}"]`)).not.toBeNull();
  });

  it("shows undecided suggestions hollow and dashed, beside a role the note already has", () => {
    const { container } = draw({
      markings: toState([marking(K[0], { role: "peak" })]),
      suggestions: [
        { noteKey: K[0], role: "phrase-start", confidence: 0.8, resolvesTo: null },
        { noteKey: K[3], role: "tension", confidence: 0.3, resolvesTo: K[4] },
      ],
    });
    const s = container.querySelectorAll('[data-glyph="suggestion"]');
    expect(s).toHaveLength(2);
    for (const el of s) {
      expect(el.getAttribute("stroke-dasharray")).toBeTruthy();
      expect(el.getAttribute("fill")).not.toMatch(/#009E73|#CC79A7/i);
    }
    expect(s[1].getAttribute("data-confidence")).toBe("possible");
    const solid = container.querySelector(`[data-glyph="role"][data-note-key="${K[0]}"]`)!.getAttribute("d")!;
    expect(Math.min(...xs(s[0].getAttribute("d")!))).toBeGreaterThan(Math.max(...xs(solid)));
  });

  it("marks the focus with an outline and a caret, other selected notes with an underline", () => {
    const { container } = draw({ selection: { keys: [K[0], K[1]], anchor: K[0], focus: K[1] } });
    const focus = container.querySelector('[data-focus="true"]')!;
    expect(focus.getAttribute("data-selected")).toBe(K[1]);
    expect(focus.querySelector('[data-caret="true"]')).not.toBeNull();
    expect(container.querySelector(`[data-selected="${K[0]}"] line`)).not.toBeNull();
  });

  it("reports a click on a note with the selection mode of the modifier keys", () => {
    const onDown = vi.fn();
    const { container } = draw({ onNoteClick: onDown });
    const hit = (k: string) => container.querySelector(`[data-layer="hits"] [data-note-key="${k}"]`)!;
    fireEvent.click(hit(K[2]));
    fireEvent.click(hit(K[3]), { shiftKey: true });
    fireEvent.click(hit(K[4]), { ctrlKey: true });
    expect(onDown.mock.calls).toEqual([[K[2], "only"], [K[3], "extend"], [K[4], "toggle"]]);
    // Hit areas are at least 24 px wide for fingers.
    expect(Number(hit(K[0]).getAttribute("width"))).toBeGreaterThanOrEqual(24);
  });

  // Two voices at one x, or with the lower voice's head shifted by 2 px as the engraver draws it
  // in a real file (incorrect_time_signature_pv, bar 4), in the engraver's order: the upper voice's
  // A3, then the lower voice's A2, whose target reaches further down and, drawn later, would lie
  // over the A3's (SVG 1.1, "Rendering order": what comes later is painted on top).
  it.each([0, -2])("stacks the targets of notes in one column so each head takes its own taps (lower head shifted %d px)", (shift) => {
    const boxes = [
      { key: "P2:m3:s2:v6:0/1:45", x: 100 + shift, y: 150, width: 10, height: 10, staffTop: 120, measureIndex: 3 },
      { key: "P2:m3:s2:v5:0/1:57", x: 100, y: 120, width: 10, height: 10, staffTop: 120, measureIndex: 3 },
      { key: "P2:m3:s2:v5:1/4:59", x: 140, y: 118, width: 10, height: 10, staffTop: 120, measureIndex: 3 },
    ];
    const { container } = draw({ boxes: [boxes[1], boxes[0], boxes[2]] });
    const rects = [...container.querySelectorAll('[data-layer="hits"] rect')];
    const order = rects.map((r) => r.getAttribute("data-note-key"));
    expect(order.indexOf(boxes[1].key)).toBeGreaterThan(order.indexOf(boxes[0].key));
    const box = (k: string) => {
      const r = rects.find((e) => e.getAttribute("data-note-key") === k)!;
      const n = (a: string) => Number(r.getAttribute(a));
      return { x: n("x"), width: n("width"), top: n("y"), bottom: n("y") + n("height") };
    };
    const lower = box(boxes[0].key);
    const upper = box(boxes[1].key);
    // The targets overlap; the upper head's ends above the lower head, the lower's reaches below it.
    expect(upper.x).toBeLessThan(lower.x + lower.width);
    expect(lower.x).toBeLessThan(upper.x + upper.width);
    expect(upper.bottom).toBeLessThan(boxes[0].y);
    expect(lower.bottom).toBeGreaterThan(boxes[0].y + boxes[0].height);
  });
});
