"use client";

import { useEffect, useId, useRef, useState, type KeyboardEvent, type ReactNode } from "react";

export interface MenuItem {
  label: string;
  /** A link item (a download, say) when set; otherwise a command run by onSelect. */
  href?: string;
  download?: boolean;
  onSelect?: () => void;
  tone?: "danger";
}

/**
 * A button that opens a short menu of commands (the WAI-ARIA menu button pattern): Enter, Space
 * or ArrowDown open it on the first item, ArrowUp on the last; arrows, Home and End move; Escape
 * closes it and returns to the button; Tab or a click elsewhere closes it.
 */
export function MenuButton({ label, children, items, className = "" }: { label: string; children: ReactNode; items: MenuItem[]; className?: string }) {
  const [open, setOpen] = useState(false);
  const menuId = useId();
  const buttonRef = useRef<HTMLButtonElement>(null);
  const menuRef = useRef<HTMLDivElement>(null);
  const firstFocus = useRef<"first" | "last">("first");

  useEffect(() => {
    if (!open) return;
    const entries = menuRef.current?.querySelectorAll<HTMLElement>('[role="menuitem"]');
    entries?.[firstFocus.current === "first" ? 0 : entries.length - 1]?.focus();
    const outside = (e: PointerEvent) => {
      const target = e.target as Node;
      if (!menuRef.current?.contains(target) && !buttonRef.current?.contains(target)) setOpen(false);
    };
    document.addEventListener("pointerdown", outside);
    return () => document.removeEventListener("pointerdown", outside);
  }, [open]);

  const openAt = (where: "first" | "last") => {
    firstFocus.current = where;
    setOpen(true);
  };
  const close = (refocus: boolean) => {
    setOpen(false);
    if (refocus) buttonRef.current?.focus();
  };

  const onButtonKey = (e: KeyboardEvent) => {
    if (e.key === "ArrowDown" || e.key === "ArrowUp") {
      e.preventDefault();
      openAt(e.key === "ArrowDown" ? "first" : "last");
    }
  };
  const onMenuKey = (e: KeyboardEvent) => {
    const entries = [...(menuRef.current?.querySelectorAll<HTMLElement>('[role="menuitem"]') ?? [])];
    const at = entries.indexOf(document.activeElement as HTMLElement);
    const move = (i: number) => entries[(i + entries.length) % entries.length]?.focus();
    if (e.key === "ArrowDown") move(at + 1);
    else if (e.key === "ArrowUp") move(at - 1);
    else if (e.key === "Home") move(0);
    else if (e.key === "End") move(entries.length - 1);
    else if (e.key === "Escape") close(true);
    else if (e.key === "Tab") return setOpen(false);
    else return;
    e.preventDefault();
  };

  const itemClass = (tone?: "danger") =>
    `flex min-h-11 w-full items-center rounded px-3 text-left text-sm hover:bg-paper-deep focus:bg-paper-deep focus:outline-none ${tone === "danger" ? "text-danger" : "text-ink"}`;

  return (
    <div className="relative inline-block">
      <button
        ref={buttonRef}
        type="button"
        aria-haspopup="menu"
        aria-expanded={open}
        aria-controls={open ? menuId : undefined}
        aria-label={label}
        onClick={() => (open ? close(false) : openAt("first"))}
        onKeyDown={onButtonKey}
        className={`inline-flex h-11 min-w-11 items-center justify-center rounded px-2 text-ink hover:bg-paper-deep aria-expanded:bg-paper-deep ${className}`}
      >
        {children}
      </button>
      {open ? (
        <div
          ref={menuRef}
          id={menuId}
          role="menu"
          aria-label={label}
          onKeyDown={onMenuKey}
          className="absolute right-0 top-full z-30 mt-1 w-56 max-w-[calc(100vw-2rem)] rounded border border-rule bg-paper-card p-1 shadow-[0_4px_16px_rgba(27,26,23,0.15)]"
        >
          {items.map((item) =>
            item.href ? (
              <a key={item.label} role="menuitem" tabIndex={-1} href={item.href} download={item.download} onClick={() => close(true)} className={itemClass(item.tone)}>
                {item.label}
              </a>
            ) : (
              <button
                key={item.label}
                type="button"
                role="menuitem"
                tabIndex={-1}
                onClick={() => {
                  close(true);
                  item.onSelect?.();
                }}
                className={itemClass(item.tone)}
              >
                {item.label}
              </button>
            ),
          )}
        </div>
      ) : null}
    </div>
  );
}
