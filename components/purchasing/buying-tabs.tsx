"use client";

// The buying sub-navigation: suppliers (the buying home and each supplier's page) and orders.
import { SectionTabs, underTab, type SectionTab } from "@/components/ui/section-tabs";

const isCurrent = (href: string, pathname: string) =>
  href === "/purchasing" ? pathname === href || pathname.startsWith("/purchasing/suppliers") : underTab(href, pathname);

export function BuyingTabs({ tabs }: { tabs: SectionTab[] }) {
  return <SectionTabs label="Buying" tabs={tabs} isCurrent={isCurrent} className="print:hidden" />;
}
