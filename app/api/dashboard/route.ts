import { getDashboard } from "@/lib/data/dashboard";
import { route } from "@/lib/http/route";

/** The Overview's panels for the kitchens the user may read (dashboard.read), money by the company's cost formula. */
export const GET = route({}, async ({ user }) => getDashboard(user));
