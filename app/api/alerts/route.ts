import { listAlerts } from "@/lib/data/alerts";
import { fieldErrors, validation } from "@/lib/http/errors";
import { route } from "@/lib/http/route";
import { alertListQuery } from "@/lib/validation/alerts";

/** The signed-in user's alerts, newest first, with the unread count. Reads PostgreSQL only. */
export const GET = route({}, async ({ user, req }) => {
  const parsed = alertListQuery.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!parsed.success) throw validation(fieldErrors(parsed.error));
  return listAlerts(user, parsed.data);
});
