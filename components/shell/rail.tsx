"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";
import { BarChart3, Boxes, CalendarRange, Gauge, Settings, Truck, type LucideIcon } from "lucide-react";
import { LogoMark } from "@/components/brand/logo-mark";
import type { SectionKey } from "./sections";

const ICONS: Record<SectionKey, LucideIcon> = {
  overview: Gauge,
  stock: Boxes,
  planning: CalendarRange,
  purchasing: Truck,
  reports: BarChart3,
  settings: Settings,
};

export function Rail({ sections }: { sections: { key: SectionKey; href: string; label: string }[] }) {
  const pathname = usePathname();
  return (
    <nav aria-label="Main" className="flex w-[92px] shrink-0 flex-col items-center gap-1 bg-smoke py-4 text-smoke-text print:hidden">
      <Link href="/" className="mb-4 flex min-h-touch min-w-touch items-center justify-center rounded-md text-smoke-text" aria-label="Hank & Lot home">
        <LogoMark className="h-9 w-9" />
      </Link>
      <ul className="flex w-full flex-col gap-1 px-2">
        {sections.map((s) => {
          const Icon = ICONS[s.key];
          const active = pathname === s.href || pathname.startsWith(`${s.href}/`);
          return (
            <li key={s.key}>
              <Link
                href={s.href}
                aria-current={active ? "page" : undefined}
                className={`flex min-h-[60px] flex-col items-center justify-center gap-1 rounded-md px-1 text-[13px] font-semibold leading-tight ${
                  active ? "bg-smoke-raised text-white shadow-[inset_3px_0_0_#E0764D]" : "text-smoke-muted hover:bg-smoke-raised hover:text-white"
                }`}
              >
                <Icon aria-hidden className="h-6 w-6" strokeWidth={1.8} />
                <span className="text-center">{s.label}</span>
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
