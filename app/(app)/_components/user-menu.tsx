"use client";

import { useEffect, useId, useRef, useState } from "react";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { authClient } from "@/lib/auth/client";

type UserMenuProps = { name: string; email: string; roleLabel: string };

function initials(name: string) {
  return name
    .split(/[\s-]+/)
    .filter(Boolean)
    .slice(0, 2)
    .map((part) => part[0]!.toUpperCase())
    .join("");
}

/** The menu's items, in order: anything inside it with role="menuitem" (a link or a button). */
function menuItems(menu: HTMLElement | null): HTMLElement[] {
  return menu ? [...menu.querySelectorAll<HTMLElement>('[role="menuitem"]:not([disabled])')] : [];
}

// The WAI-ARIA menu button pattern: Enter, Space or ArrowDown on the button open the menu on its first
// item, ArrowUp on its last; inside, ArrowUp/ArrowDown move (wrapping), Home/End jump, Escape closes and
// returns focus to the button, Tab closes and lets focus move on. Items are found by role, so a new
// entry is one more element with role="menuitem" and tabIndex={-1}.
export function UserMenu({ name, email, roleLabel }: UserMenuProps) {
  const [open, setOpen] = useState(false);
  const [signingOut, setSigningOut] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const router = useRouter();
  const rootRef = useRef<HTMLDivElement>(null);
  const buttonRef = useRef<HTMLButtonElement>(null);
  const menuRef = useRef<HTMLDivElement>(null);
  /** Which item takes focus when the menu opens. */
  const focusOnOpen = useRef<"first" | "last">("first");
  const menuId = useId();

  useEffect(() => {
    if (!open) return;
    const items = menuItems(menuRef.current);
    (focusOnOpen.current === "last" ? items.at(-1) : items[0])?.focus();
    // A click elsewhere closes the menu, as people expect of one.
    const onPointer = (event: PointerEvent) => {
      if (!rootRef.current?.contains(event.target as Node)) setOpen(false);
    };
    document.addEventListener("pointerdown", onPointer);
    return () => document.removeEventListener("pointerdown", onPointer);
  }, [open]);

  function openMenu(at: "first" | "last") {
    focusOnOpen.current = at;
    setOpen(true);
  }

  function closeMenu({ returnFocus }: { returnFocus: boolean }) {
    setOpen(false);
    if (returnFocus) buttonRef.current?.focus();
  }

  function onButtonKeyDown(event: React.KeyboardEvent<HTMLButtonElement>) {
    if (event.key === "ArrowDown" || event.key === "ArrowUp") {
      event.preventDefault();
      openMenu(event.key === "ArrowDown" ? "first" : "last");
    }
  }

  function onMenuKeyDown(event: React.KeyboardEvent<HTMLDivElement>) {
    const items = menuItems(menuRef.current);
    const index = items.indexOf(document.activeElement as HTMLElement);
    const move = (to: number) => {
      event.preventDefault();
      items[(to + items.length) % items.length]?.focus();
    };
    switch (event.key) {
      case "ArrowDown":
        return move(index + 1);
      case "ArrowUp":
        return move(index < 0 ? items.length - 1 : index - 1);
      case "Home":
        return move(0);
      case "End":
        return move(items.length - 1);
      case "Escape":
        event.preventDefault();
        return closeMenu({ returnFocus: true });
      case "Tab":
        return closeMenu({ returnFocus: false });
    }
  }

  async function signOut() {
    setSigningOut(true);
    setError(null);
    const { error: failure } = await authClient.signOut();
    if (failure) {
      setSigningOut(false);
      setError("Could not sign out. Try again.");
      return;
    }
    router.replace("/sign-in");
    router.refresh();
  }

  return (
    <div ref={rootRef} className="relative">
      <button
        ref={buttonRef}
        type="button"
        data-testid="user-menu-button"
        aria-haspopup="menu"
        aria-expanded={open}
        aria-controls={open ? menuId : undefined}
        onClick={() => (open ? closeMenu({ returnFocus: false }) : openMenu("first"))}
        onKeyDown={onButtonKeyDown}
        className="flex items-center gap-3 rounded-plate py-1 pr-2 pl-1 text-left hover:bg-paper-sunk"
      >
        <span aria-hidden className="grid h-8 w-8 place-items-center rounded-full bg-plate-700 text-xs font-semibold text-white">
          {initials(name)}
        </span>
        <span className="hidden leading-tight sm:block">
          <span className="block text-sm font-medium text-ink-900" data-testid="user-name">
            {name}
          </span>
          <span className="block text-xs text-ink-500" data-testid="user-role">
            {roleLabel}
          </span>
        </span>
        <svg viewBox="0 0 12 12" aria-hidden className="h-3 w-3 text-ink-500">
          <path d="M2.5 4.5 6 8l3.5-3.5" fill="none" stroke="currentColor" strokeWidth="1.5" />
        </svg>
      </button>
      {open ? (
        <div className="absolute right-0 z-20 mt-2 w-64 max-w-[calc(100vw-2rem)] rounded-plate bg-paper-raised p-1 shadow-lg ring-1 ring-ink-200">
          <div className="border-b border-ink-100 px-3 py-2">
            <p className="text-sm font-medium text-ink-900">{name}</p>
            <p className="truncate text-xs text-ink-500">{email}</p>
            <p className="mt-1 text-xs text-plate-700">{roleLabel}</p>
          </div>
          <div
            ref={menuRef}
            id={menuId}
            role="menu"
            aria-label="Account"
            data-testid="user-menu"
            onKeyDown={onMenuKeyDown}
            className="pt-1"
          >
            <Link
              href="/profile"
              role="menuitem"
              tabIndex={-1}
              data-testid="profile-link"
              onClick={() => setOpen(false)}
              className="block w-full rounded-plate px-3 py-2 text-left text-sm text-ink-700 hover:bg-paper-sunk focus:bg-paper-sunk"
            >
              Profile
            </Link>
            <button
              type="button"
              role="menuitem"
              tabIndex={-1}
              data-testid="sign-out"
              onClick={signOut}
              disabled={signingOut}
              className="w-full rounded-plate px-3 py-2 text-left text-sm text-ink-700 hover:bg-paper-sunk focus:bg-paper-sunk disabled:text-ink-400"
            >
              {signingOut ? "Signing out…" : "Sign out"}
            </button>
          </div>
          {error ? (
            <p role="alert" className="px-3 pb-2 text-xs text-fault-700">
              {error}
            </p>
          ) : null}
        </div>
      ) : null}
    </div>
  );
}
