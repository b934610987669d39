"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";

const AREAS = [
  { href: "/", label: "Fleet" },
  { href: "/coils", label: "Coils" },
  { href: "/sweeps", label: "Sweeps" },
  { href: "/sessions", label: "Sessions" },
  { href: "/failures", label: "Failures" },
  { href: "/clearances", label: "Clearances" },
  { href: "/loans", label: "Loans" },
];

function isCurrent(pathname: string, href: string): boolean {
  return href === "/" ? pathname === "/" : pathname === href || pathname.startsWith(href + "/");
}

/** The areas of the current site; Admin for its admins, District (every site at a glance) for organisation admins. */
export function MainNav({ showAdmin, showDistrict = false }: { showAdmin: boolean; showDistrict?: boolean }) {
  const pathname = usePathname();
  const areas = [...AREAS, ...(showAdmin ? [{ href: "/admin", label: "Admin" }] : []), ...(showDistrict ? [{ href: "/district", label: "District" }] : [])];
  return (
    <nav className="main-nav" aria-label="Main">
      <ul>
        {areas.map((area) => (
          <li key={area.href}>
            <Link href={area.href} aria-current={isCurrent(pathname, area.href) ? "page" : undefined}>
              {area.label}
            </Link>
          </li>
        ))}
      </ul>
    </nav>
  );
}
