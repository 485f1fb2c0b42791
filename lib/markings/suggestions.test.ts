import { describe, expect, it } from "vitest";
import type { Suggestion } from "@/lib/analysis/types";
import { toState } from "./changes";
import { DEFAULT_MARKING } from "./schema";
import { confidenceLabel, groupByRole, pendingSuggestions } from "./suggestions";

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
