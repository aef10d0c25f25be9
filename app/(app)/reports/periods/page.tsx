// Reports > Periods: the last twelve months with their status, "Close" for the next month to close
// (with a confirm step), "Reopen" with a reason for admins, and the audit trail. Everything comes
// from lib/data/periods.ts; the page's buttons call /api/periods.
import { ArrowLeft } from "lucide-react";
import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { PageHeader } from "@/components/shell/page-header";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { listPeriods } from "@/lib/data/periods";
import { PeriodsView } from "./_components/periods-view";

export const metadata: Metadata = { title: "Periods" };
export const dynamic = "force-dynamic";

export default async function PeriodsPage() {
  const user = await requireUser();
  if (!can(user, "period.close") && !can(user, "reports.read")) notFound();
  const list = await listPeriods(user);
  return (
    <>
      <PageHeader
        title="Periods"
        description="Close a month once its stock figures are final. Movements dated in a closed month are refused; a correction is dated in the open month instead."
        actions={
          <Link href="/reports" className="btn-quiet">
            <ArrowLeft aria-hidden className="h-5 w-5" /> Reports
          </Link>
        }
      />
      <PeriodsView initial={list} canClose={can(user, "period.close")} canReopen={can(user, "period.reopen")} timeZone={user.timeZone} />
    </>
  );
}
