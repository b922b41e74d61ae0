"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";
import { NavIcon } from "./nav-icon";
import type { NavItem } from "./nav-items";

// Client only for the active-page highlight; which items appear was decided on the server.
export function SideNav({ items }: { items: Pick<NavItem, "href" | "label" | "icon" | "group">[] }) {
  const pathname = usePathname();
  const groups: { key: NavItem["group"]; heading?: string }[] = [{ key: "work" }, { key: "admin", heading: "Administration" }];
  // On narrow screens the entries sit in one scrolling row under the brand; from md up, a column.
  return (
    <nav
      aria-label="Main"
      data-testid="main-nav"
      className="-mx-1 flex gap-1 overflow-x-auto px-1 md:mx-0 md:flex-col md:gap-6 md:overflow-visible md:px-0"
    >
      {groups.map(({ key, heading }) => {
        const groupItems = items.filter((item) => item.group === key);
        if (groupItems.length === 0) return null;
        return (
          <div key={key} className="contents md:block">
            {heading ? (
              <p className="mb-2 hidden px-3 text-[0.7rem] font-semibold tracking-wider text-ink-400 uppercase md:block">
                {heading}
              </p>
            ) : null}
            <ul className="flex gap-1 md:flex-col md:gap-0.5">
              {groupItems.map((item) => {
                const active = pathname === item.href || pathname.startsWith(`${item.href}/`);
                return (
                  <li key={item.href}>
                    <Link
                      href={item.href}
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
    </nav>
  );
}
