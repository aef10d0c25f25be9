import { fulfilTransferRequest } from "@/lib/data/transfer-requests";
import { idParam, Reply, route } from "@/lib/http/route";
import { transferFulfilInput } from "@/lib/validation/movements";

/** The sending kitchen posts the transfer (the lot chosen, or first-expired-first-out); the request closes in the same transaction. */
export const POST = route({ body: transferFulfilInput, idempotent: true }, async ({ user, params, body }) =>
  new Reply(201, await fulfilTransferRequest(user, idParam(params, "Transfer request"), body.lot)));
