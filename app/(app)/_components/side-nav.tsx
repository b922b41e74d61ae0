"use client";

import { useId, useState } from "react";
import Link from "next/link";
import { usePathname } from "next/navigation";
import { NavIcon } from "./nav-icon";
import type { NavItem } from "./nav-items";

// Client only for the active-page highlight and the phone-width menu; which items appear was decided on
// the server. From md up the entries are a column beside the page; below it they fold behind a "Menu"
// button (a disclosure: the button says whether the list is open), so nothing scrolls sideways unseen.
export function SideNav({ items }: { items: Pick<NavItem, "href" | "label" | "icon" | "group">[] }) {
  const pathname = usePathname();
  const [open, setOpen] = useState(false);
  const listId = useId();
  const groups: { key: NavItem["group"]; heading?: string }[] = [{ key: "work" }, { key: "admin", heading: "Administration" }];
  // The most specific entry that holds the page: /audit/integrity is Integrity's, not the audit trail's.
  const current = items
    .filter((item) => pathname === item.href || pathname.startsWith(`${item.href}/`))
    .sort((a, b) => b.href.length - a.href.length)[0];
  return (
    <nav aria-label="Main" data-testid="main-nav" className="min-w-0 md:flex md:flex-col">
      <button
        type="button"
        className="ml-auto flex max-w-full items-center gap-2 rounded-plate px-3 py-1.5 text-sm text-ink-900 ring-1 ring-ink-200 ring-inset hover:bg-paper-sunk md:hidden"
        aria-expanded={open}
        aria-controls={listId}
        data-testid="nav-menu-button"
        onClick={() => setOpen((value) => !value)}
      >
        <span className="truncate text-ink-500">{current?.label}</span>
        <span className="font-medium">Menu</span>
        <svg viewBox="0 0 20 20" aria-hidden className="h-[18px] w-[18px] shrink-0 text-ink-500">
          <path d={open ? "M5 5l10 10M15 5 5 15" : "M3 5.5h14M3 10h14M3 14.5h14"} stroke="currentColor" strokeWidth="1.5" />
        </svg>
      </button>
      <div
        id={listId}
        className={`${open ? "flex" : "hidden"} absolute inset-x-0 top-full z-30 flex-col gap-4 border-b border-ink-200 bg-paper-raised px-3 py-3 shadow-lg md:static md:flex md:gap-6 md:border-0 md:p-0 md:shadow-none`}
      >
        {groups.map(({ key, heading }) => {
          const groupItems = items.filter((item) => item.group === key);
          if (groupItems.length === 0) return null;
          const headingId = `${listId}-${key}`;
          return (
            <div key={key}>
              {heading ? (
                <p id={headingId} className="mb-2 px-3 text-[0.7rem] font-semibold tracking-wider text-ink-500 uppercase">
                  {heading}
                </p>
              ) : null}
              <ul className="flex flex-col gap-0.5" aria-labelledby={heading ? headingId : undefined}>
                {groupItems.map((item) => {
                  const active = item === current;
                  return (
                    <li key={item.href}>
                      <Link
                        href={item.href}
                        onClick={() => setOpen(false)}
                        data-testid={`nav-${item.href.replace(/^\//, "").replace(/\//g, "-")}`}
                        aria-current={active ? "page" : undefined}
                        className={`flex items-center gap-3 rounded-plate px-3 py-2 text-sm whitespace-nowrap transition-colors ${
                          active
                            ? "bg-plate-100 font-semibold text-plate-900"
                            : "text-ink-700 hover:bg-paper-sunk hover:text-ink-950"
                        }`}
                      >
                        <NavIcon name={item.icon} className={`h-[18px] w-[18px] ${active ? "text-plate-700" : "text-ink-400"}`} />
                        {item.label}
                      </Link>
                    </li>
                  );
                })}
              </ul>
            </div>
          );
        })}
      </div>
    </nav>
  );
}
