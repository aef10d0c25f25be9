"use client";

// A section's sub-navigation (settings, planning): plain links in a row, the current one marked for
// assistive technology too (aria-current). `currentFor` says which tab a path belongs to.
import Link from "next/link";
import { usePathname } from "next/navigation";

export interface SectionTab {
  href: string;
  label: string;
}

/** Default: a tab is current on its own path and the paths below it. */
export const underTab = (href: string, pathname: string) => pathname === href || pathname.startsWith(`${href}/`);

export function SectionTabs({ label, tabs, isCurrent = underTab, className = "" }: {
  label: string;
  tabs: SectionTab[];
  isCurrent?: (href: string, pathname: string) => boolean;
  className?: string;
}) {
  const pathname = usePathname();
  return (
    <nav aria-label={label} className={`-mx-6 -mt-6 mb-6 overflow-x-auto border-b border-salt-edge bg-white px-6 ${className}`}>
      <ul className="flex gap-1">
        {tabs.map((t) => {
          const active = isCurrent(t.href, pathname);
          return (
            <li key={t.href}>
              <Link
                href={t.href}
                aria-current={active ? "page" : undefined}
                className={`-mb-px flex min-h-[48px] items-center whitespace-nowrap border-b-[3px] px-4 font-semibold ${
                  active ? "border-paprika text-pepper" : "border-transparent text-brine hover:border-brine-line hover:text-pepper"
                }`}
              >
                {t.label}
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
