"use server";

import { cookies, headers } from "next/headers";
import { redirect } from "next/navigation";
import { revalidatePath } from "next/cache";
import { getCurrentUser, invalidateSession, isHttps, sessionCookie, SESSION_COOKIE } from "@/lib/auth/session";
import { KITCHEN_COOKIE } from "@/lib/data/current-kitchen";

export async function chooseKitchenAction(kitchenId: string): Promise<void> {
  const user = await getCurrentUser();
  if (!user || !user.kitchens.some((k) => k.id === kitchenId)) return;
  (await cookies()).set(KITCHEN_COOKIE, kitchenId, { httpOnly: true, sameSite: "lax", path: "/", secure: isHttps(await headers()), maxAge: 400 * 24 * 3600 });
  revalidatePath("/", "layout");
}

export async function signOutAction(): Promise<void> {
  const jar = await cookies();
  const id = jar.get(SESSION_COOKIE)?.value;
  if (id) await invalidateSession(id);
  const c = sessionCookie(null, isHttps(await headers()));
  jar.set(c.name, c.value, c.attributes);
  redirect("/sign-in");
}
