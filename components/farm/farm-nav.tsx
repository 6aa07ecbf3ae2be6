"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";

export interface FarmNavLink {
  href: string;
  label: string;
}

/** The farm's sections; the one open now is marked for the eye and for screen readers. */
export function FarmNav({ links, homeHref }: { links: FarmNavLink[]; homeHref: string }) {
  const pathname = usePathname();
  const isCurrent = (href: string) => (href === homeHref ? pathname === href || pathname.startsWith(`${href}/fields`) : pathname.startsWith(href));
  return (
    <nav aria-label="Farm" className="flex w-full gap-1 overflow-x-auto">
      {links.map((l) => {
        const current = isCurrent(l.href);
        return (
          <Link
            key={l.href}
            href={l.href}
            aria-current={current ? "page" : undefined}
            className={`tap flex shrink-0 items-center whitespace-nowrap rounded-lg px-3 font-bold ${current ? "bg-river-700 text-white" : "text-river-700 hover:bg-river-50"}`}
          >
            {l.label}
          </Link>
        );
      })}
    </nav>
  );
}
