"use client";

// Reports > Periods. Months close in order, so only the next month to close has a Close button
// (a confirm step says what closing means); only the latest closed month can be reopened, by an
// admin, with a reason. After each change the list is asked again (the server's word is the truth:
// someone else may have closed a month meanwhile).
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { History, Loader2, LockKeyhole, LockKeyholeOpen, X } from "lucide-react";
import { useId, useState } from "react";
import { Badge } from "@/components/ui/badge";
import { DataTable, RowHeader, TBody, Td, Th, THead } from "@/components/ui/data-table";
import { FieldError, FormMessage, StatusRegion, describedBy } from "@/components/ui/field";
import { addMonths, monthLabel } from "@/lib/periods/months";
import { ApiError } from "@/lib/queries/api";
import { closePeriod, fetchPeriods, periodKeys, reopenPeriod, type Period, type PeriodList } from "@/lib/queries/periods";

type Open = { kind: "close"; month: string } | { kind: "reopen"; month: string } | null;

export function PeriodsView({ initial, canClose, canReopen, timeZone }: { initial: PeriodList; canClose: boolean; canReopen: boolean; timeZone: string }) {
  const queryClient = useQueryClient();
  const q = useQuery({ queryKey: periodKeys.list, queryFn: fetchPeriods, initialData: initial, staleTime: 0 });
  const list = q.data;
  const [open, setOpen] = useState<Open>(null);
  const [notice, setNotice] = useState<string>();
  const [error, setError] = useState<string>();
  const [reason, setReason] = useState("");
  const [reasonErrors, setReasonErrors] = useState<string[]>();

  const done = (message: string) => {
    setOpen(null);
    setReason("");
    setReasonErrors(undefined);
    setNotice(message);
  };
  const failed = (e: unknown) => {
    if (e instanceof ApiError && e.fields.reason) setReasonErrors(e.fields.reason);
    else setError(e instanceof ApiError ? e.message : "That did not go through. Try again.");
  };
  const reset = () => {
    setNotice(undefined);
    setError(undefined);
    setReasonErrors(undefined);
  };

  const close = useMutation({
    mutationFn: (month: string) => closePeriod(month),
    onMutate: reset,
    onSuccess: (p) => done(`${monthLabel(p.month)} is closed. Movements dated in it are refused from now on.`),
    onError: failed,
    onSettled: () => queryClient.invalidateQueries({ queryKey: periodKeys.list }),
  });
  const reopen = useMutation({
    mutationFn: ({ month, why }: { month: string; why: string }) => reopenPeriod(month, why),
    onMutate: reset,
    onSuccess: (p) => done(`${monthLabel(p.month)} is open again.`),
    onError: failed,
    onSettled: () => queryClient.invalidateQueries({ queryKey: periodKeys.list }),
  });

  const busy = close.isPending || reopen.isPending;
  const next = list.nextToClose;
  const currentLabel = monthLabel(list.currentMonth);
  const firstClosed = list.periods.find((p) => p.closedWith)?.closedWith ?? null;

  return (
    <div className="space-y-8">
      <section aria-labelledby="state-title" className="panel flex flex-wrap items-start gap-x-8 gap-y-3 px-5 py-4">
        <div className="min-w-[16rem] flex-1">
          <h2 id="state-title" className="text-lg font-semibold">
            {list.closedThrough ? `Closed through ${monthLabel(list.closedThrough)}` : "No month is closed yet"}
          </h2>
          <p className="mt-1 text-brine">
            {list.closedThrough
              ? `Stock movements dated in ${monthLabel(list.closedThrough)} or earlier are refused. Corrections are dated in ${monthLabel(addMonths(list.closedThrough, 1))} or later.`
              : "Every month is open: movements may be dated in any of them."}
          </p>
        </div>
        <div className="max-w-md text-sm text-brine">
          <p>Months close in order, the oldest first, and reopen from the latest back. Only an admin reopens a month, with a reason.</p>
          <p className="mt-1">Months follow the company&rsquo;s clock ({list.timeZone.replaceAll("_", " ")}). {currentLabel} is under way.</p>
        </div>
      </section>

      <StatusRegion>{notice}</StatusRegion>
      {error ? <FormMessage tone="error">{error}</FormMessage> : null}

      <section aria-labelledby="months-title" className="space-y-3">
        <h2 id="months-title" className="text-xl font-semibold">Months</h2>
        <DataTable caption="Months and their status, newest first">
          <THead>
            <Th>Month</Th>
            <Th>Status</Th>
            <Th>Closed</Th>
            <Th action />
          </THead>
          <TBody>
            {list.periods.map((p) => {
              const label = monthLabel(p.month);
              const mayClose = canClose && p.month === next;
              const mayReopen = canReopen && p.month === list.closedThrough;
              const expanded = open?.month === p.month;
              return (
                <MonthRows key={p.month} expanded={expanded} colSpan={4}
                  row={
                    <tr className={expanded ? "bg-salt-deep/40" : undefined}>
                      <RowHeader className="whitespace-nowrap">{label}</RowHeader>
                      <Td><StatusBadge period={p} /></Td>
                      <Td className="text-sm">
                        <ClosedCell period={p} timeZone={timeZone} />
                      </Td>
                      <Td action>
                        {mayClose && !expanded ? (
                          <button type="button" className="btn-quiet" disabled={busy} onClick={() => { reset(); setOpen({ kind: "close", month: p.month }); }} aria-label={`Close ${label}…`}>
                            <LockKeyhole aria-hidden className="h-4 w-4" />
                            Close…
                          </button>
                        ) : mayReopen && !expanded ? (
                          <button type="button" className="btn-quiet" disabled={busy} onClick={() => { reset(); setOpen({ kind: "reopen", month: p.month }); }} aria-label={`Reopen ${label}…`}>
                            <LockKeyholeOpen aria-hidden className="h-4 w-4" />
                            Reopen…
                          </button>
                        ) : null}
                      </Td>
                    </tr>
                  }
                  detail={
                    open?.kind === "close" ? (
                      <CloseConfirm month={p.month} busy={close.isPending} onConfirm={() => close.mutate(p.month)} onCancel={() => setOpen(null)} />
                    ) : open?.kind === "reopen" ? (
                      <ReopenForm
                        month={p.month}
                        busy={reopen.isPending}
                        reason={reason}
                        errors={reasonErrors}
                        onReason={(v) => {
                          setReason(v);
                          setReasonErrors(undefined);
                        }}
                        onSubmit={() => {
                          if (!reason.trim()) {
                            setReasonErrors(["Say why the month is reopened; it goes on the audit trail."]);
                            return;
                          }
                          reopen.mutate({ month: p.month, why: reason });
                        }}
                        onCancel={() => { setOpen(null); setReasonErrors(undefined); }}
                      />
                    ) : null
                  }
                />
              );
            })}
          </TBody>
        </DataTable>
        {firstClosed && list.periods.some((p) => p.closedWith) ? (
          <p className="text-sm text-brine">
            The months before {monthLabel(firstClosed)} had no stock movements; they closed with it, so nothing can be back-dated into them.
          </p>
        ) : null}
        {canClose && next === null ? (
          <p className="text-sm text-brine">Every month that is over is closed. {currentLabel} can be closed once it has ended.</p>
        ) : null}
      </section>

      <section aria-labelledby="trail-title" className="space-y-3">
        <div>
          <h2 id="trail-title" className="text-xl font-semibold">Audit trail</h2>
          <p className="text-brine">Every close and reopen of these months, newest first. Nothing here can be changed or removed.</p>
        </div>
        {list.events.length === 0 ? (
          <p className="panel flex items-center gap-2 px-4 py-3 text-brine">
            <History aria-hidden className="h-5 w-5" />
            No month has been closed or reopened yet.
          </p>
        ) : (
          <DataTable caption="Audit trail of closing and reopening">
            <THead>
              <Th>When</Th>
              <Th>Month</Th>
              <Th>Action</Th>
              <Th>Who</Th>
              <Th>Reason</Th>
            </THead>
            <TBody>
              {list.events.map((e) => (
                <tr key={e.id}>
                  <Td className="whitespace-nowrap"><time dateTime={e.at} className="num">{formatTime(e.at, timeZone)}</time></Td>
                  <RowHeader className="whitespace-nowrap font-normal">{monthLabel(e.month)}</RowHeader>
                  <Td>{e.action === "close" ? "Closed" : "Reopened"}</Td>
                  <Td>{e.user?.name ?? <span className="text-brine">A former user</span>}</Td>
                  <Td className="max-w-[22rem] break-words">{e.reason ?? <span className="text-brine">—</span>}</Td>
                </tr>
              ))}
            </TBody>
          </DataTable>
        )}
      </section>
    </div>
  );
}

function MonthRows({ row, detail, expanded, colSpan }: { row: React.ReactNode; detail: React.ReactNode; expanded: boolean; colSpan: number }) {
  return (
    <>
      {row}
      {expanded && detail ? (
        <tr className="bg-salt-deep/40">
          <td colSpan={colSpan} className="px-4 pb-4 pt-1">{detail}</td>
        </tr>
      ) : null}
    </>
  );
}

function StatusBadge({ period }: { period: Period }) {
  if (period.status === "closed") return <Badge icon={<LockKeyhole />}>Closed</Badge>;
  if (!period.ended) return <Badge tone="herb" icon={<LockKeyholeOpen />}>Open · under way</Badge>;
  return <Badge tone="herb" icon={<LockKeyholeOpen />}>Open</Badge>;
}

function ClosedCell({ period, timeZone }: { period: Period; timeZone: string }) {
  if (period.closedAt) {
    return (
      <>
        <time dateTime={period.closedAt} className="num block whitespace-nowrap">{formatTime(period.closedAt, timeZone)}</time>
        <span className="block text-brine">{period.closedBy ? `by ${period.closedBy.name}` : "by a former user"}</span>
      </>
    );
  }
  if (period.closedWith) return <span className="text-brine">With {monthLabel(period.closedWith)}</span>;
  return <span className="text-brine">—</span>;
}

function CloseConfirm({ month, busy, onConfirm, onCancel }: { month: string; busy: boolean; onConfirm: () => void; onCancel: () => void }) {
  const label = monthLabel(month);
  const titleId = useId();
  return (
    <div role="group" aria-labelledby={titleId} className="rounded-md border border-brine-line bg-white px-4 py-3">
      <p id={titleId} className="font-semibold">Close {label}?</p>
      <p className="mt-1 max-w-3xl text-sm text-brine">
        From then on, stock movements dated in {label} or earlier are refused. Corrections, reversals included, are dated in {monthLabel(addMonths(month, 1))} or later.
        Only an admin can reopen it.
      </p>
      <div className="mt-3 flex flex-wrap gap-2">
        <button type="button" className="btn-primary" disabled={busy} onClick={onConfirm}>
          {busy ? <Loader2 aria-hidden className="h-4 w-4 animate-spin" /> : <LockKeyhole aria-hidden className="h-4 w-4" />}
          Close {label}
        </button>
        <button type="button" className="btn-quiet" disabled={busy} onClick={onCancel}>
          <X aria-hidden className="h-4 w-4" />
          Keep it open
        </button>
      </div>
    </div>
  );
}

function ReopenForm({ month, busy, reason, errors, onReason, onSubmit, onCancel }: {
  month: string; busy: boolean; reason: string; errors?: string[]; onReason: (v: string) => void; onSubmit: () => void; onCancel: () => void;
}) {
  const label = monthLabel(month);
  const id = `reopen-reason-${month}`;
  return (
    <form
      className="rounded-md border border-brine-line bg-white px-4 py-3"
      onSubmit={(e) => {
        e.preventDefault();
        onSubmit();
      }}
    >
      <p className="font-semibold">Reopen {label}?</p>
      <p className="mt-1 max-w-3xl text-sm text-brine">Movements may be dated in {label} again until it is closed once more. The reason goes on the audit trail.</p>
      <div className="mt-3 max-w-xl">
        <label htmlFor={id} className="field-label">Why reopen it?</label>
        <input id={id} name="reason" type="text" maxLength={500} className="field-input" value={reason} onChange={(e) => onReason(e.target.value)} {...describedBy(id, errors)} autoFocus />
        <FieldError id={id} errors={errors} />
      </div>
      <div className="mt-3 flex flex-wrap gap-2">
        <button type="submit" className="btn-primary" disabled={busy}>
          {busy ? <Loader2 aria-hidden className="h-4 w-4 animate-spin" /> : <LockKeyholeOpen aria-hidden className="h-4 w-4" />}
          Reopen {label}
        </button>
        <button type="button" className="btn-quiet" disabled={busy} onClick={onCancel}>
          <X aria-hidden className="h-4 w-4" />
          Keep it closed
        </button>
      </div>
    </form>
  );
}

const formatters = new Map<string, Intl.DateTimeFormat>();
/** "2 Apr 2026, 09:14" in the user's zone. */
function formatTime(iso: string, timeZone: string): string {
  let f = formatters.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat("en-GB", { timeZone, day: "numeric", month: "short", year: "numeric", hour: "2-digit", minute: "2-digit" });
    formatters.set(timeZone, f);
  }
  return f.format(new Date(iso));
}
