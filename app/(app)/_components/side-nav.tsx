"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";
import { NavIcon } from "./nav-icon";
import type { NavItem } from "./nav-items";

// Client only for the active-page highlight; which items appear was decided on the server.
export function SideNav({ items }: { items: Pick<NavItem, "href" | "label" | "icon" | "group">[] }) {
  const pathname = usePathname();
  const groups: { key: NavItem["group"]; heading?: string }[] = [
    { key: "work" },
    { key: "admin", heading: "Administration" },
  ];
  return (
    <nav aria-label="Main" data-testid="main-nav" className="flex flex-col gap-6">
      {groups.map(({ key, heading }) => {
        const groupItems = items.filter((item) => item.group === key);
        if (groupItems.length === 0) return null;
        return (
          <div key={key}>
            {heading ? (
              <p className="mb-2 px-3 text-[0.7rem] font-semibold tracking-wider text-ink-400 uppercase">{heading}</p>
            ) : null}
            <ul className="flex flex-col gap-0.5">
              {groupItems.map((item) => {
                const active = pathname === item.href || pathname.startsWith(`${item.href}/`);
                return (
                  <li key={item.href}>
                    <Link
                      href={item.href}
                      data-testid={`nav-${item.href.replace(/^\//, "").replace(/\//g, "-")}`}
                      aria-current={active ? "page" : undefined}
                      className={`flex items-center gap-3 rounded-plate px-3 py-2 text-sm transition-colors ${
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
