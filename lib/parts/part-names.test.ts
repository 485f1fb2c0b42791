import { describe, expect, it } from "vitest";
import { partChoiceLabels, partDisplayName } from "./part-names";

describe("part names for people", () => {
  it("uses the written name, else the part's place in the score, never its id", () => {
    expect(partDisplayName("Flute", 0)).toBe("Flute");
    expect(partDisplayName("  ", 1)).toBe("Part 2");
  });

  it("tells apart two parts with the same name by their place", () => {
    expect(partChoiceLabels([{ name: "Violin" }, { name: "Violin" }, { name: "Viola" }])).toEqual(["Violin (part 1 of 3)", "Violin (part 2 of 3)", "Viola"]);
  });
});
