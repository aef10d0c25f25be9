import { declineTransferRequest } from "@/lib/data/transfer-requests";
import { idParam, route } from "@/lib/http/route";
import { transferDeclineInput } from "@/lib/validation/movements";

export const POST = route({ body: transferDeclineInput }, async ({ user, params, body }) =>
  declineTransferRequest(user, idParam(params, "Transfer request"), body.reason));
