import { runScanNow } from "@/lib/data/job-health";
import { notFound } from "@/lib/http/errors";
import { Reply, route } from "@/lib/http/route";

/** "Run now": queues one scan for the admin's company; the worker delivers what it finds at once. 202. */
export const POST = route({ idempotent: true }, async ({ user, params }) => {
  const name = params.name;
  if (typeof name !== "string") throw notFound("Scan");
  return new Reply(202, await runScanNow(user, name));
});
