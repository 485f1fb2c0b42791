import { afterEach, describe, expect, it } from "vitest";
import { cleanup, render, screen } from "@testing-library/react";
import { ExportMenu } from "./export-menu";

afterEach(cleanup);

describe("ExportMenu", () => {
  it("offers MusicXML, MIDI and the stand copy of the part", () => {
    render(<ExportMenu partId="abc" />);
    expect(screen.getByText("MusicXML with markings").getAttribute("href")).toBe("/api/parts/abc/export?format=musicxml");
    expect(screen.getByText("MIDI with vibrato").getAttribute("href")).toBe("/api/parts/abc/export?format=midi");
    expect(screen.getByText("Stand copy (print, PDF)").getAttribute("href")).toBe("/parts/abc/print");
  });
});
