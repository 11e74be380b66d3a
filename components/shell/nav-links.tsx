"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";

export type NavLink = { href: string; label: string };

/** The signed-in navigation; the current section is marked for sight and for screen readers. */
export function NavLinks({ links }: { links: NavLink[] }) {
  const pathname = usePathname();
  const current = links
    .filter((l) => pathname === l.href || pathname.startsWith(`${l.href}/`))
    .sort((a, b) => b.href.length - a.href.length)[0]?.href;
  return (
    <ul className="flex flex-wrap items-center gap-1">
      {links.map((l) => (
        <li key={l.href}>
          <Link
            href={l.href}
            aria-current={l.href === current ? "page" : undefined}
            className={`rounded-md px-2.5 py-1.5 text-sm transition-colors ${
              l.href === current ? "bg-tide-700 text-paper-raised" : "text-tide-100 hover:bg-tide-700/60 hover:text-paper-raised"
            }`}
          >
            {l.label}
          </Link>
        </li>
      ))}
    </ul>
  );
}
