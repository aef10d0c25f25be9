import { route } from "@/lib/http/route";
import { meBody } from "./me-body";

export const GET = route({}, async ({ user }) => meBody(user));
