import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { canSomewhere } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { getCurrentKitchen } from "@/lib/data/current-kitchen";

export const metadata: Metadata = { title: "Stock" };
export const dynamic = "force-dynamic";

export default async function Page() {
  const user = await requireUser();
  if (!canSomewhere(user, "stock.read")) notFound();
  const kitchen = await getCurrentKitchen(user);
  return (
    <>
      <PageHeader title="Stock" kitchen={kitchen} description="On-hand casings, cures and spices in this kitchen, by lot and date." />
      <EmptyState title="Nothing in stock yet">
        <p>The stock grid (casings by calibre and hank, cure by lot and expiry, spices) opens here once items are set up and the first delivery is received.</p>
      </EmptyState>
    </>
  );
}
