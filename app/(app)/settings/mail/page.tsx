import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { Inbox } from "lucide-react";
import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { listCapturedMail, mailFakeInUse } from "@/lib/data/captured-mail";
import { formatDateTime } from "@/lib/mail/templates";

export const metadata: Metadata = { title: "Captured mail" };
export const dynamic = "force-dynamic";

const URL_PATTERN = /https?:\/\/[^\s<>"']+/g;

/** Plain text with its web links clickable; everything else stays text (React escapes it). */
function LinkedText({ text }: { text: string }) {
  const parts: React.ReactNode[] = [];
  let last = 0;
  for (const match of text.matchAll(URL_PATTERN)) {
    // a full stop or bracket after a link belongs to the sentence, not the link
    const href = match[0].replace(/[.,;:!?)\]]+$/, "");
    parts.push(text.slice(last, match.index));
    parts.push(
      <a key={match.index} href={href} className="break-all font-semibold text-paprika underline underline-offset-2 hover:text-paprika-hover">
        {href}
      </a>,
    );
    last = match.index + href.length;
  }
  parts.push(text.slice(last));
  return <>{parts}</>;
}

export default async function CapturedMailPage() {
  const user = await requireUser();
  if (!can(user, "mail.readCaptured") || !mailFakeInUse()) notFound();
  const messages = await listCapturedMail(user);
  return (
    <>
      <PageHeader
        title="Captured mail"
        description="This page is here because e-mail goes to the local mail catcher, not to real inboxes. Your company's messages, newest first."
      />
      {messages.length === 0 ? (
        <EmptyState title="No mail yet" icon={<Inbox aria-hidden className="h-8 w-8" />}>
          <p>Invitations, password resets, purchase orders and alert e-mail for your company show up here once sent.</p>
        </EmptyState>
      ) : (
        <ul className="space-y-3">
          {messages.map((m) => (
            <li key={m.id} className="panel">
              <div className="flex flex-wrap items-baseline justify-between gap-x-6 gap-y-1 px-5 pt-4">
                <h2 className="font-sans text-lg font-semibold">{m.subject || "(no subject)"}</h2>
                <time dateTime={m.receivedAt} className="num text-sm text-brine">{formatDateTime(new Date(m.receivedAt), user.timeZone)}</time>
              </div>
              <p className="break-all px-5 text-sm text-brine">To {m.to.join(", ")}</p>
              <details className="group mt-2 border-t border-salt-edge">
                <summary className="flex min-h-touch cursor-pointer items-center px-5 font-semibold text-paprika marker:text-paprika">
                  <span className="ml-1 group-open:hidden">Show message</span>
                  <span className="ml-1 hidden group-open:inline">Hide message</span>
                </summary>
                <div className="whitespace-pre-wrap break-words px-5 pb-5 text-[15px] leading-relaxed">
                  <LinkedText text={m.text} />
                </div>
              </details>
            </li>
          ))}
        </ul>
      )}
    </>
  );
}
