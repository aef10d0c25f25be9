import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { StockGrid } from "@/components/stock/stock-grid";
import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { can, canSomewhere } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { getCurrentKitchen } from "@/lib/data/current-kitchen";

export const metadata: Metadata = { title: "Stock" };
export const dynamic = "force-dynamic";

/** Today's date (yyyy-mm-dd) where the user is: days left to a lot's date count from it. */
function todayIn(timeZone: string): string {
  return new Intl.DateTimeFormat("en-CA", { timeZone, year: "numeric", month: "2-digit", day: "2-digit" }).format(new Date());
}

export default async function Page() {
  const user = await requireUser();
  if (!canSomewhere(user, "stock.read")) notFound();
  const kitchen = await getCurrentKitchen(user);
  return (
    <>
      <PageHeader
        title="Stock"
        kitchen={kitchen}
        description="On-hand casings, cures and spices in this kitchen, by lot and date."
        actions={
          <>
            <Link href="/stock/items" className="btn-quiet">Items</Link>
            <Link href="/stock/transfers" className="btn-quiet">Transfers</Link>
          </>
        }
      />
      {kitchen && can(user, "stock.read", { kitchenId: kitchen.id }) ? (
        <StockGrid
          kitchen={{ code: kitchen.code, name: kitchen.name }}
          userId={user.id}
          unitSystem={user.unitSystem}
          timeZone={user.timeZone}
          today={todayIn(user.timeZone)}
          canCount={can(user, "stock.post", { kitchenId: kitchen.id })}
          canSetLevels={can(user, "levels.manage", { kitchenId: kitchen.id })}
          canPost={can(user, "stock.post", { kitchenId: kitchen.id })}
        />
      ) : (
        <EmptyState title="No kitchen to show">
          <p>Stock is kept per kitchen, and you are not assigned to one yet. An admin assigns kitchens under Settings › People.</p>
        </EmptyState>
      )}
    </>
  );
}
