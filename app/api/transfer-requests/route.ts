import { listTransferRequests, requestTransfer } from "@/lib/data/transfer-requests";
import { fieldErrors, validation } from "@/lib/http/errors";
import { Reply, route } from "@/lib/http/route";
import { transferRequestInput, transferRequestsQuery } from "@/lib/validation/movements";

export const GET = route({}, async ({ user, req }) => {
  const parsed = transferRequestsQuery.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!parsed.success) throw validation(fieldErrors(parsed.error));
  return { requests: await listTransferRequests(user, parsed.data) };
});

/** A kitchen asks another kitchen of the company for stock. */
export const POST = route({ body: transferRequestInput, idempotent: true }, async ({ user, body }) => new Reply(201, await requestTransfer(user, body)));
