import { csvResponse } from "@/lib/csv";
import { lotTraceCsv, traceLot } from "@/lib/data/trace";
import { fieldErrors, validation } from "@/lib/http/errors";
import { idParam, route } from "@/lib/http/route";
import { traceQuery } from "@/lib/validation/batches";

/** A lot forward: the batches that used it (JSON, or ?format=csv for a recall). */
export const GET = route({}, async ({ user, params, req }) => {
  const parsed = traceQuery.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!parsed.success) throw validation(fieldErrors(parsed.error));
  const trace = await traceLot(user, idParam(params, "Lot"));
  return parsed.data.format === "csv" ? csvResponse(lotTraceCsv(trace), `lot-${trace.lot.code}-trace.csv`) : trace;
});
