import { afterEach, describe, expect, it, vi } from "vitest";
import { cleanup, fireEvent, render, screen } from "@testing-library/react";
import { LineChoice } from "./line-choice";

afterEach(cleanup);

describe("LineChoice", () => {
  it("is a radio group named Line with Upper and Lower, the player's line checked", () => {
    render(<LineChoice writtenAs="voices" line="upper" canEdit onChange={() => {}} />);
    const group = screen.getByRole("radiogroup", { name: "Line:" });
    expect(group).toBeTruthy();
    const upper = screen.getByRole("radio", { name: "Upper" }) as HTMLInputElement;
    const lower = screen.getByRole("radio", { name: "Lower" }) as HTMLInputElement;
    expect(upper.checked).toBe(true);
    expect(lower.checked).toBe(false);
    // The explanation is the group's description.
    const help = document.getElementById(group.getAttribute("aria-describedby")!)!;
    expect(help.textContent).toContain("Two players share this staff, written in two voices");
    expect(help.textContent).toContain("follow the upper line");
  });

  it("tells the chosen line on change", () => {
    const onChange = vi.fn();
    render(<LineChoice writtenAs="chords" line="upper" canEdit onChange={onChange} />);
    expect(screen.getByText(/written as chords/)).toBeTruthy();
    fireEvent.click(screen.getByRole("radio", { name: "Lower" }));
    expect(onChange).toHaveBeenCalledWith("lower");
  });

  it("shows the owner's choice, unchangeable, to someone the part is shared with", () => {
    const onChange = vi.fn();
    render(<LineChoice writtenAs="voices" line="lower" canEdit={false} onChange={onChange} />);
    const lower = screen.getByRole("radio", { name: "Lower" }) as HTMLInputElement;
    expect(lower.checked).toBe(true);
    // Disabled through its fieldset.
    expect(lower.matches(":disabled")).toBe(true);
    expect((screen.getByRole("radio", { name: "Upper" }) as HTMLInputElement).matches(":disabled")).toBe(true);
    expect(screen.getByText(/The part’s owner chooses the line/)).toBeTruthy();
  });

  it("announces a refused change", () => {
    render(<LineChoice writtenAs="voices" line="upper" canEdit error="This part has one player on its staff." onChange={() => {}} />);
    expect(screen.getByRole("alert").textContent).toBe("This part has one player on its staff.");
  });
});
