import { listUsers } from "@/lib/data/users";
import { route } from "@/lib/http/route";

export const GET = route({}, async ({ user }) => ({ users: await listUsers(user) }));
