import { csvResponse } from "@/lib/csv";
import { postMovement } from "@/lib/data/ledger";
import { listMovements, movementsCsv } from "@/lib/data/movements";
import { fieldErrors, validation } from "@/lib/http/errors";
import { Reply, route } from "@/lib/http/route";
import { movementInput } from "@/lib/validation/movements";
import { movementsQuery } from "@/lib/validation/stock";

export const GET = route({}, async ({ user, req }) => {
  const parsed = movementsQuery.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!parsed.success) throw validation(fieldErrors(parsed.error));
  const page = await listMovements(user, parsed.data);
  if (parsed.data.format === "csv") {
    return csvResponse(movementsCsv(page.movements), "movements.csv", page.nextCursor ? { "x-next-cursor": page.nextCursor } : {});
  }
  return page;
});

/** One movement request -> one movement per lot (and kitchen) touched. */
export const POST = route({ body: movementInput, idempotent: true }, async ({ user, body }) =>
  new Reply(201, { movements: await postMovement(user, body) }));
