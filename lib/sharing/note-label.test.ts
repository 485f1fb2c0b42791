import { describe, expect, it } from "vitest";
import { notificationPath, threadLabel, threadPath } from "./note-label";

describe("thread labels and links", () => {
  it("names the bar of a note key by its written number, the pickup as the pickup", () => {
    const bars = [{ number: "0", implicit: true }, ...Array.from({ length: 14 }, (_, i) => ({ number: String(i + 1) }))];
    expect(threadLabel("P1:m0:s1:v1:0/1:72", bars)).toBe("the pickup");
    expect(threadLabel("P1:m12:s1:v1:3/8:70", bars)).toBe("bar 12");
    expect(threadLabel("P1:m3:s1:v1:1/4:74:g1", bars)).toBe("bar 3");
  });

  it("names the part thread and unknown keys", () => {
    expect(threadLabel("part", [])).toBe("the whole part");
    expect(threadLabel("nonsense", [])).toBe("a note");
  });

  it("links to the note with its key encoded", () => {
    const id = "2f6c1f5e-1111-4222-8333-444455556666";
    expect(threadPath(id, "P1:m12:s1:v1:3/8:70")).toBe(`/parts/${id}?note=P1%3Am12%3As1%3Av1%3A3%2F8%3A70`);
    expect(decodeURIComponent(threadPath(id, "P1:m2:s1:v1:0/1:70").split("note=")[1])).toBe("P1:m2:s1:v1:0/1:70");
    expect(threadPath(id, "part")).toBe(`/parts/${id}?thread=part`);
    expect(threadPath(id, null)).toBe(`/parts/${id}`);
  });

  it("sends practice notifications to the practice page, the rest to their thread", () => {
    const id = "2f6c1f5e-1111-4222-8333-444455556666";
    expect(notificationPath(id, "assignment", null)).toBe(`/parts/${id}/practice#assignments`);
    expect(notificationPath(id, "comment", "part")).toBe(`/parts/${id}?thread=part`);
    expect(notificationPath(id, "proposal", "P1:m0:s1:v1:0/1:72")).toBe(threadPath(id, "P1:m0:s1:v1:0/1:72"));
  });
});
