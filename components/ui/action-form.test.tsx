import { act, cleanup, fireEvent, render, screen } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { idleState, type ActionState } from "@/lib/http/action-state";
import { ActionForm } from "./action-form";

afterEach(cleanup);

describe("ActionForm with a confirmation", () => {
  it("asks first, and acts only from its Yes button; Keep takes the question back", async () => {
    const action = vi.fn(async (_s: ActionState, _f: FormData): Promise<ActionState> => ({ ...idleState, status: 200, ok: true, message: "Removed." }));
    render(
      <ActionForm action={action} inline variant="danger" submitLabel="Remove" submitAriaLabel="Remove Ines" hidden={{ playerId: "p1" }} confirm={{ question: "Remove Ines from your studio?", yes: "Yes, remove" }} />,
    );
    fireEvent.click(screen.getByRole("button", { name: "Remove Ines" }));
    expect(action).not.toHaveBeenCalled();
    expect(screen.getByText("Remove Ines from your studio?")).toBeTruthy();
    fireEvent.click(screen.getByRole("button", { name: "Keep" }));
    expect(screen.queryByText("Remove Ines from your studio?")).toBeNull();
    expect(action).not.toHaveBeenCalled();

    fireEvent.click(screen.getByRole("button", { name: "Remove Ines" }));
    await act(async () => {
      fireEvent.click(screen.getByRole("button", { name: "Yes, remove" }));
    });
    expect(action).toHaveBeenCalledOnce();
    expect((action.mock.calls[0][1] as FormData).get("playerId")).toBe("p1");
  });
});
