import type { CurrentUser } from "@/lib/auth/current-user";

/** The public shape of GET /api/me (and of the user returned by sign-in). */
export function meBody(u: CurrentUser) {
  return {
    id: u.id,
    email: u.email,
    name: u.name,
    role: u.role,
    company: { id: u.companyId, name: u.companyName },
    kitchens: u.kitchens.map((k) => ({ id: k.id, code: k.code, name: k.name })),
  };
}
