// The e-mails a supplier gets about a purchase order: the order itself (its PDF and CSV attached by
// the caller) and, when a sent order is called off, the cancellation. Pure, like lib/mail/templates.ts:
// the caller supplies every value. Addressed to the supplier, so they speak for the company, not
// for Hank & Lot.

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);

function html(paragraphs: string[]): string {
  const ps = paragraphs.map((p) => `<p style="margin:0 0 12px;white-space:pre-line">${escapeHtml(p)}</p>`).join("");
  return `<div style="font-family:sans-serif;color:#1f1a17;max-width:560px">${ps}</div>`;
}

const greeting = (contactName: string) => (contactName.trim() ? `Hello ${contactName.trim()},` : "Hello,");

export interface OrderMailValues {
  number: string;
  companyName: string;
  supplierContact: string;
  kitchenName: string;
  kitchenAddress: string;
  /** yyyy-mm-dd, or null */
  deliverBy: string | null;
  total: string;
  currency: string;
  lineCount: number;
  notes: string;
  /** who sends it, signing the e-mail */
  senderName: string;
}

export function purchaseOrderEmail(v: OrderMailValues) {
  const deliverTo = [v.kitchenName, v.kitchenAddress.trim()].filter(Boolean).join("\n");
  const paragraphs = [
    greeting(v.supplierContact),
    `Please supply our purchase order ${v.number}: ${v.lineCount} ${v.lineCount === 1 ? "line" : "lines"}, ${v.total} ${v.currency} in total. The order is attached as a PDF to read and as a CSV to load into your system; both carry the same lines.`,
    `Deliver to:\n${deliverTo}${v.deliverBy ? `\nNeeded by ${v.deliverBy}.` : ""}`,
    ...(v.notes.trim() ? [`Notes: ${v.notes.trim()}`] : []),
    `Please quote ${v.number} on your delivery note and invoice. If anything cannot be supplied as ordered, reply to let us know.`,
    `${v.senderName}\n${v.companyName}`,
  ];
  return {
    subject: `Purchase order ${v.number} from ${v.companyName}`,
    text: `${paragraphs.join("\n\n")}\n`,
    html: html(paragraphs),
  };
}

export function purchaseOrderCancelledEmail(v: { number: string; companyName: string; supplierContact: string; sentOn: string; reason: string; senderName: string }) {
  const paragraphs = [
    greeting(v.supplierContact),
    `We have cancelled our purchase order ${v.number}, sent to you on ${v.sentOn}. Please do not deliver it; anything already on its way, please let us know by reply.`,
    `Reason: ${v.reason}`,
    `${v.senderName}\n${v.companyName}`,
  ];
  return {
    subject: `Cancelled: purchase order ${v.number} from ${v.companyName}`,
    text: `${paragraphs.join("\n\n")}\n`,
    html: html(paragraphs),
  };
}
