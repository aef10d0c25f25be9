import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { canSomewhere } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { getCurrentKitchen } from "@/lib/data/current-kitchen";

export const metadata: Metadata = { title: "Buying and deliveries" };
export const dynamic = "force-dynamic";

export default async function Page() {
  const user = await requireUser();
  if (!canSomewhere(user, "purchasing.read")) notFound();
  const kitchen = await getCurrentKitchen(user);
  return (
    <>
      <PageHeader title="Buying and deliveries" kitchen={kitchen} description="Suppliers, price lists, orders and the delivery notes that arrive against them." />
      <EmptyState title="No suppliers yet">
        <p>Suppliers' price lists and CSV delivery notes are reconciled against purchase orders here.</p>
      </EmptyState>
    </>
  );
}
