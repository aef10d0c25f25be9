import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { PageHeader } from "@/components/shell/page-header";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { jobHealth } from "@/lib/data/job-health";
import { JobsView } from "./_components/jobs-view";

export const metadata: Metadata = { title: "Jobs" };
export const dynamic = "force-dynamic";

// Answers within about 2 s while Redis is down (lib/data/job-health.ts): the page then says so and
// shows the last runs the database knows.
export default async function JobsPage() {
  const user = await requireUser();
  if (!can(user, "jobs.manage")) notFound();
  const health = await jobHealth(user);
  return (
    <>
      <PageHeader
        title="Jobs"
        description="The work done in the background: the scans that raise alerts, the e-mail that goes out, and whether the job queue is keeping up."
      />
      <JobsView initial={health} timeZone={user.timeZone} serverNow={Date.now()} />
    </>
  );
}
