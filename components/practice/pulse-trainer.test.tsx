import { cleanup, render, screen, within } from "@testing-library/react";
import { afterEach, describe, expect, it } from "vitest";
import { PulseTrainer } from "./pulse-trainer";

afterEach(cleanup);

describe("PulseTrainer", () => {
  it("explains each kind of step it sets, where the steps are", () => {
    render(<PulseTrainer tempo={72} markedHz={6} volume={0.2} onVolume={() => {}} />);
    const explained = screen.getByTestId("pulse-steps-explained");
    const kinds = new Set(screen.getAllByTestId("pulse-step").map((b) => /\d+\. (\w+)/.exec(b.textContent ?? "")![1]));
    expect(kinds.has("Settle")).toBe(true);
    expect(kinds.has("Target")).toBe(true);
    for (const kind of kinds) expect(within(explained).getByText(`${kind}:`)).toBeTruthy();
    expect(explained.textContent).toContain("the note's marked speed");
  });
});
