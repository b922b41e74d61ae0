"use client";

import { useEffect, useState } from "react";
import { usePathname } from "next/navigation";
import { can } from "@/lib/domain/permissions";
import { ROLES, ROLE_LABELS, isRole, type Role } from "@/lib/domain/roles";
import { NAV_ITEMS } from "@/app/(app)/_components/nav-items";

type Person = { name: string; role: Role };

/** "the Admin role", "the Admin and QA auditor roles", "the Standards lead, Engineer and QA auditor roles". */
function rolesPhrase(labels: string[]): string {
  if (labels.length === 1) return `the ${labels[0]} role`;
  return `the ${labels.slice(0, -1).join(", ")} and ${labels[labels.length - 1]} roles`;
}

/** The roles whose navigation offers the section this address belongs to. */
function rolesFor(pathname: string): string[] {
  const item = NAV_ITEMS.find(({ href }) => pathname === href || pathname.startsWith(`${href}/`));
  if (!item?.permission) return [];
  const action = item.permission;
  return ROLES.filter((role) => can(role, action)).map((role) => ROLE_LABELS[role]);
}

// Next renders the 403 page ahead of time, as the ready fallback of the root layout, and a client
// navigation reuses that copy: drawn for the role the person had when the page was first loaded. So
// the sentence that names the role is filled in here, from the address now shown and from the server's
// answer to "who am I now" (GET /api/me), asked when the 403 page appears.
export function ForbiddenDetail({ drawnFor }: { drawnFor: Person | null }) {
  const pathname = usePathname();
  const [person, setPerson] = useState<Person | null>(drawnFor);
  useEffect(() => {
    let cancelled = false;
    fetch("/api/me", { cache: "no-store", credentials: "same-origin" })
      .then((response) => (response.ok ? (response.json() as Promise<{ name?: unknown; role?: unknown }>) : null))
      .then((me) => {
        if (!cancelled && me && typeof me.name === "string" && isRole(me.role)) setPerson({ name: me.name, role: me.role });
      })
      .catch(() => undefined); // the server-drawn sentence stays
    return () => {
      cancelled = true;
    };
  }, [pathname]);
  const forRoles = rolesFor(pathname);

  return (
    <p>
      {person ? (
        <>
          You are signed in as <strong data-testid="forbidden-name">{person.name}</strong>,{" "}
          <strong data-testid="forbidden-role">{ROLE_LABELS[person.role]}</strong>.{" "}
        </>
      ) : null}
      {forRoles.length > 0 ? (
        <span data-testid="forbidden-for">This page is for {rolesPhrase(forRoles)}.</span>
      ) : (
        <>Your role does not include this page.</>
      )}{" "}
      Nothing was changed.
    </p>
  );
}
