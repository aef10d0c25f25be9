"use client";

// The steps this user may take on the order now (the API says which: order.allowed), each through
// its endpoint with an Idempotency-Key per click: approve, send to the supplier, change the draft,
// close short or cancel (both with a reason). The page reloads its server data after each.
import { BadgeCheck, Download, Loader2, Pencil, Send } from "lucide-react";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { ConfirmDialog } from "@/components/planning/confirm-dialog";
import { OrderForm, type KitchenOption } from "@/components/purchasing/order-form";
import { describedBy, FieldError, FormMessage, StatusRegion } from "@/components/ui/field";
import { SideSheet } from "@/components/ui/side-sheet";
import type { OrderCatalogueSupplier, PurchaseOrder } from "@/lib/data/purchase-orders";
import { ApiError, apiFetch, jsonInit } from "@/lib/queries/api";
import { newIdempotencyKey } from "@/lib/queries/stock";
import type { UnitSystem } from "@/lib/units";
import { amountText } from "@/components/purchasing/order-format";

type Step = "approve" | "send" | "close" | "cancel";

const DONE: Record<Step, (o: PurchaseOrder) => string> = {
  approve: (o) => `${o.number} is approved: send it to ${o.supplier.name} when ready.`,
  send: (o) => `${o.number} is on its way to ${o.supplier.name} (${o.supplier.orderEmail}), with the PDF and CSV attached.`,
  close: (o) => `${o.number} is closed short: nothing more is expected against it.`,
  cancel: (o) => `${o.number} is cancelled.${o.history.some((h) => h.step === "sent") ? ` ${o.supplier.name} is told by e-mail.` : ""}`,
};

export function OrderActions({ order, catalogue, kitchens, unitSystem, canManage }: {
  order: PurchaseOrder;
  catalogue: { currency: string; today: string; suppliers: OrderCatalogueSupplier[] } | null;
  kitchens: KitchenOption[];
  unitSystem: UnitSystem;
  canManage: boolean;
}) {
  const router = useRouter();
  const [busy, setBusy] = useState<Step | null>(null);
  const [notice, setNotice] = useState<string>();
  const [problem, setProblem] = useState<string>();
  const [editing, setEditing] = useState(false);
  const [asking, setAsking] = useState<"close" | "cancel" | null>(null);
  const [reason, setReason] = useState("");
  const [reasonErrors, setReasonErrors] = useState<string[]>();
  const { allowed } = order;
  const base = `/api/purchase-orders/${order.id}`;

  const run = async (step: Step, body?: unknown) => {
    setBusy(step);
    setProblem(undefined);
    setNotice(undefined);
    try {
      const saved = await apiFetch<PurchaseOrder>(`${base}/${step}`, jsonInit("POST", body ?? {}, { "idempotency-key": newIdempotencyKey() }));
      setAsking(null);
      setReason("");
      setReasonErrors(undefined);
      setNotice(DONE[step](saved));
      router.refresh();
    } catch (e) {
      const err = e instanceof ApiError ? e : null;
      if (asking && err?.fields.reason) setReasonErrors(err.fields.reason);
      else {
        setAsking(null);
        const fieldText = err ? Object.values(err.fields).flat()[0] : undefined;
        setProblem(fieldText ?? err?.message ?? "That did not work. Try again.");
      }
    } finally {
      setBusy(null);
    }
  };

  const spinner = (step: Step) => (busy === step ? <Loader2 aria-hidden className="h-5 w-5 animate-spin" /> : null);
  const waitingForManager = order.status === "draft" && !allowed.approve && order.needsManager && canManage;
  const noAddress = order.status === "approved" && !order.supplier.orderEmail;

  return (
    <section aria-label="What to do with this order" className="space-y-3 print:hidden">
      <div className="flex flex-wrap items-center gap-2">
        {allowed.approve ? (
          <button type="button" className="btn-primary" disabled={busy !== null} onClick={() => run("approve")}>
            {spinner("approve") ?? <BadgeCheck aria-hidden className="h-5 w-5" />} Approve
          </button>
        ) : null}
        {allowed.send ? (
          <button type="button" className="btn-primary" disabled={busy !== null || noAddress} onClick={() => run("send")}>
            {spinner("send") ?? <Send aria-hidden className="h-5 w-5" />} Send to supplier
          </button>
        ) : null}
        {allowed.edit && catalogue ? (
          <button type="button" className="btn-quiet" disabled={busy !== null} onClick={() => setEditing(true)}>
            <Pencil aria-hidden className="h-5 w-5" /> Change draft
          </button>
        ) : null}
        {allowed.closeShort ? (
          <button type="button" className="btn-quiet" disabled={busy !== null} onClick={() => { setReasonErrors(undefined); setAsking("close"); }}>
            Close short
          </button>
        ) : null}
        {allowed.cancel ? (
          <button type="button" className="btn-quiet text-ember" disabled={busy !== null} onClick={() => { setReasonErrors(undefined); setAsking("cancel"); }}>
            Cancel order
          </button>
        ) : null}
        <span className="mx-1 hidden h-8 w-px bg-salt-edge sm:block" aria-hidden />
        <a href={`${base}/pdf`} className="btn-quiet" download>
          <Download aria-hidden className="h-5 w-5" /> PDF
        </a>
        <a href={`${base}/csv`} className="btn-quiet" download>
          <Download aria-hidden className="h-5 w-5" /> CSV
        </a>
      </div>
      {waitingForManager ? (
        <p className="text-sm text-amber">
          The total is above the approval threshold of {amountText(order.approvalThreshold, order.currency)}: a manager or an admin approves this order.
        </p>
      ) : null}
      {noAddress ? (
        <p className="text-sm text-amber">{order.supplier.name} has no order e-mail address: add one on the supplier&apos;s page, then send.</p>
      ) : null}
      {problem ? <FormMessage tone="error">{problem}</FormMessage> : null}
      <StatusRegion>{notice}</StatusRegion>

      <ConfirmDialog
        open={asking !== null}
        title={asking === "close" ? `Close ${order.number} short?` : `Cancel ${order.number}?`}
        confirmLabel={asking === "close" ? "Close short" : "Cancel order"}
        cancelLabel={asking === "close" ? "Keep it open" : "Keep the order"}
        busy={busy !== null}
        onClose={() => setAsking(null)}
        onConfirm={() => run(asking!, { reason })}
      >
        <p>
          {asking === "close"
            ? "Nothing more will be expected against this order: what has not come will not come."
            : order.status === "sent"
              ? `${order.supplier.name} is sent an e-mail saying the order is cancelled, with your reason.`
              : "The order will not go to the supplier."}
        </p>
        <div>
          <label htmlFor="order-reason" className="field-label">Reason</label>
          <textarea
            id="order-reason" className="field-input min-h-[4.5rem] py-2" maxLength={500} value={reason}
            onChange={(e) => setReason(e.target.value)} {...describedBy("order-reason", reasonErrors)}
          />
          <FieldError id="order-reason" errors={reasonErrors} />
        </div>
      </ConfirmDialog>

      {catalogue ? (
        <SideSheet open={editing} onClose={() => setEditing(false)} title={`Change ${order.number}`} description="A draft changes freely until it is approved.">
          <OrderForm
            catalogue={catalogue}
            kitchens={kitchens}
            defaultKitchenId={order.kitchen.id}
            unitSystem={unitSystem}
            order={order}
            onCancel={() => setEditing(false)}
            onSaved={(saved) => {
              setEditing(false);
              setNotice(`${saved.number} is saved: ${amountText(saved.total, saved.currency)}.`);
            }}
          />
        </SideSheet>
      ) : null}
    </section>
  );
}
