import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { can, canSomewhere } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { getCurrentKitchen } from "@/lib/data/current-kitchen";
import { listKitchens } from "@/lib/data/kitchens";
import { TransfersView } from "./_components/transfers-view";

export const metadata: Metadata = { title: "Transfers" };
export const dynamic = "force-dynamic";

export default async function TransfersPage() {
  const user = await requireUser();
  if (!canSomewhere(user, "stock.read")) notFound();
  const kitchen = await getCurrentKitchen(user);
  const kitchens = kitchen ? await listKitchens(user) : [];
  return (
    <>
      <PageHeader
        title="Transfers"
        kitchen={kitchen}
        description="Stock asked between the company's kitchens: what others ask of this kitchen, and what it asked of them."
        actions={<Link href="/stock" className="btn-quiet">Stock</Link>}
      />
      {kitchen && can(user, "stock.read", { kitchenId: kitchen.id }) ? (
        <TransfersView
          kitchen={{ code: kitchen.code, name: kitchen.name }}
          kitchens={kitchens.map((k) => ({ id: k.id, code: k.code, name: k.name }))}
          timeZone={user.timeZone}
          unitSystem={user.unitSystem}
          canFulfil={can(user, "transfers.fulfil", { kitchenId: kitchen.id })}
          canRequest={can(user, "transfers.request", { kitchenId: kitchen.id })}
        />
      ) : (
        <EmptyState title="No kitchen to show">
          <p>Transfers are kept per kitchen, and you are not assigned to one yet. An admin assigns kitchens under Settings › People.</p>
        </EmptyState>
      )}
    </>
  );
}
