"use client";

// The planning sub-navigation: the week, recipes, traceability and the two calculators; a batch
// page belongs to the week. Hidden when printing.
import { SectionTabs, underTab, type SectionTab } from "@/components/ui/section-tabs";

export type PlanningTab = SectionTab;

const isCurrent = (href: string, pathname: string) =>
  href === "/planning" ? pathname === href || pathname.startsWith("/planning/batches") : underTab(href, pathname);

export function PlanningTabs({ tabs }: { tabs: PlanningTab[] }) {
  return <SectionTabs label="Planning" tabs={tabs} isCurrent={isCurrent} className="print:hidden" />;
}
