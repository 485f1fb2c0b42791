import { cleanup, fireEvent, render, screen } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { DEFAULT_MARKING } from "@/lib/markings/schema";
import { MarkingPanel, type MarkingPanelProps } from "./marking-panel";

afterEach(cleanup);

function setup(over: Partial<MarkingPanelProps> = {}) {
  const props: MarkingPanelProps = {
    count: 1,
    label: "Bar 3 · A4",
    values: { ...DEFAULT_MARKING, depthCents: 20, speedHz: 5.5 },
    tempo: 66,
    canEdit: true,
    clipboard: null,
    onPatch: vi.fn(),
    onClear: vi.fn(),
    onCopy: vi.fn(),
    onPaste: vi.fn(),
    ...over,
  };
  render(<MarkingPanel {...props} />);
  return props;
}

const typeInto = (label: RegExp, value: string) => {
  const input = screen.getByLabelText(label, { selector: "input:not([type=range])" });
  fireEvent.change(input, { target: { value } });
  fireEvent.blur(input);
  return input;
};

describe("MarkingPanel", () => {
  it("shows the numbers next to the sliders and pulses per beat at the part's tempo", () => {
    setup();
    expect((screen.getByLabelText(/^Depth$/, { selector: "input" }) as HTMLInputElement).value).toBe("20");
    expect((screen.getByLabelText(/^Speed$/, { selector: "input" }) as HTMLInputElement).value).toBe("5.5");
    // 5.5 Hz × 60 / 66 bpm = 5 pulses per beat (arithmetic).
    expect((screen.getByLabelText(/Pulses per beat/) as HTMLInputElement).value).toBe("5");
  });

  it("refuses a depth above 100 cents with an inline message and sends nothing", () => {
    const props = setup();
    const input = typeInto(/^Depth$/, "150");
    expect(screen.getByRole("alert").textContent).toMatch(/above 100¢/);
    expect(input.getAttribute("aria-invalid")).toBe("true");
    expect(props.onPatch).not.toHaveBeenCalled();
  });

  it("refuses a speed above 12 Hz and a word instead of a number", () => {
    const props = setup();
    typeInto(/^Speed$/, "13");
    expect(screen.getByRole("alert").textContent).toMatch(/above 12 Hz/);
    typeInto(/^Speed$/, "fast");
    expect(screen.getByRole("alert").textContent).toMatch(/number/i);
    expect(props.onPatch).not.toHaveBeenCalled();
  });

  it("commits a valid number once, as a patch of that field", () => {
    const props = setup();
    typeInto(/^Depth$/, "45");
    expect(props.onPatch).toHaveBeenCalledWith({ depthCents: 45 });
  });

  it("sets the speed from pulses per beat", () => {
    const props = setup({ tempo: 120 });
    typeInto(/Pulses per beat/, "3");
    // 3 pulses per beat at 120 bpm = 6 Hz.
    expect(props.onPatch).toHaveBeenCalledWith({ speedHz: 6 });
  });

  it("says when pulses per beat would need a speed out of range", () => {
    const props = setup({ tempo: 120 });
    typeInto(/Pulses per beat/, "7");
    expect(screen.getByRole("alert").textContent).toMatch(/above 12 Hz.*14 Hz at 120/);
    expect(props.onPatch).not.toHaveBeenCalled();
  });

  it("changes placement, shape and role with one click each", () => {
    const props = setup();
    fireEvent.click(screen.getByRole("radio", { name: /Top on the pitch/ }));
    fireEvent.click(screen.getByRole("radio", { name: /Fading/ }));
    fireEvent.click(screen.getByRole("radio", { name: /Tension tone/ }));
    fireEvent.click(screen.getByRole("radio", { name: /None/ }));
    expect(props.onPatch).toHaveBeenNthCalledWith(1, { placement: "top-on-pitch" });
    expect(props.onPatch).toHaveBeenNthCalledWith(2, { shape: "fading" });
    expect(props.onPatch).toHaveBeenNthCalledWith(3, { role: "tension" });
    expect(props.onPatch).toHaveBeenCalledTimes(3); // "None" was already chosen
  });

  it("speaks of the whole selection and pastes to all of it", () => {
    const props = setup({ count: 4, label: "4 notes, bars 3–4", mixed: true, clipboard: DEFAULT_MARKING });
    expect(screen.getByTestId("marking-status").textContent).toMatch(/all 4 selected notes/);
    fireEvent.click(screen.getByRole("button", { name: "Paste to 4" }));
    expect(props.onPaste).toHaveBeenCalled();
  });

  it("offers to mark an unmarked note and says so", () => {
    const props = setup({ values: null });
    expect(screen.getByTestId("marking-status").textContent).toMatch(/Not marked yet/);
    fireEvent.click(screen.getByRole("button", { name: "No vibrato here" }));
    expect(props.onPatch).toHaveBeenCalledWith({ depthCents: 0 });
    expect((screen.getByRole("button", { name: "Copy marking" }) as HTMLButtonElement).disabled).toBe(true);
  });

  it("is read-only for someone who may not change the markings", () => {
    setup({ canEdit: false });
    expect(screen.getByText(/only its owner changes them/)).toBeTruthy();
    expect((screen.getByLabelText(/^Depth$/, { selector: "input" }) as HTMLInputElement).closest("fieldset")!.disabled).toBe(true);
  });
});
