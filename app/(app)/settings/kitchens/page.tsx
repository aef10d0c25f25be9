import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { timeZoneOptions } from "@/components/ui/time-zones";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { getCompany } from "@/lib/data/companies";
import { listKitchens } from "@/lib/data/kitchens";
import { KitchensView } from "./_components/kitchens-view";

export const metadata: Metadata = { title: "Kitchens" };
export const dynamic = "force-dynamic";

export default async function KitchensPage() {
  const user = await requireUser();
  if (!can(user, "kitchens.manage")) notFound();
  const [kitchens, company] = await Promise.all([listKitchens(user, { includeArchived: true }), getCompany(user)]);
  return (
    <KitchensView
      kitchens={kitchens}
      zones={timeZoneOptions(company.timeZone, ...kitchens.map((k) => k.timeZone))}
      companyTimeZone={company.timeZone}
    />
  );
}
