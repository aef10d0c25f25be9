import { csvResponse } from "@/lib/csv";
import { usageCsv, usageReport } from "@/lib/data/reports";
import { fieldErrors, validation } from "@/lib/http/errors";
import { route } from "@/lib/http/route";
import { usageQuery } from "@/lib/validation/reports";

/** Usage and cost by month (JSON, or ?format=csv). */
export const GET = route({}, async ({ user, req }) => {
  const parsed = usageQuery.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!parsed.success) throw validation(fieldErrors(parsed.error));
  const report = await usageReport(user, parsed.data);
  if (parsed.data.format !== "csv") return report;
  const where = report.kitchen ? `-${report.kitchen.code}` : "";
  return csvResponse(usageCsv(report, parsed.data.bom), `usage-${report.from}-to-${report.to}-by-${report.groupBy}${where}.csv`);
});
