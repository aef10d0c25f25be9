import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { PageHeader } from "@/components/shell/page-header";
import { timeZoneOptions } from "@/components/ui/time-zones";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { getCompany, getCureSettings } from "@/lib/data/companies";
import { CompanyForm } from "./_components/company-form";
import { CureSettingsForm } from "./_components/cure-settings-form";

export const metadata: Metadata = { title: "Company settings" };
export const dynamic = "force-dynamic";

export default async function CompanySettingsPage() {
  const user = await requireUser();
  if (!can(user, "company.manage")) notFound();
  const [company, cure] = await Promise.all([getCompany(user), getCureSettings(user)]);
  return (
    <>
      <PageHeader title="Company" description="The name people see, the clock the day runs on, the currency prices are kept in, the day the planning week begins, and the largest order a buyer approves alone." />
      <CompanyForm
        company={{ name: company.name, timeZone: company.timeZone, currency: company.currency, weekStart: company.weekStart, approvalThreshold: company.approvalThreshold, receiving: company.receiving, scanSeparator: company.scanSeparator, expiryWindows: company.expiryWindows, costFormula: company.costFormula }}
        zones={timeZoneOptions(company.timeZone)}
      />
      <CureSettingsForm settings={cure} />
    </>
  );
}
