import { afterEach, describe, expect, it, vi } from "vitest";
import { act, cleanup, fireEvent, render, screen } from "@testing-library/react";
import { MenuButton } from "./menu-button";

afterEach(cleanup);

/** Behaviour from the WAI-ARIA Authoring Practices' menu button pattern (W3C, APG 1.2). */
function setup() {
  const rename = vi.fn();
  const remove = vi.fn();
  render(
    <MenuButton
      label="Actions for Slow River"
      items={[
        { label: "Download the original file", href: "/api/parts/p1/source" },
        { label: "Rename", onSelect: rename },
        { label: "Delete", onSelect: remove, tone: "danger" },
      ]}
    >
      <span aria-hidden="true">⋯</span>
    </MenuButton>,
  );
  return { button: screen.getByRole("button", { name: "Actions for Slow River" }), rename, remove };
}

describe("MenuButton", () => {
  it("says it opens a menu and whether it is open", () => {
    const { button } = setup();
    expect(button.getAttribute("aria-haspopup")).toBe("menu");
    expect(button.getAttribute("aria-expanded")).toBe("false");
    expect(screen.queryByRole("menu")).toBeNull();
    fireEvent.click(button);
    expect(button.getAttribute("aria-expanded")).toBe("true");
    const menu = screen.getByRole("menu", { name: "Actions for Slow River" });
    expect(button.getAttribute("aria-controls")).toBe(menu.id);
    expect(screen.getAllByRole("menuitem").map((i) => i.textContent)).toEqual(["Download the original file", "Rename", "Delete"]);
  });

  it("opens on the first item with ArrowDown and the last with ArrowUp; arrows wrap, Home and End jump", () => {
    const { button } = setup();
    fireEvent.keyDown(button, { key: "ArrowDown" });
    const items = screen.getAllByRole("menuitem");
    expect(document.activeElement).toBe(items[0]);
    fireEvent.keyDown(items[0], { key: "ArrowUp" });
    expect(document.activeElement).toBe(items[2]);
    fireEvent.keyDown(items[2], { key: "ArrowDown" });
    expect(document.activeElement).toBe(items[0]);
    fireEvent.keyDown(items[0], { key: "End" });
    expect(document.activeElement).toBe(items[2]);
    fireEvent.keyDown(items[2], { key: "Home" });
    expect(document.activeElement).toBe(items[0]);
    fireEvent.keyDown(items[0], { key: "Escape" });
    expect(screen.queryByRole("menu")).toBeNull();
    expect(document.activeElement).toBe(button);
    fireEvent.keyDown(button, { key: "ArrowUp" });
    expect(document.activeElement).toBe(screen.getAllByRole("menuitem")[2]);
  });

  it("runs a command, closes, and gives the focus back to the button", () => {
    const { button, rename, remove } = setup();
    fireEvent.click(button);
    fireEvent.click(screen.getByRole("menuitem", { name: "Rename" }));
    expect(rename).toHaveBeenCalledTimes(1);
    expect(remove).not.toHaveBeenCalled();
    expect(screen.queryByRole("menu")).toBeNull();
    expect(document.activeElement).toBe(button);
  });

  it("keeps links as links, and closes on a pointer down elsewhere", () => {
    const { button } = setup();
    fireEvent.click(button);
    expect(screen.getByRole("menuitem", { name: "Download the original file" }).getAttribute("href")).toBe("/api/parts/p1/source");
    act(() => {
      document.body.dispatchEvent(new Event("pointerdown", { bubbles: true }));
    });
    expect(screen.queryByRole("menu")).toBeNull();
  });
});
