"use client";

// Settings > Jobs: each scan's last and next run with "Run now", this company's failed jobs with
// "Retry", and the queues' counts. After "Run now" the page asks again every second until the
// scan's last run changes, then says what it found.
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { AlertTriangle, CheckCircle2, Loader2, Play, RotateCcw, Unplug } from "lucide-react";
import { useEffect, useState } from "react";
import { Badge } from "@/components/ui/badge";
import { DataTable, RowHeader, TBody, Td, Th, THead } from "@/components/ui/data-table";
import { StatusRegion } from "@/components/ui/field";
import { relativeTime, scheduleInWords } from "@/lib/alerts/scan-words";
import { ApiError } from "@/lib/queries/api";
import { fetchJobHealth, jobKeys, retryFailedJob, runScanNow, type FailedJob, type JobHealth, type ScanStatus } from "@/lib/queries/jobs";

const QUEUE_LABELS: Record<string, string> = {
  mail: "E-mail",
  housekeeping: "Housekeeping",
  scans: "Alert scans",
  digests: "Alert digests",
};

/** a run asked for: done once the scan's last run differs from `before` */
interface Waiting {
  before: string | null;
  queuedAt: number;
}

const GIVE_UP_MS = 60_000;

export function JobsView({ initial, timeZone, serverNow }: { initial: JobHealth; timeZone: string; serverNow: number }) {
  const queryClient = useQueryClient();
  const [waiting, setWaiting] = useState<Record<string, Waiting>>({});
  const [notice, setNotice] = useState<string>();
  const [error, setError] = useState<string>();
  // the server's clock for the first render (no hydration mismatch), then the browser's
  const [now, setNow] = useState(serverNow);
  useEffect(() => {
    setNow(Date.now());
    const t = setInterval(() => setNow(Date.now()), 15_000);
    return () => clearInterval(t);
  }, []);

  const anyWaiting = Object.keys(waiting).length > 0;
  const q = useQuery({
    queryKey: jobKeys.health,
    queryFn: fetchJobHealth,
    initialData: initial,
    initialDataUpdatedAt: serverNow,
    refetchInterval: anyWaiting ? 1000 : 30_000,
    staleTime: 0,
  });
  const health = q.data;
  // each fresh answer moves the clock too, so a run that just finished reads "just now"
  useEffect(() => setNow(Date.now()), [q.dataUpdatedAt]);

  // a waited-for run has finished (or is taking too long)
  useEffect(() => {
    if (!anyWaiting) return;
    const next = { ...waiting };
    let changed = false;
    for (const [name, w] of Object.entries(waiting)) {
      const scan = health.scans.find((s) => s.name === name);
      if (scan && scan.lastRunAt !== w.before) {
        delete next[name];
        changed = true;
        setNotice(`${scan.label}: ran ${scan.lastRunAt ? formatTime(scan.lastRunAt, timeZone, true) : ""}. ${scan.lastResultText ?? ""}`.trim());
      } else if (Date.now() - w.queuedAt > GIVE_UP_MS) {
        delete next[name];
        changed = true;
        setError(`${scan?.label ?? name}: no result after a minute. The run is still queued; the worker may be stopped or busy.`);
      }
    }
    if (changed) setWaiting(next);
  }, [health, waiting, anyWaiting, timeZone]);

  const run = useMutation({
    mutationFn: (scan: ScanStatus) => runScanNow(scan.name),
    onMutate: () => {
      setNotice(undefined);
      setError(undefined);
    },
    onSuccess: (_, scan) => {
      setWaiting((w) => ({ ...w, [scan.name]: { before: scan.lastRunAt, queuedAt: Date.now() } }));
      setNotice(`${scan.label}: queued — results arrive within seconds.`);
    },
    onError: (e) => {
      setError(e instanceof ApiError ? e.message : "That did not go through. Try again.");
      void queryClient.invalidateQueries({ queryKey: jobKeys.health });
    },
  });

  const retry = useMutation({
    mutationFn: (job: FailedJob) => retryFailedJob(job.queue, job.id),
    onMutate: () => {
      setNotice(undefined);
      setError(undefined);
    },
    onSuccess: (_, job) => setNotice(`${job.label}: queued again.`),
    onError: (e) => setError(e instanceof ApiError ? e.message : "That did not go through. Try again."),
    onSettled: () => queryClient.invalidateQueries({ queryKey: jobKeys.health }),
  });

  const down = health.redis === "down";

  return (
    <div className="space-y-8">
      {down ? (
        <div role="alert" className="flex gap-3 rounded-md border border-ember/25 bg-ember-soft px-4 py-3 text-pepper">
          <Unplug aria-hidden className="mt-0.5 h-5 w-5 shrink-0 text-ember" />
          <div>
            <p className="font-semibold">The job queue is not answering, so alerts are delayed.</p>
            <p className="text-sm">
              Scans, alert e-mails and other mail wait until the queue (Redis) is back, then catch up on their own. Stock and everything else
              keep working. The last runs below come from the database.
            </p>
          </div>
        </div>
      ) : null}
      <StatusRegion>{notice}</StatusRegion>
      {error ? <p role="alert" className="text-ember">{error}</p> : null}

      <section aria-labelledby="scans-title" className="space-y-3">
        <div>
          <h2 id="scans-title" className="text-xl font-semibold">Scans</h2>
          <p className="text-brine">The checks that raise alerts, for your company, at the company&apos;s local time. &ldquo;Run now&rdquo; checks at once and sends what it finds straight away.</p>
        </div>
        <DataTable caption="Scans">
          <THead>
            <Th>Scan</Th>
            <Th>Schedule</Th>
            <Th>Last run</Th>
            <Th>Next run</Th>
            <Th action />
          </THead>
          <TBody>
            {health.scans.map((s) => {
              const isWaiting = Boolean(waiting[s.name]);
              return (
                <tr key={s.name}>
                  <RowHeader>
                    {s.label}
                    <span className="block text-sm font-normal text-brine">{s.name}</span>
                  </RowHeader>
                  <Td className="whitespace-nowrap">
                    {scheduleInWords(s.cron)}
                    <span className="block text-sm text-brine">{s.timeZone.replaceAll("_", " ")}</span>
                  </Td>
                  <Td>
                    {s.lastRunAt ? (
                      <span data-testid={`last-run-${s.name}`}>
                        <time dateTime={s.lastRunAt} className="num block whitespace-nowrap">{formatTime(s.lastRunAt, timeZone, true)}</time>
                        <span className="block text-sm text-brine">{relativeTime(s.lastRunAt, Math.max(now, Date.parse(s.lastRunAt)))}: {s.lastResultText}</span>
                      </span>
                    ) : (
                      <span data-testid={`last-run-${s.name}`} className="text-brine">Not run yet</span>
                    )}
                  </Td>
                  <Td>
                    {s.nextRunAt ? (
                      <>
                        <time dateTime={s.nextRunAt} className="num block whitespace-nowrap">{formatTime(s.nextRunAt, timeZone)}</time>
                        <span className="block text-sm text-brine">{relativeTime(s.nextRunAt, now)}</span>
                      </>
                    ) : (
                      <span className="text-brine">{down ? "Unknown while the queue is down" : "Not scheduled yet"}</span>
                    )}
                  </Td>
                  <Td action>
                    {isWaiting ? (
                      <span className="inline-flex items-center gap-2 text-brine">
                        <Loader2 aria-hidden className="h-4 w-4 animate-spin" />
                        Running
                      </span>
                    ) : (
                      <button
                        type="button"
                        className="btn-quiet"
                        disabled={down || run.isPending}
                        onClick={() => run.mutate(s)}
                        aria-label={`Run now: ${s.label}`}
                      >
                        {run.isPending && run.variables?.name === s.name ? <Loader2 aria-hidden className="h-4 w-4 animate-spin" /> : <Play aria-hidden className="h-4 w-4" />}
                        Run now
                      </button>
                    )}
                  </Td>
                </tr>
              );
            })}
          </TBody>
        </DataTable>
      </section>

      <section aria-labelledby="failed-title" className="space-y-3">
        <div>
          <h2 id="failed-title" className="text-xl font-semibold">Failed jobs</h2>
          <p className="text-brine">Your company&apos;s scans and e-mails that gave up after their retries, newest first. Fix the cause, then retry.</p>
        </div>
        {health.failed === null ? (
          <p className="panel px-4 py-3 text-brine">Not known while the queue is down.</p>
        ) : health.failed.length === 0 ? (
          <p className="panel flex items-center gap-2 px-4 py-3 text-brine">
            <CheckCircle2 aria-hidden className="h-5 w-5 text-herb" />
            No failed jobs.
          </p>
        ) : (
          <DataTable caption="Failed jobs">
            <THead>
              <Th>Job</Th>
              <Th>Reason</Th>
              <Th numeric>Attempts</Th>
              <Th>Failed</Th>
              <Th action />
            </THead>
            <TBody>
              {health.failed.map((j) => (
                <tr key={`${j.queue}:${j.id}`}>
                  <RowHeader>
                    {j.label}
                    <span className="block max-w-[14rem] truncate text-sm font-normal text-brine" title={j.id}>{QUEUE_LABELS[j.queue] ?? j.queue} · {j.id}</span>
                  </RowHeader>
                  <Td className="max-w-[22rem] break-words">
                    <span className="inline-flex items-start gap-1.5">
                      <AlertTriangle aria-hidden className="mt-1 h-4 w-4 shrink-0 text-ember" />
                      {j.failedReason}
                    </span>
                  </Td>
                  <Td numeric>{j.attemptsMade}</Td>
                  <Td className="whitespace-nowrap">{j.failedAt ? <time dateTime={j.failedAt} className="num">{formatTime(j.failedAt, timeZone, true)}</time> : "—"}</Td>
                  <Td action>
                    <button type="button" className="btn-quiet" disabled={down || retry.isPending} onClick={() => retry.mutate(j)} aria-label={`Retry ${j.label} ${j.id}`}>
                      {retry.isPending && retry.variables?.id === j.id ? <Loader2 aria-hidden className="h-4 w-4 animate-spin" /> : <RotateCcw aria-hidden className="h-4 w-4" />}
                      Retry
                    </button>
                  </Td>
                </tr>
              ))}
            </TBody>
          </DataTable>
        )}
      </section>

      <section aria-labelledby="queues-title" className="space-y-3">
        <div>
          <h2 id="queues-title" className="text-xl font-semibold">Queues</h2>
          <p className="text-brine">Counts for the whole installation: every company&apos;s jobs, not only yours.</p>
        </div>
        {health.queues === null ? (
          <p className="panel px-4 py-3 text-brine">Not known while the queue is down.</p>
        ) : (
          <DataTable caption="Queues, installation-wide">
            <THead>
              <Th>Queue</Th>
              <Th numeric>Waiting</Th>
              <Th numeric>Active</Th>
              <Th numeric>Delayed</Th>
              <Th numeric>Failed</Th>
              <Th numeric>Done (a day)</Th>
            </THead>
            <TBody>
              {health.queues.map((c) => (
                <tr key={c.name}>
                  <RowHeader>
                    {QUEUE_LABELS[c.name] ?? c.name}
                    <span className="block text-sm font-normal text-brine">{c.name}</span>
                  </RowHeader>
                  <Td numeric>{c.waiting}</Td>
                  <Td numeric>{c.active}</Td>
                  <Td numeric>{c.delayed}</Td>
                  <Td numeric>{c.failed ? <Badge tone="ember">{c.failed}</Badge> : 0}</Td>
                  <Td numeric>{c.completed}</Td>
                </tr>
              ))}
            </TBody>
          </DataTable>
        )}
        <p className="text-sm text-brine">Checked <time dateTime={health.checkedAt}>{formatTime(health.checkedAt, timeZone)}</time>; this page asks again every 30 seconds.</p>
      </section>
    </div>
  );
}

const formatters = new Map<string, Intl.DateTimeFormat>();
/** "2 Dec, 05:00" in the user's zone; with seconds for runs that just happened. */
function formatTime(iso: string, timeZone: string, seconds = false): string {
  const key = `${timeZone}|${seconds}`;
  let f = formatters.get(key);
  if (!f) {
    f = new Intl.DateTimeFormat("en-GB", { timeZone, day: "numeric", month: "short", hour: "2-digit", minute: "2-digit", ...(seconds ? { second: "2-digit" } : {}) });
    formatters.set(key, f);
  }
  return f.format(new Date(iso));
}

