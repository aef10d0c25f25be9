// The alert e-mail: a daily digest or an immediate note, in text and HTML, with links into the
// product. Pure: the caller gives every value (jobs/definitions/deliver-alerts.ts).
import { CURE_CAUTION } from "../cure/caution";

export interface DigestAlert {
  id: string;
  kind: "expiry" | "reorder" | "shortage";
  title: string;
  detail: string;
  kitchenName: string;
  /** some alert of this kind is about cure (the caution goes with it) */
  aboutCure: boolean;
  /** the page that acts on it, relative to the app's address */
  path: string;
}

const GROUPS: { kind: DigestAlert["kind"]; heading: string }[] = [
  { kind: "expiry", heading: "Lots nearing their date" },
  { kind: "shortage", heading: "Short for planned batches" },
  { kind: "reorder", heading: "Below reorder point" },
];

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** The page each kind of alert is acted on from. */
export function alertPath(kind: DigestAlert["kind"], subjectType: string, subjectId: string): string {
  if (kind === "reorder") return "/purchasing/reorder";
  if (kind === "shortage" && subjectType === "batch") return `/planning/batches/${encodeURIComponent(subjectId)}`;
  return "/alerts";
}

export function alertDigestEmail(v: {
  name: string;
  companyName: string;
  mode: "digest" | "immediate";
  appUrl: string;
  alerts: readonly DigestAlert[];
}) {
  const base = v.appUrl.replace(/\/$/, "");
  const n = v.alerts.length;
  const subject = v.mode === "digest"
    ? `${v.companyName}: ${plural(n, "alert", "alerts")} in today's digest`
    : `${v.companyName}: ${plural(n, "new alert", "new alerts")}`;
  const intro = v.mode === "digest"
    ? `Hello ${v.name}, here is what the checks found since your last digest.`
    : `Hello ${v.name}, the checks have just found this.`;
  const groups = GROUPS.map((g) => ({ ...g, alerts: v.alerts.filter((a) => a.kind === g.kind) })).filter((g) => g.alerts.length);
  const cure = v.alerts.some((a) => a.aboutCure);
  const footer = `All alerts: ${base}/alerts\nChoose what you receive and when: ${base}/account#alert-email`;

  const text = [
    intro,
    ...groups.map((g) => [`${g.heading} (${g.alerts.length})`, ...g.alerts.map((a) => `- ${a.title} [${a.kitchenName}]\n  ${a.detail}\n  ${base}${a.path}`)].join("\n")),
    ...(cure ? [`Cure: ${CURE_CAUTION}`] : []),
    footer,
  ].join("\n\n") + "\n";

  const li = (a: DigestAlert) =>
    `<li style="margin:0 0 10px"><a href="${escapeHtml(base + a.path)}" style="color:#1f1a17;font-weight:600">${escapeHtml(a.title)}</a>` +
    ` <span style="color:#55606b">· ${escapeHtml(a.kitchenName)}</span><br><span style="color:#3a3330">${escapeHtml(a.detail)}</span></li>`;
  const html =
    `<div style="font-family:sans-serif;color:#1f1a17;max-width:600px">` +
    `<p style="margin:0 0 16px">${escapeHtml(intro)}</p>` +
    groups.map((g) => `<h2 style="font-size:16px;margin:16px 0 8px">${escapeHtml(g.heading)} (${g.alerts.length})</h2><ul style="padding-left:18px;margin:0">${g.alerts.map(li).join("")}</ul>`).join("") +
    (cure ? `<p style="margin:16px 0;padding:10px 12px;border-left:4px solid #b4441d;background:#fbf1ec">${escapeHtml(CURE_CAUTION)}</p>` : "") +
    `<p style="margin:20px 0 8px"><a href="${escapeHtml(base)}/alerts" style="background:#b4441d;color:#fff;padding:10px 16px;border-radius:6px;text-decoration:none">Open the alerts</a></p>` +
    `<p style="color:#55606b;font-size:13px">Choose what you receive and when on <a href="${escapeHtml(base)}/account#alert-email">your account page</a>.</p></div>`;
  return { subject, text, html };
}
