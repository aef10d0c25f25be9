// Reports: an index of what there is to read (and, for periods, to close). Each report is one
// entry of REPORTS; each page decides its own access.
import { BarChart3, ChevronRight, LockKeyhole, Receipt, Scale } from "lucide-react";
import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import type { ReactNode } from "react";
import { PageHeader } from "@/components/shell/page-header";
import { can, type Action } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";

export const metadata: Metadata = { title: "Reports" };
export const dynamic = "force-dynamic";

interface ReportLink {
  href: string;
  title: string;
  description: string;
  icon: ReactNode;
  /** any one of these */
  needs: Action[];
}

const REPORTS: ReportLink[] = [
  {
    href: "/reports/usage",
    title: "Usage",
    description: "What each kitchen used and wasted month by month, and what it cost by the company's cost formula; count differences apart; downloads as CSV or a spreadsheet.",
    icon: <BarChart3 />,
    needs: ["reports.read"],
  },
  {
    href: "/reports/valuation",
    title: "Valuation",
    description: "What the stock on hand was worth at the end of a day, per kitchen, item and category.",
    icon: <Scale />,
    needs: ["reports.read"],
  },
  {
    href: "/reports/price-variance",
    title: "Price variance",
    description: "Deliveries against their orders and the suppliers' price lists, per supplier and month, with the value of the differences.",
    icon: <Receipt />,
    needs: ["reports.read"],
  },
  {
    href: "/reports/periods",
    title: "Periods",
    description: "Close a month once its figures are final: movements dated in a closed month are refused, and corrections go into the open month. See who closed or reopened each month, and why.",
    icon: <LockKeyhole />,
    needs: ["period.close", "reports.read"],
  },
];

export default async function ReportsPage() {
  const user = await requireUser();
  if (!can(user, "reports.read")) notFound();
  const reports = REPORTS.filter((r) => r.needs.some((a) => can(user, a)));
  return (
    <>
      <PageHeader title="Reports" description="The figures for the books, and the months they are final for." />
      <ul className="grid max-w-4xl gap-4 md:grid-cols-2">
        {reports.map((r) => (
          <li key={r.href}>
            <Link href={r.href} className="panel group flex min-h-touch items-start gap-4 px-5 py-4 hover:border-brine-line hover:bg-salt-deep/40">
              <span aria-hidden className="mt-1 text-paprika [&>svg]:h-6 [&>svg]:w-6">{r.icon}</span>
              <span className="flex-1">
                <span className="flex items-center gap-1 font-display text-xl font-semibold text-pepper">
                  {r.title}
                  <ChevronRight aria-hidden className="h-5 w-5 text-brine transition-transform group-hover:translate-x-0.5" />
                </span>
                <span className="mt-1 block text-brine">{r.description}</span>
              </span>
            </Link>
          </li>
        ))}
      </ul>
    </>
  );
}
