import { reverseMovement } from "@/lib/data/ledger";
import { idParam, Reply, route } from "@/lib/http/route";
import { reverseInput } from "@/lib/validation/movements";

/** Corrections are reversals: an equal and opposite movement (both legs of a transfer). */
export const POST = route({ body: reverseInput, idempotent: true }, async ({ user, params, body }) =>
  new Reply(201, { movements: await reverseMovement(user, idParam(params, "Movement"), body.reason) }));
