import { listPriceListImports, receivePriceList } from "@/lib/data/price-lists";
import { idParam, Reply, route } from "@/lib/http/route";

/** The price lists applied for this supplier, newest first. */
export const GET = route({}, async ({ user, params }) => ({ imports: await listPriceListImports(user, idParam(params, "Supplier")) }));

/**
 * A price list as multipart/form-data (the file in "file"; mapping, effectiveFrom, dryRun as text
 * fields). No `body` here: the wrapper must not read the stream (lib/data/uploads.ts reads it).
 * Not Idempotency-Key based: the file's SHA-256 is what makes applying the same list twice a no-op.
 */
export const POST = route({}, async ({ user, params, req }) => {
  const outcome = await receivePriceList(user, idParam(params, "Supplier"), req, Object.fromEntries(req.nextUrl.searchParams));
  return new Reply(outcome.status, outcome.body);
});
