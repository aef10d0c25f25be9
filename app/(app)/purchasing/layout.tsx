import { BuyingTabs } from "@/components/purchasing/buying-tabs";
import { canSomewhere } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";

const TABS = [
  { href: "/purchasing", label: "Suppliers" },
  { href: "/purchasing/orders", label: "Orders" },
  { href: "/purchasing/reorder", label: "Reorder" },
  { href: "/purchasing/deliveries", label: "Deliveries" },
];

// Display only: which tabs to show. Every buying page decides its own access.
export default async function BuyingLayout({ children }: { children: React.ReactNode }) {
  const user = await requireUser();
  return (
    <>
      {canSomewhere(user, "purchasing.read") ? <BuyingTabs tabs={TABS} /> : null}
      {children}
    </>
  );
}
