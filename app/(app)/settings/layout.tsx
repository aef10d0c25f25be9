import { SettingsTabs, type SettingsTab } from "@/components/settings/settings-tabs";
import { can, type Action } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { mailFakeInUse } from "@/lib/data/captured-mail";

const TABS: (SettingsTab & { needs: Action; onlyWithMailFake?: boolean })[] = [
  { href: "/settings", label: "Company", needs: "company.manage" },
  { href: "/settings/people", label: "People", needs: "users.manage" },
  { href: "/settings/kitchens", label: "Kitchens", needs: "kitchens.manage" },
  { href: "/settings/jobs", label: "Jobs", needs: "jobs.manage" },
  { href: "/settings/mail", label: "Captured mail", needs: "mail.readCaptured", onlyWithMailFake: true },
  { href: "/settings/api", label: "API reference", needs: "api.readReference" },
];

// Display only: which tabs to show. Every settings page decides its own access.
export default async function SettingsLayout({ children }: { children: React.ReactNode }) {
  const user = await requireUser();
  const fake = mailFakeInUse();
  const tabs = TABS.filter((t) => can(user, t.needs) && (!t.onlyWithMailFake || fake)).map(({ href, label }) => ({ href, label }));
  return (
    <>
      {tabs.length > 1 ? <SettingsTabs tabs={tabs} /> : null}
      {children}
    </>
  );
}
