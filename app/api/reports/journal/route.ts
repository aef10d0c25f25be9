import { csvResponse } from "@/lib/csv";
import { journal, journalCsv } from "@/lib/data/journal";
import { fieldErrors, validation } from "@/lib/http/errors";
import { route } from "@/lib/http/route";
import { journalQuery } from "@/lib/validation/journal";

/** The movement journal with account codes (JSON, or ?format=csv: one line per journal line). */
export const GET = route({}, async ({ user, req }) => {
  const parsed = journalQuery.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!parsed.success) throw validation(fieldErrors(parsed.error));
  const j = await journal(user, parsed.data);
  if (parsed.data.format !== "csv") return j;
  const where = j.kitchen ? `-${j.kitchen.code}` : "";
  return csvResponse(journalCsv(j, parsed.data.bom), `journal-${j.from}-to-${j.to}${where}.csv`);
});
