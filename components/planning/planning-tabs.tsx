"use client";

// The planning sub-navigation: the week, recipes and the two calculators. Plain links, the current
// one marked for assistive technology too; a batch page belongs to the week.
import Link from "next/link";
import { usePathname } from "next/navigation";

export interface PlanningTab {
  href: string;
  label: string;
}

function isCurrent(href: string, pathname: string): boolean {
  if (href === "/planning") return pathname === href || pathname.startsWith("/planning/batches");
  return pathname === href || pathname.startsWith(`${href}/`);
}

export function PlanningTabs({ tabs }: { tabs: PlanningTab[] }) {
  const pathname = usePathname();
  return (
    <nav aria-label="Planning" className="-mx-6 -mt-6 mb-6 overflow-x-auto border-b border-salt-edge bg-white px-6 print:hidden">
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
