import { retryFailedJob } from "@/lib/data/job-health";
import { notFound } from "@/lib/http/errors";
import { route } from "@/lib/http/route";

/** Runs a failed job of the admin's company again (attempts reset). */
export const POST = route({ idempotent: true }, async ({ user, params }) => {
  const { queue, id } = params;
  if (typeof queue !== "string" || typeof id !== "string" || id.length > 300) throw notFound("Failed job");
  return retryFailedJob(user, queue, id);
});
