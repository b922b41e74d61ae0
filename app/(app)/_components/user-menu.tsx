"use client";

import { useEffect, useRef, useState } from "react";
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

export function UserMenu({ name, email, roleLabel }: UserMenuProps) {
  const [open, setOpen] = useState(false);
  const [signingOut, setSigningOut] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const router = useRouter();
  const rootRef = useRef<HTMLDivElement>(null);

  // Close on a click elsewhere or Escape, as people expect of a menu.
  useEffect(() => {
    if (!open) return;
    const onPointer = (event: PointerEvent) => {
      if (!rootRef.current?.contains(event.target as Node)) setOpen(false);
    };
    const onKey = (event: KeyboardEvent) => event.key === "Escape" && setOpen(false);
    document.addEventListener("pointerdown", onPointer);
    document.addEventListener("keydown", onKey);
    return () => {
      document.removeEventListener("pointerdown", onPointer);
      document.removeEventListener("keydown", onKey);
    };
  }, [open]);

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
        type="button"
        data-testid="user-menu-button"
        aria-haspopup="menu"
        aria-expanded={open}
        onClick={() => setOpen((value) => !value)}
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
        <svg viewBox="0 0 12 12" aria-hidden className="h-3 w-3 text-ink-400">
          <path d="M2.5 4.5 6 8l3.5-3.5" fill="none" stroke="currentColor" strokeWidth="1.5" />
        </svg>
      </button>
      {open ? (
        <div
          role="menu"
          data-testid="user-menu"
          className="absolute right-0 z-20 mt-2 w-64 rounded-plate bg-paper-raised p-1 shadow-lg ring-1 ring-ink-200"
        >
          <div className="border-b border-ink-100 px-3 py-2">
            <p className="text-sm font-medium text-ink-900">{name}</p>
            <p className="truncate text-xs text-ink-500">{email}</p>
            <p className="mt-1 text-xs text-plate-700">{roleLabel}</p>
          </div>
          <Link
            href="/profile"
            role="menuitem"
            data-testid="profile-link"
            onClick={() => setOpen(false)}
            className="mt-1 block w-full rounded-plate px-3 py-2 text-left text-sm text-ink-700 hover:bg-paper-sunk"
          >
            Profile
          </Link>
          <button
            type="button"
            role="menuitem"
            data-testid="sign-out"
            onClick={signOut}
            disabled={signingOut}
            className="mt-1 w-full rounded-plate px-3 py-2 text-left text-sm text-ink-700 hover:bg-paper-sunk disabled:text-ink-400"
          >
            {signingOut ? "Signing out…" : "Sign out"}
          </button>
          {error ? <p className="px-3 pb-2 text-xs text-fault-700">{error}</p> : null}
        </div>
      ) : null}
    </div>
  );
}
