import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { PageHeader } from "@/components/shell/page-header";
import { canSomewhere } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { lastExpiryScan, listAlerts } from "@/lib/data/alerts";
import { alertsDelayed } from "@/lib/data/job-health";
import { delayInWords } from "@/lib/alerts/scan-words";
import { AlertList } from "./_components/alert-list";

export const metadata: Metadata = { title: "Alerts" };
export const dynamic = "force-dynamic";

// Reads PostgreSQL only: the list works while Redis (and so the scans) is down; new alerts wait.
export default async function AlertsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requireUser();
  if (!canSomewhere(user, "alerts.read")) notFound();
  const showAll = (await searchParams).show === "all";
  const { alerts, unreadCount } = await listAlerts(user, { includeAcknowledged: showAll, includeCleared: showAll, limit: 200 });
  const [scan, delay] = await Promise.all([lastExpiryScan(user), alertsDelayed(user)]);
  return (
    <>
      <PageHeader
        title="Alerts"
        description="What the morning checks found in the kitchens you look after: lots getting close to their date, items below their reorder point, batches of the coming week short of stock. Mark an alert seen, or put it aside for a while."
        actions={
          <Link href={showAll ? "/alerts" : "/alerts?show=all"} className="btn-quiet">
            {showAll ? "Hide seen and cleared alerts" : "Show seen and cleared alerts too"}
          </Link>
        }
      />
      {delay.delayed && delay.reason === "queue-down" ? (
        <p role="status" className="mb-4 rounded-md border border-amber/25 bg-amber-soft px-3 py-2 text-sm text-pepper">
          {delayInWords(delay)}. Stock and this list are up to date; new alerts arrive once the queue is back, when the checks catch up.
        </p>
      ) : scan.late ? (
        <p role="status" className="mb-4 rounded-md border border-amber/25 bg-amber-soft px-3 py-2 text-sm text-pepper">
          {scan.lastRunAt
            ? `New alerts are delayed: the morning check last ran ${new Intl.DateTimeFormat("en-GB", { timeZone: user.timeZone, dateStyle: "medium", timeStyle: "short" }).format(new Date(scan.lastRunAt))}. Stock and this list are up to date; ask your admin to check the job worker.`
            : "The morning check has not run yet for your company, so new alerts may be delayed. Stock is up to date."}
        </p>
      ) : null}
      <AlertList
        alerts={alerts}
        unreadCount={unreadCount}
        timeZone={user.timeZone}
        links={{ reorder: canSomewhere(user, "purchasing.read"), shortage: canSomewhere(user, "planning.read") }}
      />
    </>
  );
}
