"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";
import type { NavItem } from "./nav";

export function SideNav({ items }: { items: NavItem[] }) {
  const path = usePathname();
  return (
    <nav aria-label="Main">
      <ul className="flex gap-1 md:flex-col">
        {items.map((i) => {
          const active = path === i.href || (i.href !== "/" && path.startsWith(i.href + "/") && !items.some((o) => o.href !== i.href && path.startsWith(o.href)));
          return (
            <li key={i.href}>
              <Link
                href={i.href}
                aria-current={active ? "page" : undefined}
                className={`block border-l-2 px-3 py-1.5 text-sm ${active ? "border-accent bg-accent-wash font-medium text-accent-strong" : "border-transparent text-ink-soft hover:border-rule-strong hover:text-ink"}`}
              >
                {i.label}
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
