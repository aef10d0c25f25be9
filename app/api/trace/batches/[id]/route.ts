import { csvResponse } from "@/lib/csv";
import { batchTraceCsv, traceBatch } from "@/lib/data/trace";
import { fieldErrors, validation } from "@/lib/http/errors";
import { idParam, route } from "@/lib/http/route";
import { traceQuery } from "@/lib/validation/batches";

/** A batch back: every lot it used (JSON, or ?format=csv for a recall). */
export const GET = route({}, async ({ user, params, req }) => {
  const parsed = traceQuery.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!parsed.success) throw validation(fieldErrors(parsed.error));
  const trace = await traceBatch(user, idParam(params, "Batch"));
  return parsed.data.format === "csv" ? csvResponse(batchTraceCsv(trace), `batch-${trace.batch.batchCode}-trace.csv`) : trace;
});
