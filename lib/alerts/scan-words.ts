// Words for the job health page (Settings > Jobs): a scan's schedule, what its last run found and
// how long ago something happened. Pure and client-safe.

const DAYS = ["Sunday", "Monday", "Tuesday", "Wednesday", "Thursday", "Friday", "Saturday"];
const two = (n: number) => String(n).padStart(2, "0");

/**
 * A cron pattern in words for the patterns the scans use: "M H * * *" is "Every day at HH:MM",
 * "M H * * D" is "Every <day> at HH:MM" (0 and 7 are Sunday). Anything else is shown as it is.
 */
export function scheduleInWords(cron: string): string {
  const parts = cron.trim().split(/\s+/);
  if (parts.length !== 5) return `Cron ${cron}`;
  const [m, h, dom, mon, dow] = parts as [string, string, string, string, string];
  if (!/^\d{1,2}$/.test(m) || !/^\d{1,2}$/.test(h) || dom !== "*" || mon !== "*") return `Cron ${cron}`;
  const at = `${two(Number(h))}:${two(Number(m))}`;
  if (dow === "*") return `Every day at ${at}`;
  if (/^[0-7]$/.test(dow)) return `Every ${DAYS[Number(dow) % 7]} at ${at}`;
  return `Cron ${cron}`;
}

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/**
 * What a run found, from the result the scan stored (job_runs.last_result): "3 new alerts, 12 lots
 * checked". Reads the fields the scans share (status, created, lotsChecked, itemsChecked); an
 * unknown shape is "Finished".
 */
export function resultInWords(result: unknown): string {
  if (!result || typeof result !== "object") return "Finished";
  const r = result as Record<string, unknown>;
  if (r.status === "company-gone") return "The company was gone";
  const parts: string[] = [];
  if (typeof r.created === "number") parts.push(r.created === 0 ? "No new alerts" : plural(r.created, "new alert", "new alerts"));
  if (typeof r.lotsChecked === "number") parts.push(plural(r.lotsChecked, "lot checked", "lots checked"));
  if (typeof r.itemsChecked === "number") parts.push(plural(r.itemsChecked, "item checked", "items checked"));
  return parts.length ? parts.join(", ") : "Finished";
}

/** "just now", "5 minutes ago", "3 hours ago", "2 days ago"; a time ahead: "in 4 hours". */
export function relativeTime(iso: string, now: number): string {
  const diff = new Date(iso).getTime() - now;
  const abs = Math.abs(diff);
  const minutes = Math.floor(abs / 60_000);
  if (minutes < 1) return diff > 0 ? "in under a minute" : "just now";
  const hours = Math.floor(minutes / 60);
  const days = Math.floor(hours / 24);
  const span = days >= 1 ? plural(days, "day", "days") : hours >= 1 ? plural(hours, "hour", "hours") : plural(minutes, "minute", "minutes");
  return diff > 0 ? `in ${span}` : `${span} ago`;
}

/** The shell's and the alerts page's words for a delay (lib/data/job-health.ts alertsDelayed). */
export function delayInWords(delay: { reason: "queue-down" | "scan-late" }): string {
  return delay.reason === "queue-down"
    ? "Alerts are delayed: the job queue is not answering"
    : "Alerts are delayed: the morning check has not run for over a day";
}
