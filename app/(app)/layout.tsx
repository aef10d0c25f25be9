import { Bell, Clock, LogOut } from "lucide-react";
import { Rail } from "@/components/shell/rail";
import { KitchenSwitcher } from "@/components/shell/kitchen-switcher";
import { sectionsFor } from "@/components/shell/sections";
import { Wordmark } from "@/components/brand/logo-mark";
import { QueryProvider } from "@/components/providers/query-provider";
import { can, canSomewhere } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { unreadAlertCount } from "@/lib/data/alerts";
import { alertsDelayed } from "@/lib/data/job-health";
import { delayInWords } from "@/lib/alerts/scan-words";
import { getCurrentKitchen } from "@/lib/data/current-kitchen";
import { ROLE_LABELS } from "@/lib/auth/roles";
import Link from "next/link";
import { signOutAction } from "./actions";

export const dynamic = "force-dynamic";

// Display only: pages and endpoints make their own access decisions.
export default async function AppLayout({ children }: { children: React.ReactNode }) {
  const user = await requireUser();
  const kitchen = await getCurrentKitchen(user);
  const sections = sectionsFor(user).map(({ key, href, label }) => ({ key, href, label }));
  const alertsShown = canSomewhere(user, "alerts.read");
  // the delay check waits at most ~500 ms for Redis and remembers its answer a few seconds
  const [unread, delay] = alertsShown ? await Promise.all([unreadAlertCount(user), alertsDelayed(user)]) : [0, null];
  return (
    <div className="flex min-h-screen">
      <Rail sections={sections} />
      <div className="flex min-w-0 flex-1 flex-col">
        <header className="flex min-h-[64px] flex-wrap items-center justify-between gap-3 border-b border-salt-edge bg-white px-6 py-2 print:hidden">
          <div className="flex items-center gap-4">
            <Wordmark className="text-lg" />
            <span className="text-sm text-brine">{user.companyName}</span>
          </div>
          <div className="flex items-center gap-4">
            <KitchenSwitcher kitchens={user.kitchens} currentId={kitchen?.id ?? null} />
            {delay?.delayed ? (
              <Link
                href={can(user, "jobs.manage") ? "/settings/jobs" : "/alerts"}
                title={delayInWords(delay)}
                className="flex min-h-touch min-w-touch items-center justify-center gap-1.5 whitespace-nowrap rounded-md border border-amber/25 bg-amber-soft px-2.5 text-sm font-semibold text-amber hover:underline"
              >
                <Clock aria-hidden className="h-5 w-5" />
                {/* the words from 1280 px; below, the clock (and the title) keep the header on one line */}
                <span aria-hidden className="hidden xl:inline">Alerts delayed</span>
                <span className="sr-only">{delayInWords(delay)}</span>
              </Link>
            ) : null}
            {alertsShown ? (
              <Link
                href="/alerts"
                className="relative flex min-h-touch min-w-touch items-center justify-center rounded-md hover:bg-salt"
                aria-label={unread ? `Alerts, ${unread} not yet seen` : "Alerts"}
              >
                <Bell aria-hidden className="h-5 w-5" />
                {unread ? (
                  <span aria-hidden className="absolute right-1 top-1 min-w-5 rounded-full bg-ember px-1 text-center text-xs font-semibold leading-5 text-white">
                    {unread > 99 ? "99+" : unread}
                  </span>
                ) : null}
              </Link>
            ) : null}
            <Link href="/account" className="flex min-h-touch flex-col justify-center text-right text-sm leading-tight hover:underline">
              <span className="font-semibold">{user.name}</span>
              <span className="text-brine">{ROLE_LABELS[user.role]}</span>
            </Link>
            <form action={signOutAction}>
              <button type="submit" className="btn-quiet px-3" aria-label="Sign out">
                <LogOut aria-hidden className="h-5 w-5" />
                <span className="hidden xl:inline">Sign out</span>
              </button>
            </form>
          </div>
        </header>
        <main id="main" className="flex-1 px-6 py-6 print:p-0"><QueryProvider>{children}</QueryProvider></main>
      </div>
    </div>
  );
}
