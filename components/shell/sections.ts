// The rail follows the people's jobs. Which sections a user sees is derived from the permissions
// module (display only: every page and endpoint still asks lib/auth/permissions itself).
import { canSomewhere, type Action, type Actor } from "@/lib/auth/permissions";

export type SectionKey = "overview" | "stock" | "planning" | "purchasing" | "reports" | "settings";

export interface Section {
  key: SectionKey;
  href: string;
  label: string;
  /** The job that makes a role see this section. */
  needs: Action;
}

export const SECTIONS: readonly Section[] = [
  { key: "overview", href: "/overview", label: "Overview", needs: "dashboard.read" },
  { key: "stock", href: "/stock", label: "Stock", needs: "stock.read" },
  { key: "planning", href: "/planning", label: "Planning", needs: "planning.manage" },
  { key: "purchasing", href: "/purchasing", label: "Buying", needs: "purchasing.read" },
  { key: "reports", href: "/reports", label: "Reports", needs: "reports.read" },
  { key: "settings", href: "/settings", label: "Settings", needs: "users.manage" },
];

export function sectionsFor(actor: Actor): Section[] {
  return SECTIONS.filter((s) => canSomewhere(actor, s.needs));
}
