import { cleanup, fireEvent, render, screen } from "@testing-library/react";
import { afterEach, describe, expect, it } from "vitest";
import { FIRST_MARK_HINT, WorkspaceHint } from "./workspace-hint";

afterEach(cleanup);

describe("WorkspaceHint", () => {
  it("says how to begin until the first marking", () => {
    const { rerender } = render(<WorkspaceHint showHint />);
    expect(screen.getByText(FIRST_MARK_HINT)).toBeTruthy();
    rerender(<WorkspaceHint showHint={false} />);
    expect(screen.queryByText(FIRST_MARK_HINT)).toBeNull();
  });
  it("shows the keyboard help on a visible button", () => {
    render(<WorkspaceHint showHint={false} />);
    const button = screen.getByRole("button", { name: "Keyboard help" });
    expect(button.getAttribute("aria-expanded")).toBe("false");
    fireEvent.click(button);
    expect(button.getAttribute("aria-expanded")).toBe("true");
    expect(screen.getByTestId("keyboard-help").textContent).toMatch(/Enter.*open the marking panel/);
  });
});
