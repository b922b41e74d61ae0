"use client";

import { useEffect, useRef } from "react";
import { usePathname, useRouter } from "next/navigation";

// A layout is not rendered again on client navigation, so the navigation and the user menu drawn for a
// role would outlive a role change or a deactivation. After each navigation (and when the tab comes
// back into view) this asks the server who the person is now (GET /api/me); if that differs from what
// the shell was drawn for, or the session is gone, it refreshes the page from the server: the shell is
// drawn again for the current role, or the page sends a deactivated person to sign in, saying why.
// The server decides every access on its own; this only keeps what is shown current.
export function SessionWatcher({ userId, role, name }: { userId: string; role: string; name: string }) {
  const pathname = usePathname();
  const router = useRouter();
  const checkedPath = useRef(pathname);

  useEffect(() => {
    let cancelled = false;
    async function check() {
      let response: Response;
      try {
        response = await fetch("/api/me", { cache: "no-store", credentials: "same-origin" });
      } catch {
        return; // offline or the server is restarting: the next navigation asks again
      }
      if (cancelled) return;
      if (response.status === 401) {
        // Ended on purpose: straight to the sign-in page with the reason (checked there against a fixed
        // list), since this very answer cleared the cookie the next page would have read it from.
        const { reason } = (await response.json().catch(() => ({}))) as { reason?: unknown };
        if (cancelled) return;
        if (typeof reason === "string" && /^[a-z-]{1,40}$/.test(reason)) {
          const next = `${window.location.pathname}${window.location.search}`;
          router.replace(`/sign-in?reason=${reason}&next=${encodeURIComponent(next)}`);
        } else router.refresh();
        return;
      }
      if (!response.ok) return;
      const me = (await response.json()) as { id?: string; role?: string; name?: string };
      if (!cancelled && (me.id !== userId || me.role !== role || me.name !== name)) router.refresh();
    }
    // The first render was drawn by the server just now; ask only after a navigation.
    if (checkedPath.current !== pathname) {
      checkedPath.current = pathname;
      void check();
    }
    const onVisible = () => {
      if (document.visibilityState === "visible") void check();
    };
    document.addEventListener("visibilitychange", onVisible);
    return () => {
      cancelled = true;
      document.removeEventListener("visibilitychange", onVisible);
    };
  }, [pathname, router, userId, role, name]);

  return null;
}
