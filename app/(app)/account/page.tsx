import type { Metadata } from "next";
import { PageHeader } from "@/components/shell/page-header";
import { timeZoneOptions } from "@/components/ui/time-zones";
import { requireUser } from "@/lib/auth/session";
import { getCompany } from "@/lib/data/companies";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { getAlertPreferences } from "@/lib/data/preferences";
import { AlertEmailForm } from "./_components/alert-email-form";
import { ProfileForm } from "./_components/profile-form";

export const metadata: Metadata = { title: "Your account" };
export const dynamic = "force-dynamic";

export default async function AccountPage() {
  // every signed-in person may edit their own details
  const user = await requireUser();
  const [company, prefs] = await Promise.all([getCompany(user), getAlertPreferences(user)]);
  return (
    <>
      <PageHeader title="Your account" description="How your name appears, how times and quantities are shown to you, and which alerts you get by e-mail." />
      <dl className="mb-6 grid max-w-xl grid-cols-[auto_1fr] gap-x-6 gap-y-1">
        <dt className="text-brine">E-mail</dt>
        <dd className="break-all font-semibold">{user.email}</dd>
        <dt className="text-brine">Role</dt>
        <dd className="font-semibold">{ROLE_LABELS[user.role]} at {user.companyName}</dd>
      </dl>
      <ProfileForm
        profile={{ name: user.name, timeZone: user.ownTimeZone, unitSystem: user.unitSystem }}
        zones={timeZoneOptions(company.timeZone, user.timeZone)}
        companyTimeZone={company.timeZone}
      />
      <div className="mt-8">
        <AlertEmailForm prefs={prefs} />
      </div>
    </>
  );
}
