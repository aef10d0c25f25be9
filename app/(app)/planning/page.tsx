import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { canSomewhere } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { getCurrentKitchen } from "@/lib/data/current-kitchen";

export const metadata: Metadata = { title: "Planning" };
export const dynamic = "force-dynamic";

export default async function Page() {
  const user = await requireUser();
  if (!canSomewhere(user, "planning.manage")) notFound();
  const kitchen = await getCurrentKitchen(user);
  return (
    <>
      <PageHeader
        title="Planning"
        kitchen={kitchen}
        description="Next week's batches, what they need and what is reserved for them."
        actions={<Link href="/planning/cure" className="btn-quiet">Cure calculator</Link>}
      />
      <EmptyState title="No batches planned">
        <p>Recipes and batch plans open here: each plan turns into cure, salt, spice and casing quantities, checks ingoing nitrite and reserves lots first-expired-first-out.</p>
      </EmptyState>
    </>
  );
}
