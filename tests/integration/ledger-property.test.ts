// Property: whatever sequence of postings and reversals is thrown at the ledger (including ones it
// refuses), every balance equals the sum of its movements and none is negative. fast-check
// generates the sequences; refused requests (409/422) are part of the property, not failures.
import fc from "fast-check";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "../../db/client";
import type { CurrentUser } from "../../lib/auth/current-user";
import { postMovement, reverseMovement } from "../../lib/data/ledger";
import { AppError } from "../../lib/http/errors";
import { createCompany, type TestCompany } from "../support/factory";
import { currentUser } from "../support/sessions";
import { createItem, ledgerMismatches } from "../support/stock";

let co: TestCompany;
let manager: CurrentUser;
beforeAll(async () => {
  co = await createCompany({ kitchens: 2 });
  manager = await currentUser(co.users.manager.id);
});

const qty = fc.tuple(fc.integer({ min: 0, max: 400 }), fc.integer({ min: 0, max: 999 })).map(([i, f]) => `${i}.${String(f).padStart(3, "0")}`);
const kitchen = fc.integer({ min: 0, max: 1 });
const item = fc.integer({ min: 0, max: 1 });
const command = fc.oneof(
  fc.record({ op: fc.constant("receipt" as const), k: kitchen, i: item, q: qty, days: fc.integer({ min: -5, max: 60 }) }),
  fc.record({ op: fc.constantFrom("use" as const, "waste" as const), k: kitchen, i: item, q: qty }),
  fc.record({ op: fc.constant("transfer" as const), k: kitchen, i: item, q: qty }),
  fc.record({ op: fc.constant("adjustment" as const), k: kitchen, i: item, q: qty, negative: fc.boolean() }),
  fc.record({ op: fc.constant("count" as const), k: kitchen, q: qty }),
  fc.record({ op: fc.constant("reverse" as const), pick: fc.nat() }),
);

describe("ledger invariant", () => {
  it("balances equal the sum of movements after any sequence of postings and reversals", async () => {
    await fc.assert(
      fc.asyncProperty(fc.array(command, { minLength: 1, maxLength: 14 }), async (commands) => {
        // fresh items per run: one dated and lot-tracked, one plain (counted without naming a lot)
        const items = [await createItem(co.company.id, { trackLots: true, trackDates: true }), await createItem(co.company.id)];
        const posted: string[] = [];
        let refused = 0;
        for (const c of commands) {
          const k = c.op === "reverse" ? "" : co.kitchens[c.k]!.code;
          try {
            let out;
            switch (c.op) {
              case "receipt": {
                const date = new Date(Date.now() + c.days * 86400_000).toISOString().slice(0, 10);
                const lot = c.i === 0 ? { code: `L${posted.length}-${Math.random().toString(36).slice(2, 8)}`, date, dateKind: "best_before" as const, unitCost: "0.01" } : { unitCost: "0.01" };
                out = await postMovement(manager, { kind: "receipt", kitchen: k, item: items[c.i]!.sku, quantity: c.q, unit: "g", lot });
                break;
              }
              case "use":
              case "waste":
                out = await postMovement(manager, { kind: c.op, kitchen: k, item: items[c.i]!.sku, quantity: c.q, unit: "g", reason: "property test" });
                break;
              case "transfer":
                out = await postMovement(manager, { kind: "transfer", kitchen: k, toKitchen: co.kitchens[1 - c.k]!.code, item: items[c.i]!.sku, quantity: c.q, unit: "g" });
                break;
              case "adjustment":
                out = await postMovement(manager, { kind: "adjustment", kitchen: k, item: items[c.i]!.sku, quantity: `${c.negative ? "-" : ""}${c.q}`, unit: "g" });
                break;
              case "count":
                out = await postMovement(manager, { kind: "count", kitchen: k, item: items[1]!.sku, quantity: c.q, unit: "g" });
                break;
              case "reverse":
                if (posted.length === 0) continue;
                out = await reverseMovement(manager, posted[c.pick % posted.length]!);
                break;
            }
            posted.push(...out.map((m) => m.id));
          } catch (e) {
            if (!(e instanceof AppError) || (e.status !== 409 && e.status !== 422)) throw e;
            refused++;
          }
        }
        expect(await ledgerMismatches(co.company.id)).toEqual([]);
        const negative = await db()("stock_balances").where({ company_id: co.company.id }).where("on_hand", "<", 0);
        expect(negative).toEqual([]);
        return refused >= 0;
      }),
      { numRuns: 40 },
    );
  });
});
