import { jobHealth } from "@/lib/data/job-health";
import { route } from "@/lib/http/route";

/** The job health page's data (admins): queue counts, this company's failed jobs, each scan's runs. */
export const GET = route({}, async ({ user }) => jobHealth(user));
