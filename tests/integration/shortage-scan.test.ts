// The shortage scan against the real database with an injected clock. Batches are planned through
// the API; the alert's lines are compared with what the batch sheet's API (GET /api/batches/:id)
// says for the same batch, since the scan reads the planner's own description
// (lib/planning/describe-batches.ts). Recipe rates are plain arithmetic: 18 g of salt per kg of
// meat block, so 10 kg takes 180 g; 2.5 g/kg of cure, 25 g. The window is the scan's documented
// choice: today and the six days after it. Open / cleared / episode: the rule (the same
// scan run twice makes none new; a need that cleared and comes back is a new alert).
import { addDays, formatISO } from "date-fns";
import { UnrecoverableError } from "bullmq";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as cancelRoute } from "../../app/api/batches/[id]/cancel/route";
import { POST as produceRoute } from "../../app/api/batches/[id]/produce/route";
import { GET as batchGet, PATCH as batchPatch } from "../../app/api/batches/[id]/route";
import { POST as batchCreate } from "../../app/api/batches/route";
import { GET as alertsRoute } from "../../app/api/alerts/route";
import { POST as recipeCreate } from "../../app/api/recipes/route";
import { db } from "../../db/client";
import { REORDER_SCAN_JOB } from "../../jobs/definitions/reorder-scan";
import { SCANS } from "../../jobs/definitions/scans";
import { runShortageScan, SHORTAGE_SCAN_JOB, SHORTAGE_WINDOW_DAYS, shortageScanPayload } from "../../jobs/definitions/shortage-scan";
import { CURE_CAUTION } from "../../lib/cure/caution";
import { postMovement } from "../../lib/data/ledger";
import { createCompany, tag, type TestCompany } from "../support/factory";
import { call } from "../support/http";
import { currentUser, sessionCookieFor } from "../support/sessions";
import { createItem, type TestItem } from "../support/stock";

// the injected clock: noon UTC today, so the company's local date (Europe/London) is today
const NOW = new Date(`${new Date().toISOString().slice(0, 10)}T12:00:00Z`);
const later = (hours: number) => new Date(NOW.getTime() + hours * 3600_000);
const day = (n: number) => formatISO(addDays(NOW, n), { representation: "date" });

let co: TestCompany;
let cookie: string;
let salt: TestItem;
let cure: TestItem;
let pepper: TestItem;
let saltRecipe: string;
let cureRecipe: string;
let pepperRecipe: string;

async function ok<T = any>(p: Promise<{ status: number; body: T }>, status = 201): Promise<T> {
  const r = await p;
  expect(r.status, JSON.stringify(r.body)).toBe(status);
  return r.body;
}

async function move(kind: "receipt" | "use", k: number, it: TestItem, grams: string, dated = false) {
  const manager = await currentUser(co.users.manager.id);
  await postMovement(manager, {
    kind, kitchen: co.kitchens[k]!.code, item: it.sku, quantity: grams, unit: "g",
    ...(kind === "receipt" ? { lot: { code: `L-${tag()}`, unitCost: "0.01", ...(dated ? { date: day(300), dateKind: "best_before" } : {}) } } : {}),
  } as never);
}

async function recipe(it: TestItem, rate: string): Promise<string> {
  const r = await ok(call(recipeCreate, {
    path: "/api/recipes", cookie, body: {
      code: `R${tag().slice(0, 8).toUpperCase()}`, name: `Farmhouse ${tag().slice(0, 4)}`, productClass: "comminuted", storage: "keep_refrigerated",
      meatBlock: [{ name: "Lean pork", percent: "70" }, { name: "Back fat", percent: "30" }], lines: [{ item: it.sku, rate, unit: "g/kg" }],
    },
  }));
  return r.code as string;
}

async function plan(k: number, code: string, plannedFor: string): Promise<string> {
  const b = await ok(call(batchCreate, { path: "/api/batches", cookie, body: { kitchen: co.kitchens[k]!.code, recipe: code, plannedFor, meatBlock: { quantity: "10", unit: "kg" } } }));
  return b.id as string;
}

const shortageAlerts = (companyId: string) =>
  db()("alerts").where({ company_id: companyId, kind: "shortage" }).orderBy([{ column: "subject_id" }, { column: "episode" }]);
const run = (at: Date = NOW) => runShortageScan(db(), { companyId: co.company.id }, at);

beforeAll(async () => {
  co = await createCompany({ kitchens: 2 });
  // marked as scanned just now: the catch-up runs other test files enqueue leave this company to the injected clock
  await db()("job_runs").insert([REORDER_SCAN_JOB, SHORTAGE_SCAN_JOB].map((job) => ({ company_id: co.company.id, job, last_run_at: new Date(), last_result: "{}" })));
  cookie = await sessionCookieFor(co.users.manager.id);
  salt = await createItem(co.company.id, { category: "ingredient", trackLots: false });
  pepper = await createItem(co.company.id, { category: "spice", trackLots: false });
  cure = await createItem(co.company.id, { category: "cure" });
  [saltRecipe, cureRecipe, pepperRecipe] = [await recipe(salt, "18"), await recipe(cure, "2.5"), await recipe(pepper, "18")];
});

describe("runShortageScan", () => {
  const ids = {} as Record<"salty" | "cured" | "later" | "cancelled" | "covered" | "produced", string>;

  it("raises one alert per open batch of the next 7 days that cannot be covered, with the planner's own figures; none for later, cancelled or produced batches", async () => {
    await move("receipt", 0, salt, "100");
    await move("receipt", 1, salt, "500");
    await move("receipt", 1, cure, "1000", true);
    await move("receipt", 1, pepper, "180");
    ids.salty = await plan(0, saltRecipe, day(2)); // 180 g of salt, 100 g in the kitchen: 80 short
    ids.cured = await plan(0, cureRecipe, day(1)); // 25 g of cure, none in the kitchen: 25 short
    ids.later = await plan(0, saltRecipe, day(SHORTAGE_WINDOW_DAYS)); // short too, but a day past the window
    ids.cancelled = await plan(0, saltRecipe, day(3));
    await ok(call(cancelRoute, { path: `/api/batches/${ids.cancelled}/cancel`, method: "POST", params: { id: ids.cancelled }, cookie }), 200);
    ids.covered = await plan(1, saltRecipe, day(5)); // 180 of 500 g in the second kitchen
    ids.produced = await plan(1, pepperRecipe, day(4)); // uses all 180 g of pepper: the kitchen then has none
    await ok(call(produceRoute, { path: `/api/batches/${ids.produced}/produce`, params: { id: ids.produced }, cookie, body: { actualMeatBlock: { quantity: "10", unit: "kg" } } }), 200);

    // two runs at once: each batch still gets one alert
    const runs = await Promise.all([run(), run(), run()]);
    expect(runs.reduce((n, r) => n + (r.status === "done" ? r.created : 0), 0)).toBe(2);
    expect(runs[0]).toMatchObject({ status: "done", today: day(0), until: day(SHORTAGE_WINDOW_DAYS - 1), batchesChecked: 3, short: 2 }); // salty, cured, covered

    const rows = await shortageAlerts(co.company.id);
    expect(rows.map((r) => r.subject_id).sort()).toEqual([ids.salty, ids.cured].sort());
    for (const r of rows) expect(r).toMatchObject({ subject_type: "batch", kitchen_id: co.kitchens[0]!.id, threshold_days: 0, episode: 0, cleared_at: null });
    const salty = rows.find((r) => r.subject_id === ids.salty)!;
    expect(salty.data).toMatchObject({ batchId: ids.salty, recipeCode: saltRecipe, plannedFor: day(2), status: "planned", kitchenName: co.kitchens[0]!.name, categories: ["ingredient"] });
    expect(salty.data.lines).toEqual([expect.objectContaining({ itemId: salt.id, sku: salt.sku, unit: "g", quantity: "180", available: "100", reserved: "0", short: "80" })]);
    expect(salty.title).toContain(`on ${day(2)} in ${co.kitchens[0]!.name}: short of 1 item`);
    expect(salty.detail).toContain("short 80 g (needs 180 g, 100 g usable in the kitchen)");
    const cured = rows.find((r) => r.subject_id === ids.cured)!;
    expect(cured.data).toMatchObject({ categories: ["cure"] });
    expect(cured.data.lines).toEqual([expect.objectContaining({ itemId: cure.id, quantity: "25", available: "0", short: "25" })]);

    // the batch sheet's API says the same for the same batch
    for (const r of [salty, cured]) {
      const sheet = await ok(call(batchGet, { path: `/api/batches/${r.subject_id}`, params: { id: r.subject_id }, cookie }), 200);
      const short = sheet.lines.filter((l: { short: string | null }) => l.short !== null);
      expect(r.data.lines.map((l: Record<string, unknown>) => [l.position, l.quantity, l.reserved, l.available, l.plannedBefore, l.short])).toEqual(
        short.map((l: Record<string, unknown>) => [l.position, l.quantity, l.reserved, l.available, l.plannedBefore, l.short]),
      );
      expect(r.data.lines.map((l: { suggestions: unknown }) => l.suggestions)).toEqual(
        short.map((l: { suggestions: { kind: string; kitchen?: { code: string }; quantity: string }[] }) =>
          l.suggestions.map((s) => (s.kind === "transfer" ? { kind: s.kind, kitchenCode: s.kitchen!.code, quantity: s.quantity } : s))),
      );
    }
    // the second kitchen has 1000 g of cure and nothing planned for it: the 25 g can come from there
    expect(cured.data.lines[0].suggestions).toEqual([{ kind: "transfer", kitchenCode: co.kitchens[1]!.code, quantity: "25" }]);

    // in the list: the cure shortage carries the cure caution, the salt one does not
    const list = await ok(call(alertsRoute, { path: "/api/alerts?kind=shortage", cookie }), 200);
    expect(list.alerts.find((a: { subjectId: string }) => a.subjectId === ids.cured)).toMatchObject({ caution: CURE_CAUTION, subjectType: "batch" });
    expect(list.alerts.find((a: { subjectId: string }) => a.subjectId === ids.salty).caution).toBeNull();

    // run again: nothing new
    expect(await run(later(1))).toMatchObject({ short: 2, created: 0, cleared: 0 });
    expect(await shortageAlerts(co.company.id)).toHaveLength(2);
    const jr = await db()("job_runs").where({ company_id: co.company.id, job: SHORTAGE_SCAN_JOB }).first();
    expect(jr.last_run_at.toISOString()).toBe(later(1).toISOString());
  });

  it("clears when the batch is covered; a return is a new alert (episode 1); moving or cancelling clears too", async () => {
    await move("receipt", 0, salt, "80"); // 180 g: covered
    expect(await run(later(2))).toMatchObject({ created: 0, cleared: 1 });
    let salty = await db()("alerts").where({ company_id: co.company.id, kind: "shortage", subject_id: ids.salty }).orderBy("episode");
    expect(salty.map((r) => r.cleared_at?.toISOString() ?? null)).toEqual([later(2).toISOString()]);
    expect(await run(later(3))).toMatchObject({ created: 0, cleared: 0 });

    await move("use", 0, salt, "50"); // 130 g: 50 short again
    expect(await run(later(4))).toMatchObject({ created: 1, cleared: 0 });
    salty = await db()("alerts").where({ company_id: co.company.id, kind: "shortage", subject_id: ids.salty }).orderBy("episode");
    expect(salty.map((r) => [r.episode, r.cleared_at === null, r.data.lines[0].short])).toEqual([[0, false, "80"], [1, true, "50"]]);

    // moved past the window: cleared
    await ok(call(batchPatch, { method: "PATCH", path: `/api/batches/${ids.salty}`, params: { id: ids.salty }, cookie, body: { plannedFor: day(9) } }), 200);
    // cancelled: cleared
    await ok(call(cancelRoute, { path: `/api/batches/${ids.cured}/cancel`, method: "POST", params: { id: ids.cured }, cookie }), 200);
    expect(await run(later(5))).toMatchObject({ short: 0, created: 0, cleared: 2 });
    const open = await db()("alerts").where({ company_id: co.company.id, kind: "shortage" }).whereNull("cleared_at");
    expect(open).toHaveLength(0);
  });

  it("follows the clock: six days on, the batch a week out is inside the window", async () => {
    // today + 6: the window runs to today + 12; the batch planned a week out (still short: 130 g of
    // salt left in the kitchen, the moved batch planned after it) now gets its alert
    const r = await run(later(6 * 24));
    expect(r).toMatchObject({ status: "done", today: day(6), until: day(12) });
    const open = await db()("alerts").where({ company_id: co.company.id, kind: "shortage" }).whereNull("cleared_at").orderBy("subject_id");
    expect(open.map((a) => a.subject_id).sort()).toEqual([ids.later, ids.salty].sort());
    const lateAlert = open.find((a) => a.subject_id === ids.later)!;
    expect(lateAlert.data.lines[0]).toMatchObject({ quantity: "180", available: "130", short: "50" });
  });

  it("refuses a bad payload as unrecoverable and finishes for a deleted company", async () => {
    await expect(runShortageScan(db(), { companyId: 42 }, NOW)).rejects.toBeInstanceOf(UnrecoverableError);
    expect(() => shortageScanPayload(undefined)).toThrow(UnrecoverableError);
    expect(await runShortageScan(db(), { companyId: crypto.randomUUID() }, NOW)).toEqual({ status: "company-gone" });
  });

  it("is registered: daily at 05:30 in the company's time zone", () => {
    expect(SCANS.find((s) => s.name === SHORTAGE_SCAN_JOB)).toMatchObject({ cron: "30 5 * * *", periodMs: 24 * 3600_000, run: runShortageScan });
  });
});
