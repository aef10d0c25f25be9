import { csvResponse } from "@/lib/csv";
import { getPriceVariance, priceVarianceCsv } from "@/lib/data/price-variance";
import { fieldErrors, validation } from "@/lib/http/errors";
import { route } from "@/lib/http/route";
import { priceVarianceQuery } from "@/lib/validation/price-variance";

/**
 * Price variance per supplier and month: each delivered line's price per stock unit against its
 * order line and the price list on the day, with the value of the differences (JSON, or
 * ?format=csv for the rows). reports.read.
 */
export const GET = route({}, async ({ user, req }) => {
  const parsed = priceVarianceQuery.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!parsed.success) throw validation(fieldErrors(parsed.error));
  const report = await getPriceVariance(user, parsed.data);
  return parsed.data.format === "csv" ? csvResponse(priceVarianceCsv(report), `price-variance-${report.from}-to-${report.to}.csv`) : report;
});
