"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";

export interface SettingsTab {
  href: string;
  label: string;
}

/** The settings sub-navigation: plain links, the current one marked for assistive technology too. */
export function SettingsTabs({ tabs }: { tabs: SettingsTab[] }) {
  const pathname = usePathname();
  const current = (href: string) => (href === "/settings" ? pathname === href : pathname === href || pathname.startsWith(`${href}/`));
  return (
    <nav aria-label="Settings" className="-mx-6 -mt-6 mb-6 overflow-x-auto border-b border-salt-edge bg-white px-6">
      <ul className="flex gap-1">
        {tabs.map((t) => {
          const active = current(t.href);
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
