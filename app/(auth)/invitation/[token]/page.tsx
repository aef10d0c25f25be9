import type { Metadata } from "next";
import Link from "next/link";
import { Ban, Clock, Link2Off, UserCheck, type LucideIcon } from "lucide-react";
import { getInvitationByToken } from "@/lib/data/invitations";
import { AppError } from "@/lib/http/errors";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { AcceptForm } from "./accept-form";

export const metadata: Metadata = { title: "Invitation", robots: { index: false } };
export const dynamic = "force-dynamic";

// Why a link no longer works, in the person's terms. The explanation itself is the AppError's.
const PROBLEMS: Record<string, { title: string; icon: LucideIcon }> = {
  NOT_FOUND: { title: "This invitation link doesn't work", icon: Link2Off },
  INVITATION_USED: { title: "Invitation already accepted", icon: UserCheck },
  INVITATION_REVOKED: { title: "Invitation withdrawn", icon: Ban },
  INVITATION_EXPIRED: { title: "Invitation expired", icon: Clock },
};

async function loadInvitation(token: string) {
  try {
    return { invitation: await getInvitationByToken(token) };
  } catch (e) {
    if (e instanceof AppError && (e.status === 404 || e.status === 409)) return { problem: e };
    throw e;
  }
}

export default async function InvitationPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const { invitation, problem } = await loadInvitation(token);

  if (!invitation) {
    const shown = PROBLEMS[problem.code] ?? PROBLEMS.NOT_FOUND!;
    const Icon = shown.icon;
    const message = problem.status === 404
      ? "We can't find this invitation. Check that the whole link was copied from the e-mail, or ask your admin for a new one."
      : problem.message;
    return (
      <>
        <Icon aria-hidden className="mb-4 h-10 w-10 text-brine" strokeWidth={1.6} />
        <h1 className="text-3xl font-semibold">{shown.title}</h1>
        <p className="mb-8 mt-3">{message}</p>
        <Link href="/sign-in" className="btn-quiet">Go to sign in</Link>
      </>
    );
  }

  return (
    <>
      <h1 className="text-3xl font-semibold">Join {invitation.companyName}</h1>
      <p className="mt-2 text-brine">Choose a password to finish setting up your account.</p>
      <dl className="panel my-8 grid grid-cols-[auto_1fr] gap-x-6 gap-y-2 px-5 py-4">
        <dt className="text-brine">Company</dt>
        <dd className="font-semibold">{invitation.companyName}</dd>
        <dt className="text-brine">Role</dt>
        <dd className="font-semibold">{ROLE_LABELS[invitation.role]}</dd>
        <dt className="text-brine">E-mail</dt>
        <dd className="break-all font-semibold">{invitation.email}</dd>
      </dl>
      <AcceptForm token={token} name={invitation.name} />
    </>
  );
}
