import { getAlertPreferences, updateAlertPreferences } from "@/lib/data/preferences";
import { route } from "@/lib/http/route";
import { alertPreferencesInput } from "@/lib/validation/preferences";

/** How alerts reach the signed-in person by e-mail. */
export const GET = route({}, async ({ user }) => getAlertPreferences(user));
export const PUT = route({ body: alertPreferencesInput }, async ({ user, body }) => updateAlertPreferences(user, body));
