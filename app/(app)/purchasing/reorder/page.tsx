// Reorder: what the current kitchen should order now, by supplier, from lib/reorder's projection
// (on hand, reserved, planned batches and open orders within each supplier's lead time). The buyer
// checks the reasons, may pick another supplier or change the packs, and drafts the orders.
import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { PackageCheck } from "lucide-react";
import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { can, canSomewhere } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { getCurrentKitchen } from "@/lib/data/current-kitchen";
import { getReorderSuggestions } from "@/lib/data/reorder-suggestions";
import { ReorderBoard } from "./_components/reorder-board";

export const metadata: Metadata = { title: "Reorder" };
export const dynamic = "force-dynamic";

export default async function ReorderPage() {
  const user = await requireUser();
  if (!canSomewhere(user, "purchasing.read")) notFound();
  const kitchen = await getCurrentKitchen(user);
  const description = "Items projected to fall below their reorder point within each supplier's lead time, with what to order to bring them back to par.";
  if (!kitchen) {
    return (
      <>
        <PageHeader title="Reorder" description={description} />
        <EmptyState title="No kitchen to buy for" icon={<PackageCheck aria-hidden className="h-8 w-8" />}>
          <p>Reorder suggestions are per kitchen. Ask an admin to open a kitchen first.</p>
        </EmptyState>
      </>
    );
  }
  const data = await getReorderSuggestions(user, kitchen.id);
  const here = data.kitchens[0]!;
  return (
    <>
      <PageHeader title="Reorder" kitchen={kitchen} description={description} />
      <ReorderBoard
        kitchen={here}
        today={data.today}
        currency={data.currency}
        cureCaution={data.cureCaution !== null}
        unitSystem={user.unitSystem}
        canManage={can(user, "purchasing.manage", { kitchenId: kitchen.id })}
      />
    </>
  );
}
