import { listCapturedMail } from "@/lib/data/captured-mail";
import { route } from "@/lib/http/route";

/** The local mail catcher's messages for the admin's own company. */
export const GET = route({}, async ({ user }) => listCapturedMail(user));
