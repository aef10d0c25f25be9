// A purchase order's status: the word, an icon, and a tone (never the colour alone).
import { BadgeCheck, CircleSlash, FilePen, PackageCheck, PackageOpen, Send, XCircle } from "lucide-react";
import { Badge } from "@/components/ui/badge";
import { ORDER_STATUS_LABELS, type OrderStatus } from "@/lib/purchasing/order-status";
import { STATUS_TONES } from "./order-format";

const ICONS: Record<OrderStatus, React.ReactNode> = {
  draft: <FilePen />,
  approved: <BadgeCheck />,
  sent: <Send />,
  partly_received: <PackageOpen />,
  received: <PackageCheck />,
  closed_short: <CircleSlash />,
  cancelled: <XCircle />,
};

export function OrderStatusBadge({ status }: { status: OrderStatus }) {
  return <Badge tone={STATUS_TONES[status]} icon={ICONS[status]}>{ORDER_STATUS_LABELS[status]}</Badge>;
}
