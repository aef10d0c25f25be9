import { assertCan } from "@/lib/auth/assert";
import { csvResponse } from "@/lib/csv";
import { valuationCsv, valuationReport, valuationXlsx } from "@/lib/data/reports";
import { xlsxResponse } from "@/lib/reports/xlsx";
import { fieldErrors, validation } from "@/lib/http/errors";
import { route } from "@/lib/http/route";
import { valuationQuery } from "@/lib/validation/reports";

/** Stock on hand and its value at the end of a day (JSON, or ?format=csv or xlsx). */
export const GET = route({}, async ({ user, req }) => {
  const parsed = valuationQuery.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!parsed.success) throw validation(fieldErrors(parsed.error));
  const report = await valuationReport(user, parsed.data);
  if (parsed.data.format === "json") return report;
  assertCan(user, "reports.export");
  const name = `valuation-${report.asOf}${report.kitchen ? `-${report.kitchen.code}` : ""}`;
  if (parsed.data.format === "xlsx") return xlsxResponse(await valuationXlsx(report), `${name}.xlsx`);
  return csvResponse(valuationCsv(report, parsed.data.bom), `${name}.csv`);
});
