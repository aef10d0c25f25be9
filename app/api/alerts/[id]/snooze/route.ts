import { snoozeAlert } from "@/lib/data/alerts";
import { idParam, route } from "@/lib/http/route";
import { alertSnoozeInput } from "@/lib/validation/alerts";

/** Hides the alert from the signed-in user's unread count for a while. */
export const POST = route({ body: alertSnoozeInput, idempotent: true }, async ({ user, params, body }) => snoozeAlert(user, idParam(params, "Alert"), body));
