import { describe, expect, it } from "vitest";
import { describeMarkingImport } from "./import-report";

describe("what the player is told about markings in an uploaded file", () => {
  it("says nothing for a file without Ondula markings", () => {
    expect(describeMarkingImport({ importedMarkings: 0, unreadableMarkings: [] })).toBeNull();
  });

  it("counts the imported markings, singular and plural", () => {
    expect(describeMarkingImport({ importedMarkings: 1, unreadableMarkings: [] })).toEqual({ headline: "Imported 1 marking from the file.", details: null });
    expect(describeMarkingImport({ importedMarkings: 12, unreadableMarkings: [] })?.headline).toBe("Imported 12 markings from the file.");
  });

  it("names where each unreadable record sat, as the server wrote it, and its reason", () => {
    const r = describeMarkingImport({
      importedMarkings: 4,
      unreadableMarkings: [{ noteKey: "P1:m2:s1:v1:1/4:74", reason: "Depth is at most 100 cents.", where: "D5 in bar 2" }],
    });
    expect(r).toEqual({
      headline: "Imported 4 markings from the file.",
      details: "1 marking record could not be read and was left out: D5 in bar 2 (Depth is at most 100 cents).",
    });
  });

  it("never shows a note key when the place is unknown", () => {
    const r = describeMarkingImport({ importedMarkings: 0, unreadableMarkings: [{ noteKey: "P1:m2:s1:v1:1/4:74", reason: "bad" }] });
    expect(r?.details).not.toContain("P1:");
    expect(r?.details).toContain("a note (bad)");
  });

  it("names three and counts the rest when many are unreadable, and says when none came in", () => {
    const bad = [0, 1, 2, 3, 4].map((m) => ({ noteKey: `P1:m${m}:s1:v1:0/1:72`, reason: "bad", where: m === 0 ? "C5 in the pickup" : `C5 in bar ${m}` }));
    const r = describeMarkingImport({ importedMarkings: 0, unreadableMarkings: bad });
    expect(r?.headline).toBe("No markings could be imported from the file.");
    expect(r?.details).toBe("5 marking records could not be read and were left out: C5 in the pickup (bad); C5 in bar 1 (bad); C5 in bar 2 (bad); and 2 more.");
  });
});
