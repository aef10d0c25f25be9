import { PlanningTabs, type PlanningTab } from "@/components/planning/planning-tabs";
import { canSomewhere, type Action } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";

const TABS: (PlanningTab & { needs: Action })[] = [
  { href: "/planning", label: "Week", needs: "planning.read" },
  { href: "/planning/recipes", label: "Recipes", needs: "planning.read" },
  { href: "/planning/trace", label: "Traceability", needs: "planning.read" },
  { href: "/planning/cure", label: "Cure calculator", needs: "planning.read" },
  { href: "/planning/casing", label: "Casing calculator", needs: "planning.read" },
];

// Display only: which tabs to show. Every planning page decides its own access.
export default async function PlanningLayout({ children }: { children: React.ReactNode }) {
  const user = await requireUser();
  const tabs = TABS.filter((t) => canSomewhere(user, t.needs)).map(({ href, label }) => ({ href, label }));
  return (
    <>
      {tabs.length > 1 ? <PlanningTabs tabs={tabs} /> : null}
      {children}
    </>
  );
}
