"use client";

// The alert list: each alert with what it is about, and buttons to mark it seen or put it aside.
// Acknowledging and snoozing are the user's own (others still see the alert unread).
import Link from "next/link";
import { useRouter } from "next/navigation";
import { BellOff, Check, CircleCheck, Clock, Loader2 } from "lucide-react";
import { useState } from "react";
import { CureCaution } from "@/components/cure/cure-caution";
import { Badge } from "@/components/ui/badge";
import { EmptyState } from "@/components/ui/empty-state";
import type { Alert } from "@/lib/data/alerts";
import { ApiError, apiFetch, jsonInit } from "@/lib/queries/api";
import { newIdempotencyKey } from "@/lib/queries/stock";

const when = (iso: string, timeZone: string) =>
  new Intl.DateTimeFormat("en-GB", { timeZone, day: "numeric", month: "short", hour: "2-digit", minute: "2-digit" }).format(new Date(iso));

const KIND_LABEL: Record<Alert["kind"], string> = { expiry: "Date", reorder: "Reorder", shortage: "Short for a batch" };

/** Where to act on an alert, when this person may open it: the buying page for reorder, the batch sheet for a shortage. */
function actionLink(a: Alert, may: { reorder: boolean; shortage: boolean }): { href: string; label: string } | null {
  if (a.kind === "reorder" && may.reorder) return { href: "/purchasing/reorder", label: `Open Reorder (${a.kitchen.name})` };
  if (a.kind === "shortage" && may.shortage) return { href: `/planning/batches/${a.subjectId}`, label: "Open the batch" };
  return null;
}

export function AlertList({ alerts, unreadCount, timeZone, links }: {
  alerts: Alert[]; unreadCount: number; timeZone: string;
  /** which pages this person may open: Reorder (purchasing.read), the batch sheet (planning.read) */
  links: { reorder: boolean; shortage: boolean };
}) {
  const router = useRouter();
  const [busy, setBusy] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);

  async function act(alert: Alert, action: "ack" | "snooze") {
    setBusy(`${alert.id}:${action}`);
    setError(null);
    try {
      const key = { "idempotency-key": newIdempotencyKey() };
      await apiFetch(
        `/api/alerts/${alert.id}/${action}`,
        action === "ack" ? { method: "POST", headers: key } : jsonInit("POST", { hours: 24 }, key),
      );
      router.refresh();
    } catch (e) {
      setError(e instanceof ApiError ? e.message : "That did not go through. Try again.");
    } finally {
      setBusy(null);
    }
  }

  if (alerts.length === 0) {
    return (
      <EmptyState title="Nothing needs a look" icon={<BellOff aria-hidden className="h-8 w-8" />}>
        <p>Each morning the lots in stock are checked against the warning windows of their category, the items against their reorder points and the coming week's batches against the stock. Anything that needs a look shows up here.</p>
      </EmptyState>
    );
  }
  const hasCure = alerts.some((a) => a.caution);
  return (
    <section aria-label="Alerts" className="space-y-3">
      <p className="text-brine" role="status">{unreadCount === 1 ? "1 alert not yet seen." : `${unreadCount} alerts not yet seen.`}</p>
      {error ? <p role="alert" className="text-ember">{error}</p> : null}
      {hasCure ? <CureCaution /> : null}
      <ul className="space-y-2">
        {alerts.map((a) => {
          const link = actionLink(a, links);
          return (
            <li key={a.id} className={`panel flex flex-wrap items-start justify-between gap-3 px-4 py-3 ${a.unread ? "" : "opacity-75"}`}>
              {/* the text takes the room left of the buttons and wraps inside it, so long details keep the buttons beside it */}
              <div className="min-w-0 flex-1 basis-64">
                <p className="font-semibold">{a.title}</p>
                <p className="text-sm text-brine">{a.detail}</p>
                {link ? (
                  <p className="mt-1 text-sm">
                    <Link href={link.href} className="font-semibold text-paprika underline underline-offset-2">{link.label}</Link>
                  </p>
                ) : null}
                <p className="mt-1 flex flex-wrap items-center gap-2 text-sm text-brine">
                  <Badge>{KIND_LABEL[a.kind]}</Badge>
                  <span>{a.kitchen.name}</span>
                  <span>· raised {when(a.createdAt, timeZone)}</span>
                  {a.clearedAt ? <Badge tone="herb" icon={<CircleCheck aria-hidden className="h-3.5 w-3.5" />}>Cleared {when(a.clearedAt, timeZone)}</Badge> : null}
                  {a.acknowledgedAt ? <Badge tone="herb" icon={<Check aria-hidden className="h-3.5 w-3.5" />}>Seen</Badge> : null}
                  {!a.acknowledgedAt && a.snoozedUntil && !a.unread ? (
                    <Badge icon={<Clock aria-hidden className="h-3.5 w-3.5" />}>Set aside until {when(a.snoozedUntil, timeZone)}</Badge>
                  ) : null}
                  {a.unread ? <Badge tone="amber">New</Badge> : null}
                </p>
              </div>
              {a.acknowledgedAt || a.clearedAt ? null : (
                <div className="flex shrink-0 gap-2">
                  <button type="button" className="btn-quiet" disabled={busy !== null} onClick={() => void act(a, "snooze")}>
                    {busy === `${a.id}:snooze` ? <Loader2 aria-hidden className="h-4 w-4 animate-spin" /> : <Clock aria-hidden className="h-4 w-4" />}
                    Remind me tomorrow
                  </button>
                  <button type="button" className="btn-primary" disabled={busy !== null} onClick={() => void act(a, "ack")}>
                    {busy === `${a.id}:ack` ? <Loader2 aria-hidden className="h-4 w-4 animate-spin" /> : <Check aria-hidden className="h-4 w-4" />}
                    Seen
                  </button>
                </div>
              )}
            </li>
          );
        })}
      </ul>
    </section>
  );
}
