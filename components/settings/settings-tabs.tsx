"use client";

import { SectionTabs, underTab, type SectionTab } from "@/components/ui/section-tabs";

export type SettingsTab = SectionTab;

// the company tab is /settings itself: current only there, not on every settings page
const isCurrent = (href: string, pathname: string) => (href === "/settings" ? pathname === href : underTab(href, pathname));

/** The settings sub-navigation. */
export function SettingsTabs({ tabs }: { tabs: SettingsTab[] }) {
  return <SectionTabs label="Settings" tabs={tabs} isCurrent={isCurrent} />;
}
