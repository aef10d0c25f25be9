// E-mail texts. Pure: the caller supplies every value, dates are shown in the reader's time zone.
import type { Role } from "../../db/types";
import { ROLE_LABELS } from "../auth/roles";

export function formatDateTime(d: Date, timeZone: string): string {
  return new Intl.DateTimeFormat("en-GB", {
    day: "numeric", month: "short", year: "numeric", hour: "2-digit", minute: "2-digit", timeZone, timeZoneName: "short",
  }).format(d);
}

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);

function html(paragraphs: string[], link: { href: string; label: string }): string {
  const ps = paragraphs.map((p) => `<p style="margin:0 0 12px">${escapeHtml(p)}</p>`).join("");
  return `<div style="font-family:sans-serif;color:#1f1a17;max-width:520px">${ps}<p><a href="${escapeHtml(link.href)}" style="background:#b4441d;color:#fff;padding:10px 16px;border-radius:6px;text-decoration:none">${escapeHtml(link.label)}</a></p><p style="color:#55606b;font-size:13px">${escapeHtml(link.href)}</p></div>`;
}

export function invitationEmail(v: {
  name: string; companyName: string; inviterName: string; role: Role; link: string; expiresAt: Date; timeZone: string;
}) {
  const paragraphs = [
    `Hello ${v.name},`,
    `${v.inviterName} has invited you to ${v.companyName} on Hank & Lot as ${ROLE_LABELS[v.role].toLowerCase()}.`,
    `Open the link below to choose your password. It works once and expires on ${formatDateTime(v.expiresAt, v.timeZone)}.`,
  ];
  return {
    subject: `You're invited to ${v.companyName} on Hank & Lot`,
    text: `${paragraphs.join("\n\n")}\n\n${v.link}\n`,
    html: html(paragraphs, { href: v.link, label: "Set your password" }),
  };
}

export function passwordResetEmail(v: { name: string; link: string; expiresAt: Date; timeZone: string }) {
  const paragraphs = [
    `Hello ${v.name},`,
    `Someone asked to reset the password of your Hank & Lot account. If it was you, open the link below; it works once and expires on ${formatDateTime(v.expiresAt, v.timeZone)}.`,
    `If it was not you, ignore this e-mail: your password stays as it is.`,
  ];
  return {
    subject: "Reset your Hank & Lot password",
    text: `${paragraphs.join("\n\n")}\n\n${v.link}\n`,
    html: html(paragraphs, { href: v.link, label: "Choose a new password" }),
  };
}
