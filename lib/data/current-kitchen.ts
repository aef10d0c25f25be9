import "server-only";
import { cookies } from "next/headers";
import type { CurrentUser, KitchenRef } from "../auth/current-user";

export const KITCHEN_COOKIE = "hl_kitchen";

/** The kitchen the user is working in: the one chosen in the switcher, else their first. */
export async function getCurrentKitchen(user: CurrentUser): Promise<KitchenRef | null> {
  const chosen = (await cookies()).get(KITCHEN_COOKIE)?.value;
  return user.kitchens.find((k) => k.id === chosen) ?? user.kitchens[0] ?? null;
}
