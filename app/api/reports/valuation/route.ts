import { csvResponse } from "@/lib/csv";
import { valuationCsv, valuationReport } from "@/lib/data/reports";
import { fieldErrors, validation } from "@/lib/http/errors";
import { route } from "@/lib/http/route";
import { valuationQuery } from "@/lib/validation/reports";

/** Stock on hand and its value at the end of a day (JSON, or ?format=csv). */
export const GET = route({}, async ({ user, req }) => {
  const parsed = valuationQuery.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!parsed.success) throw validation(fieldErrors(parsed.error));
  const report = await valuationReport(user, parsed.data);
  if (parsed.data.format !== "csv") return report;
  const where = report.kitchen ? `-${report.kitchen.code}` : "";
  return csvResponse(valuationCsv(report, parsed.data.bom), `valuation-${report.asOf}${where}.csv`);
});
