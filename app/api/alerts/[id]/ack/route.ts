import { acknowledgeAlert } from "@/lib/data/alerts";
import { idParam, route } from "@/lib/http/route";

/** Marks the alert read for the signed-in user. */
export const POST = route({ idempotent: true }, async ({ user, params }) => acknowledgeAlert(user, idParam(params, "Alert")));
