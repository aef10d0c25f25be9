import { assertCan } from "@/lib/auth/assert";
import { csvResponse } from "@/lib/csv";
import { usageCsv, usageReport, usageXlsx } from "@/lib/data/reports";
import { xlsxResponse } from "@/lib/reports/xlsx";
import { fieldErrors, validation } from "@/lib/http/errors";
import { route } from "@/lib/http/route";
import { usageQuery } from "@/lib/validation/reports";

/** Usage and cost by month (JSON, or ?format=csv or xlsx). */
export const GET = route({}, async ({ user, req }) => {
  const parsed = usageQuery.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!parsed.success) throw validation(fieldErrors(parsed.error));
  const report = await usageReport(user, parsed.data);
  if (parsed.data.format === "json") return report;
  assertCan(user, "reports.export");
  const name = `usage-${report.from}-to-${report.to}-by-${report.groupBy}${report.kitchen ? `-${report.kitchen.code}` : ""}`;
  if (parsed.data.format === "xlsx") return xlsxResponse(await usageXlsx(report), `${name}.xlsx`);
  return csvResponse(usageCsv(report, parsed.data.bom), `${name}.csv`);
});
