import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { PageHeader } from "@/components/shell/page-header";
import { canSomewhere } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { getCurrentKitchen } from "@/lib/data/current-kitchen";
import { itemFacts } from "../_server/items";
import { CasingCalculator } from "./_components/casing-calculator";

export const metadata: Metadata = { title: "Casing calculator" };
export const dynamic = "force-dynamic";

export default async function CasingCalculatorPage() {
  const user = await requireUser();
  if (!canSomewhere(user, "planning.read")) notFound();
  const [kitchen, facts] = await Promise.all([getCurrentKitchen(user), itemFacts(user)]);
  const casings = facts.items
    .filter((i) => i.category === "casing" && !i.archived && i.casing)
    .map((i) => ({ id: i.id, sku: i.sku, name: i.name, capacityKg: i.casing!.capacityKgPerPutUp, putUp: i.casing!.putUp }));
  return (
    <>
      <PageHeader
        title="Casing calculator"
        kitchen={kitchen}
        description="How much casing a filling takes: metres, put-ups to open and links, from a casing item's capacity or, for a manufactured casing, its calibre."
      />
      <CasingCalculator casings={casings} unitSystem={user.unitSystem} />
    </>
  );
}
