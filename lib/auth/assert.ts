import { forbidden } from "../http/errors";
import { can, type Action, type Actor, type PermissionContext } from "./permissions";

/** Throws 403 unless the actor may do the action (in ctx.kitchenId, when given). */
export function assertCan(actor: Actor, action: Action, ctx?: PermissionContext): void {
  if (!can(actor, action, ctx)) throw forbidden();
}
