// The signed-in user as every layer sees it. Client-safe type only.
import type { Role } from "../../db/types";
import type { Actor } from "./permissions";

export interface KitchenRef {
  id: string;
  code: string;
  name: string;
}

export interface CurrentUser extends Actor {
  email: string;
  name: string;
  role: Role;
  companyName: string;
  currency: string;
  /** The user's own time zone, else the company's. */
  timeZone: string;
  /** The time zone the user chose, or null to follow the company's. */
  ownTimeZone: string | null;
  unitSystem: "metric" | "us";
  /** Kitchens the user acts in: a kitchen lead's assigned kitchens, everyone else's every open kitchen. */
  kitchens: KitchenRef[];
}
