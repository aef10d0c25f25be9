// The buying home: who we buy from (suppliers, company-wide). Sections for orders, deliveries and
// reorder suggestions sit beside the suppliers as they land.
import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { PageHeader } from "@/components/shell/page-header";
import { can, canSomewhere } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { listSuppliers } from "@/lib/data/suppliers";
import { SuppliersSection } from "./_components/suppliers-section";

export const metadata: Metadata = { title: "Buying" };
export const dynamic = "force-dynamic";

export default async function BuyingPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requireUser();
  if (!canSomewhere(user, "purchasing.read")) notFound();
  const showingInactive = (await searchParams).inactive === "1";
  const suppliers = await listSuppliers(user, { includeInactive: showingInactive });
  return (
    <>
      <PageHeader title="Buying" description="The suppliers you buy casings, cures and spices from, what each sells you and in which pack." />
      <SuppliersSection suppliers={suppliers} currency={user.currency} canManage={can(user, "purchasing.manage")} showingInactive={showingInactive} />
    </>
  );
}
