import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { CureCaution } from "@/components/cure/cure-caution";
import { PageHeader } from "@/components/shell/page-header";
import { can, canSomewhere } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { getCureSettings } from "@/lib/data/companies";
import { getCurrentKitchen } from "@/lib/data/current-kitchen";
import { listItems } from "@/lib/data/items";
import { CureCalculator, type StockCure } from "./_components/cure-calculator";

export const metadata: Metadata = { title: "Cure calculator" };
export const dynamic = "force-dynamic";

export default async function CureCalculatorPage() {
  const user = await requireUser();
  if (!canSomewhere(user, "planning.read")) notFound();
  const [settings, kitchen] = await Promise.all([getCureSettings(user), getCurrentKitchen(user)]);
  // the company's cures, to fill a line's fractions from the label data already in the catalogue
  const cures: StockCure[] = can(user, "stock.read")
    ? (await listItems(user, { category: "cure" })).flatMap((i) => (i.cure ? [{ sku: i.sku, name: i.name, ...i.cure }] : []))
    : [];
  return (
    <>
      <PageHeader
        title="Cure calculator"
        kitchen={kitchen}
        description="Ingoing nitrite and nitrate by the FSIS method, checked against your company's regulatory table; or how much cure a target ppm needs."
        actions={canSomewhere(user, "planning.manage") ? <Link href="/planning" className="btn-quiet">Planning</Link> : undefined}
      />
      <CureCaution className="mb-5 max-w-4xl" />
      <CureCalculator defaultTable={settings.regulatoryTable} scaleResolutionG={settings.scaleResolutionG} stockCures={cures} />
    </>
  );
}
