import { describe, expect, it } from "vitest";
import type { Suggestion } from "@/lib/analysis/types";
import { toState } from "./changes";
import { DEFAULT_MARKING } from "./schema";
import { confidenceLabel, groupByRole, pendingSuggestions, rankSuggestions, strengthOf } from "./suggestions";

const s = (note: string, role: Suggestion["role"], confidence = 0.8): Suggestion => ({
  note, measure: "1", pitch: "A4", role, confidence, resolvesTo: null, reason: "because",
});

describe("suggestions", () => {
  it("labels confidence from 0.5 up as suggested, below as possible", () => {
    expect(confidenceLabel(0.5)).toBe("suggested");
    expect(confidenceLabel(0.49)).toBe("possible");
  });

  it("hides dismissed suggestions and notes that already carry the role", () => {
    const all = [s("a", "tension"), s("b", "peak"), s("c", "phrase-start")];
    const markings = toState([{ ...DEFAULT_MARKING, role: "peak", noteKey: "b", version: 1, authorId: "u", updatedAt: "" }]);
    const pending = pendingSuggestions(all, [{ noteKey: "a", role: "tension", decision: "dismissed" }], markings);
    expect(pending.map((p) => p.note)).toEqual(["c"]);
  });

  it("shows an accepted suggestion again when its marking was undone", () => {
    const pending = pendingSuggestions([s("a", "tension")], [{ noteKey: "a", role: "tension", decision: "accepted" }], {});
    expect(pending).toHaveLength(1);
  });

  it("groups by role in the given order, the more confident first", () => {
    const groups = groupByRole([s("a", "peak", 0.3), s("b", "tension"), s("c", "peak", 0.9)], ["phrase-start", "peak", "tension", "resolution"]);
    expect(groups.map((g) => g.role)).toEqual(["peak", "tension"]);
    expect(groups[0].items.map((i) => i.note)).toEqual(["c", "a"]);
  });
});

describe("rankSuggestions", () => {
  const order = Array.from({ length: 30 }, (_, i) => `n${i}`);
  it("keeps a short list whole and in order", () => {
    const few = [s("n1", "tension", 0.2), s("n2", "peak", 0.9)];
    expect(rankSuggestions(few, [], order)).toEqual({ top: few, rest: [] });
  });

  it("keeps the strongest of each role per phrase, counts notes outside phrases apart, and caps the list", () => {
    const phrases = [{ start: "n0", end: "n9" }];
    const all = [
      ...Array.from({ length: 10 }, (_, i) => s(`n${i}`, "tension", 0.1 * i)),
      // Outside every phrase: each note is its own group.
      ...Array.from({ length: 20 }, (_, i) => s(`n${10 + i}`, "peak", 0.5 + i * 0.01)),
    ];
    const { top, rest } = rankSuggestions(all, phrases, order, 5);
    expect(top.map((x) => x.note)).toEqual(["n9", "n29", "n28", "n27", "n26"]);
    expect(top.length + rest.length).toBe(all.length);
    expect(rest[0].note).toBe("n0");
  });

  it("reads a numeric strength when the analysis gives one, else the confidence", () => {
    expect(strengthOf({ ...s("a", "tension", 0.4), strength: 0.9 } as Suggestion)).toBe(0.9);
    expect(strengthOf(s("a", "tension", 0.4))).toBe(0.4);
  });
});
