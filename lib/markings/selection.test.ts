import { describe, expect, it } from "vitest";
import { EMPTY_SELECTION, extendTo, moveSelection, pruneSelection, selectOnly, targetOf, toggleKey, type NavNote } from "./selection";

const order: NavNote[] = [
  { key: "a", measureIndex: 0 },
  { key: "b", measureIndex: 0 },
  { key: "c", measureIndex: 1 },
  { key: "d", measureIndex: 1 },
  { key: "e", measureIndex: 3 },
];

describe("selection", () => {
  it("moves note to note in time order and stops at the ends", () => {
    let s = selectOnly("a");
    s = moveSelection(order, s, "next", false);
    expect(s).toEqual({ keys: ["b"], anchor: "b", focus: "b" });
    s = moveSelection(order, selectOnly("e"), "next", false);
    expect(s.focus).toBe("e");
    expect(moveSelection(order, selectOnly("a"), "previous", false).focus).toBe("a");
  });

  it("starts at the first note when nothing is selected, at the last when going back", () => {
    expect(moveSelection(order, EMPTY_SELECTION, "next", false).focus).toBe("a");
    expect(moveSelection(order, EMPTY_SELECTION, "previous", false).focus).toBe("e");
  });

  it("extends from the anchor with Shift, in both directions", () => {
    let s = selectOnly("c");
    s = moveSelection(order, s, "next", true);
    s = moveSelection(order, s, "next", true);
    expect(s).toEqual({ keys: ["c", "d", "e"], anchor: "c", focus: "e" });
    s = moveSelection(order, s, "previous", true);
    s = moveSelection(order, s, "previous", true);
    s = moveSelection(order, s, "previous", true);
    expect(s).toEqual({ keys: ["b", "c"], anchor: "c", focus: "b" });
  });

  it("jumps bar to bar, skipping bars without notes", () => {
    expect(targetOf(order, "a", "next-bar")).toBe("c");
    expect(targetOf(order, "c", "next-bar")).toBe("e");
    expect(targetOf(order, "e", "previous-bar")).toBe("c");
    expect(targetOf(order, "d", "previous-bar")).toBe("c");
    expect(targetOf(order, "c", "previous-bar")).toBe("a");
  });

  it("selects a range by Shift-click and toggles single notes in time order", () => {
    const range = extendTo(order, selectOnly("d"), "b");
    expect(range.keys).toEqual(["b", "c", "d"]);
    const toggled = toggleKey(order, selectOnly("d"), "a");
    expect(toggled.keys).toEqual(["a", "d"]);
    expect(toggled.focus).toBe("a");
    expect(toggleKey(order, toggled, "a").keys).toEqual(["d"]);
    expect(toggleKey(order, selectOnly("d"), "d")).toEqual(EMPTY_SELECTION);
  });

  it("drops keys that no longer exist after a re-layout", () => {
    const s = pruneSelection(order.slice(0, 2), { keys: ["a", "c"], anchor: "c", focus: "c" });
    expect(s).toEqual({ keys: ["a"], anchor: "a", focus: "a" });
  });
});
