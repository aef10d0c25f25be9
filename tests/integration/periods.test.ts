// Closing a period (issue 7) through its endpoints and the ledger's, against the real PostgreSQL:
// movements dated in a closed month are refused (409 PERIOD_CLOSED) whatever posts them; a reversal
// is dated when posted, so a correction lands in the open month; the current month cannot be
// closed; who may close, reopen (with a reason, audited) and read; months close in order and
// reopen from the latest back (common practice: periods close in sequence, so a closed month's
// opening stock cannot change under it); months are the company's (time zone); a close and
// postings racing it (never a movement in a closed month); tenancy.
import { randomUUID } from "node:crypto";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as batchProduce } from "../../app/api/batches/[id]/produce/route";
import { POST as batchCreate } from "../../app/api/batches/route";
import { POST as countsRoute } from "../../app/api/counts/route";
import { PATCH as linePatchRoute } from "../../app/api/deliveries/[id]/lines/[lineId]/route";
import { POST as deliveryPostRoute } from "../../app/api/deliveries/[id]/post/route";
import { POST as keyedRoute } from "../../app/api/deliveries/keyed/route";
import { POST as reverseRoute } from "../../app/api/movements/[id]/reverse/route";
import { POST as moveRoute } from "../../app/api/movements/route";
import { POST as closeRoute } from "../../app/api/periods/[month]/close/route";
import { POST as reopenRoute } from "../../app/api/periods/[month]/reopen/route";
import { GET as listRoute } from "../../app/api/periods/route";
import { POST as recipeCreate } from "../../app/api/recipes/route";
import { POST as fulfilRoute } from "../../app/api/transfer-requests/[id]/fulfil/route";
import { POST as askRoute } from "../../app/api/transfer-requests/route";
import { db } from "../../db/client";
import { ROLES } from "../../db/types";
import { postInTransaction } from "../../lib/data/ledger";
import { closePeriod } from "../../lib/data/periods";
import { lockPeriodsExclusive } from "../../lib/data/period-guard";
import { addMonths, monthLabel } from "../../lib/periods/months";
import { deliveryScenario } from "../support/deliveries";
import { createCompany, tag, type TestCompany } from "../support/factory";
import { call } from "../support/http";
import { currentUser, sessionCookieFor } from "../support/sessions";
import { createItem, ledgerMismatches, type TestItem } from "../support/stock";

interface Co {
  co: TestCompany;
  cookie: Record<string, string>;
  item: TestItem;
  /** the company's current month, in its time zone */
  current: string;
}

/** A company of its own (every test owns its months), a session per role and an untracked spice (g). */
async function company(timeZone = "Europe/London"): Promise<Co> {
  const co = await createCompany({ kitchens: 2, timeZone });
  const cookie: Record<string, string> = {};
  for (const role of ROLES) cookie[role] = await sessionCookieFor(co.users[role].id);
  const item = await createItem(co.company.id, { category: "spice" });
  const r = await db().raw<{ rows: { m: string }[] }>("select to_char(now() at time zone time_zone, 'YYYY-MM') as m from companies where id = ?", [co.company.id]);
  return { co, cookie, item, current: r.rows[0]!.m };
}

/** The 15th at noon UTC is inside the month in every time zone. */
const mid = (month: string, second = 0) => `${month}-15T12:00:${String(second).padStart(2, "0")}Z`;
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

const move = (c: Co, body: Record<string, unknown>, who = "manager") =>
  call(moveRoute, { path: "/api/movements", body: { kitchen: c.co.kitchens[0]!.code, item: c.item.sku, unit: "g", ...body }, cookie: c.cookie[who] });
const receipt = (c: Co, occurredAt: string | undefined, quantity = "1000", who = "manager") =>
  move(c, { kind: "receipt", quantity, lot: { unitCost: "0.01" }, ...(occurredAt ? { occurredAt } : {}) }, who);
const close = (c: Co, month: string, who = "accountant") =>
  call(closeRoute, { method: "POST", path: `/api/periods/${month}/close`, params: { month }, cookie: c.cookie[who] });
const reopen = (c: Co, month: string, body: unknown, who = "admin") =>
  call(reopenRoute, { path: `/api/periods/${month}/reopen`, params: { month }, body, cookie: c.cookie[who] });
const list = (c: Co, who = "accountant", query = "") => call(listRoute, { path: `/api/periods${query}`, cookie: c.cookie[who] });

/** The ids of the company's movements dated in `month` (in its time zone). */
async function movementsIn(c: Co, month: string): Promise<string[]> {
  const rows = await db()("stock_movements as m").join("companies as c", "c.id", "m.company_id")
    .where("m.company_id", c.co.company.id)
    .whereRaw("to_char(m.occurred_at at time zone c.time_zone, 'YYYY-MM') = ?", [month])
    .orderBy("m.id").pluck("m.id");
  return rows as string[];
}

/** The month (company's zone) a movement is dated in. */
async function monthOf(c: Co, movementId: string): Promise<string> {
  const r = await db().raw<{ rows: { m: string }[] }>(
    "select to_char(m.occurred_at at time zone c.time_zone, 'YYYY-MM') as m from stock_movements m join companies c on c.id = m.company_id where m.id = ?", [movementId]);
  return r.rows[0]!.m;
}

async function ok(res: { status: number; body: unknown }, status = 201) {
  expect(res.status, JSON.stringify(res.body)).toBe(status);
  return res.body as any;
}

function expectPeriodClosed(res: { status: number; body: any }, month: string, openFrom: string) {
  expect(res.status, JSON.stringify(res.body)).toBe(409);
  expect(res.body.error.code).toBe("PERIOD_CLOSED");
  expect(res.body.error.details.month).toBe(month);
  expect(res.body.error.message).toContain(`${monthLabel(month)} is closed`);
  expect(res.body.error.message).toContain(`Date the movement, or the correction, in ${monthLabel(openFrom)} or later`);
}

describe("a closed month", () => {
  it("refuses every kind of movement dated in it or before it; a reversal of one of its movements lands in the open month", async () => {
    const c = await company();
    const last = addMonths(c.current, -1);
    const r1 = (await ok(await receipt(c, mid(last)))).movements[0];
    const used = (await ok(await move(c, { kind: "use", quantity: "100", occurredAt: mid(last, 1) }))).movements[0];
    const before = await movementsIn(c, last);
    expect(before.sort()).toEqual([r1.id, used.id].sort());

    const closed = await ok(await close(c, last), 200);
    expect(closed).toMatchObject({ month: last, status: "closed", ended: true, closedBy: { id: c.co.users.accountant.id }, closedWith: null });

    const at = mid(last, 2);
    expectPeriodClosed(await receipt(c, at), last, c.current);
    expectPeriodClosed(await move(c, { kind: "use", quantity: "1", occurredAt: at }), last, c.current);
    expectPeriodClosed(await move(c, { kind: "waste", quantity: "1", reason: "Dropped", occurredAt: at }), last, c.current);
    expectPeriodClosed(await move(c, { kind: "adjustment", quantity: "5", occurredAt: at }), last, c.current);
    expectPeriodClosed(await move(c, { kind: "transfer", quantity: "1", toKitchen: c.co.kitchens[1]!.code, occurredAt: at }), last, c.current);
    expectPeriodClosed(await move(c, { kind: "count", quantity: "850", occurredAt: at }), last, c.current);
    // a month before the first closed one is closed with it: a movement there would change the stock the closed month began with
    const older = addMonths(c.current, -4);
    expectPeriodClosed(await receipt(c, mid(older)), older, c.current);
    // a count sheet dated in the closed month: refused whole, no count recorded
    const sheet = await call(countsRoute, {
      path: "/api/counts", cookie: c.cookie.manager,
      body: { kitchen: c.co.kitchens[0]!.code, countedAt: mid(last, 3), lines: [{ item: c.item.sku, counted: "850", unit: "g" }] },
    });
    expectPeriodClosed(sheet, last, c.current);
    expect(await db()("stock_counts").where({ company_id: c.co.company.id })).toHaveLength(0);
    expect((await movementsIn(c, last)).sort()).toEqual(before.sort());

    // the open month takes movements as before
    await ok(await move(c, { kind: "use", quantity: "50" }));
    // the correction of last month's use: a reversal, dated now, in the open month; last month keeps what it had
    const reversal = (await ok(await call(reverseRoute, { path: `/api/movements/${used.id}/reverse`, params: { id: used.id }, body: { reason: "Wrong batch" }, cookie: c.cookie.manager }))).movements[0];
    expect(reversal).toMatchObject({ reversesId: used.id, delta: "100" });
    expect(await monthOf(c, reversal.id)).toBe(c.current);
    expect((await movementsIn(c, last)).sort()).toEqual(before.sort());
    expect(await ledgerMismatches(c.co.company.id)).toEqual([]);
  });

  it("leaves deliveries, production and transfer requests alone: they are dated when posted, in the open month", async () => {
    const c = await company();
    const last = addMonths(c.current, -1);
    const [k1, k2] = c.co.kitchens as [TestCompany["kitchens"][0], TestCompany["kitchens"][0]];
    await ok(await receipt(c, mid(last), "5000"));
    await ok(await move(c, { kind: "receipt", kitchen: k2.code, quantity: "500", lot: { unitCost: "0.01" }, occurredAt: mid(last, 1) }));
    await ok(await close(c, last, "manager"), 200);

    // a delivery note keyed in and posted: its receipts are dated now
    const s = await deliveryScenario(c.co.company.id, k1.id, c.co.users.buyer.id);
    const keyed = await ok(await call(keyedRoute, {
      path: "/api/deliveries/keyed", cookie: c.cookie.buyer, idempotencyKey: randomUUID(),
      body: { supplier: s.supplierId, kitchen: k1.code, noteNumber: `DN-${tag()}`, lines: [{ sku: "PAP-1KG", quantity: "2", unitPrice: "12.50" }] },
    }));
    const lineId = keyed.lines[0].id;
    await ok(await call(linePatchRoute, { method: "PATCH", path: `/api/deliveries/${keyed.id}/lines/${lineId}`, params: { id: keyed.id, lineId }, cookie: c.cookie.buyer, body: { decision: "accept" } }), 200);
    await ok(await call(deliveryPostRoute, { method: "POST", path: `/api/deliveries/${keyed.id}/post`, params: { id: keyed.id }, cookie: c.cookie.buyer }), 200);
    const { posting_id: postingId } = await db()("deliveries").where({ id: keyed.id }).first("posting_id");
    const receipts = await db()("stock_movements").where({ company_id: c.co.company.id, posting_id: postingId });
    expect(receipts.length).toBeGreaterThan(0);
    for (const m of receipts) expect(await monthOf(c, m.id)).toBe(c.current);

    // a transfer request fulfilled: both legs dated now
    const asked = await ok(await call(askRoute, { path: "/api/transfer-requests", cookie: c.cookie.manager, body: { fromKitchen: k2.code, toKitchen: k1.code, item: c.item.sku, quantity: "100", unit: "g" } }));
    const fulfilled = await ok(await call(fulfilRoute, { path: `/api/transfer-requests/${asked.id}/fulfil`, params: { id: asked.id }, cookie: c.cookie.manager, body: {} }));
    expect(fulfilled.movements).toHaveLength(2);
    for (const m of fulfilled.movements) expect(await monthOf(c, m.id)).toBe(c.current);

    // a batch produced: its use movements are dated now
    const recipe = await ok(await call(recipeCreate, {
      path: "/api/recipes", cookie: c.cookie.manager,
      body: {
        code: `R${tag().slice(0, 8).toUpperCase()}`, name: "Plain pork", productClass: "comminuted", storage: "keep_refrigerated",
        meatBlock: [{ name: "Lean pork", percent: "100" }], lines: [{ item: c.item.sku, rate: "18", unit: "g/kg" }],
      },
    }));
    const today = (await db().raw<{ rows: { d: string }[] }>("select to_char((now() at time zone time_zone)::date, 'YYYY-MM-DD') as d from companies where id = ?", [c.co.company.id])).rows[0]!.d;
    const batch = await ok(await call(batchCreate, { path: "/api/batches", cookie: c.cookie.manager, body: { kitchen: k1.code, recipe: recipe.code, plannedFor: today, meatBlock: { quantity: "10", unit: "kg" } } }));
    await ok(await call(batchProduce, { path: `/api/batches/${batch.id}/produce`, params: { id: batch.id }, cookie: c.cookie.manager, body: { actualMeatBlock: { quantity: "10", unit: "kg" } } }), 200);
    const uses = await db()("stock_movements").where({ company_id: c.co.company.id, batch_id: batch.id });
    expect(uses.length).toBeGreaterThan(0);
    for (const m of uses) expect(await monthOf(c, m.id)).toBe(c.current);
    expect(await ledgerMismatches(c.co.company.id)).toEqual([]);
  });

  it("cannot be the current month or one still to come; a month is YYYY-MM", async () => {
    const c = await company();
    const now = await close(c, c.current);
    expect(now.status).toBe(422);
    expect(now.body.error.details.fields.month[0]).toContain(`${monthLabel(c.current)} has not ended yet`);
    const later = await close(c, addMonths(c.current, 2));
    expect(later.status).toBe(422);
    expect(later.body.error.details.fields.month[0]).toContain("still to come");
    for (const bad of ["2026-13", "2026-3", "march", "2026-03-01"]) {
      const res = await close(c, bad);
      expect(res.status, bad).toBe(422);
      expect(res.body.error.details.fields).toHaveProperty("month");
    }
    expect(await db()("accounting_periods").where({ company_id: c.co.company.id })).toHaveLength(0);
    expect(await db()("accounting_period_events").where({ company_id: c.co.company.id })).toHaveLength(0);
  });
});

describe("who may close, reopen and read", () => {
  it("accountants and managers close, buyers and kitchen leads may not; only an admin reopens, with a reason, on the audit trail", async () => {
    const c = await company();
    const last = addMonths(c.current, -1);
    await ok(await receipt(c, mid(last)));
    for (const who of ["buyer", "kitchen_lead"]) {
      expect((await close(c, last, who)).status, who).toBe(403);
      expect((await list(c, who)).status, who).toBe(403);
    }
    await ok(await list(c, "accountant"), 200);
    await ok(await close(c, last, "manager"), 200);

    for (const who of ["accountant", "manager", "buyer", "kitchen_lead"]) expect((await reopen(c, last, { reason: "Late invoice" }, who)).status, who).toBe(403);
    const noReason = await reopen(c, last, {});
    expect(noReason.status).toBe(422);
    expect(noReason.body.error.details.fields).toHaveProperty("reason");
    const blank = await reopen(c, last, { reason: "   " });
    expect(blank.status).toBe(422);
    expect(blank.body.error.details.fields).toHaveProperty("reason");
    expectPeriodClosed(await receipt(c, mid(last, 5)), last, c.current);

    const reopened = await ok(await reopen(c, last, { reason: "Supplier credit note booked late" }), 200);
    expect(reopened).toMatchObject({ month: last, status: "open", closedAt: null, closedBy: null });
    // posting into the month works again
    await ok(await receipt(c, mid(last, 6)));

    const events = await db()("accounting_period_events").where({ company_id: c.co.company.id }).orderBy("at");
    expect(events.map((e) => [e.action, e.user_id, e.reason])).toEqual([
      ["close", c.co.users.manager.id, null],
      ["reopen", c.co.users.admin.id, "Supplier credit note booked late"],
    ]);
    expect(await db()("accounting_periods").where({ company_id: c.co.company.id })).toHaveLength(0);

    await ok(await close(c, last, "accountant"), 200);
    const seen = await ok(await list(c, "manager"), 200);
    expect(seen.closedThrough).toBe(last);
    expect(seen.periods.find((p: { month: string }) => p.month === last)).toMatchObject({ status: "closed", closedBy: { id: c.co.users.accountant.id, name: expect.any(String) } });
    expect(seen.events.map((e: { action: string; user: { id: string } }) => [e.action, e.user.id])).toEqual([
      ["close", c.co.users.accountant.id],
      ["reopen", c.co.users.admin.id],
      ["close", c.co.users.manager.id],
    ]);
    // the audit trail is append-only
    await expect(db()("accounting_period_events").where({ company_id: c.co.company.id }).update({ reason: "changed" })).rejects.toThrow(/append-only/);
    await expect(db()("accounting_period_events").where({ company_id: c.co.company.id }).delete()).rejects.toThrow(/append-only/);
  });
});

describe("the order of closing", () => {
  it("closes months oldest first and reopens them latest first; a second close records nothing", async () => {
    const c = await company();
    const [m3, m2, m1] = [addMonths(c.current, -3), addMonths(c.current, -2), addMonths(c.current, -1)];
    await ok(await receipt(c, mid(m3)));

    const early = await close(c, m1);
    expect(early.status).toBe(409);
    expect(early.body.error).toMatchObject({ code: "EARLIER_PERIOD_OPEN", details: { month: m3 } });
    expect((await ok(await list(c), 200)).nextToClose).toBe(m3);
    await ok(await close(c, m3), 200);
    const gap = await close(c, m1);
    expect(gap.body.error).toMatchObject({ code: "EARLIER_PERIOD_OPEN", details: { month: m2 } });
    await ok(await close(c, m2), 200);
    await ok(await close(c, m1), 200);

    const again = await close(c, m2, "manager");
    expect(again.status).toBe(409);
    expect(again.body.error).toMatchObject({ code: "PERIOD_ALREADY_CLOSED", details: { month: m2 } });
    expect(await db()("accounting_period_events").where({ company_id: c.co.company.id })).toHaveLength(3);

    const backwards = await reopen(c, m3, { reason: "Recount" });
    expect(backwards.status).toBe(409);
    expect(backwards.body.error).toMatchObject({ code: "LATER_PERIOD_CLOSED", details: { month: m1 } });
    const notClosed = await reopen(c, c.current, { reason: "Recount" });
    expect(notClosed.body.error.code).toBe("PERIOD_NOT_CLOSED");
    await ok(await reopen(c, m1, { reason: "Recount" }), 200);

    const l = await ok(await list(c), 200);
    expect(l).toMatchObject({ currentMonth: c.current, closedThrough: m2, nextToClose: m1, timeZone: "Europe/London" });
    expect(l.periods.map((p: { month: string; status: string }) => [p.month, p.status]).slice(0, 4)).toEqual([
      [c.current, "open"], [m1, "open"], [m2, "closed"], [m3, "closed"],
    ]);
    expect(l.periods).toHaveLength(12);
    expect(l.periods[0].ended).toBe(false);
    expect(l.events.map((e: { action: string; month: string }) => `${e.action} ${e.month}`)).toEqual([`reopen ${m1}`, `close ${m1}`, `close ${m2}`, `close ${m3}`]);
    const range = await ok(await list(c, "accountant", `?from=${m3}&to=${m2}`), 200);
    expect(range.periods.map((p: { month: string }) => p.month)).toEqual([m2, m3]);
    expect((await list(c, "accountant", `?from=${m1}&to=${m3}`)).status).toBe(422);
    expect((await list(c, "accountant", "?from=2026-3")).status).toBe(422);
  });

  it("in a company without movements, closes the month asked and the empty months before it with it", async () => {
    const c = await company();
    const last = addMonths(c.current, -1);
    await ok(await close(c, last), 200);
    const l = await ok(await list(c), 200);
    const older = addMonths(c.current, -5);
    expect(l.periods.find((p: { month: string }) => p.month === older)).toMatchObject({ status: "closed", closedAt: null, closedWith: last });
    expectPeriodClosed(await receipt(c, mid(older)), older, c.current);
    const before = await close(c, older);
    expect(before.body.error.code).toBe("PERIOD_ALREADY_CLOSED");
  });
});

describe("months are the company's", () => {
  it("follow its time zone: in Auckland a minute after local midnight on the 1st is the new month, a minute before is the closed one", async () => {
    const c = await company("Pacific/Auckland");
    const last = addMonths(c.current, -1);
    await ok(await receipt(c, mid(last)));
    await ok(await close(c, last), 200);
    // the instant the current month began in Auckland (UTC+12 or +13): still the previous day in UTC
    const start = (await db().raw<{ rows: { at: Date }[] }>("select (?::timestamp at time zone 'Pacific/Auckland') as at", [`${c.current}-01 00:00:00`])).rows[0]!.at;
    const after = new Date(Math.min(start.getTime() + 60_000, Date.now()));
    const before = new Date(start.getTime() - 60_000);
    expect(after.toISOString().slice(0, 7)).toBe(last); // in UTC, the closed month
    const inNew = (await ok(await receipt(c, after.toISOString()))).movements[0];
    expect(await monthOf(c, inNew.id)).toBe(c.current);
    expectPeriodClosed(await receipt(c, before.toISOString()), last, c.current);
  });
});

describe("a close and postings at the same time", () => {
  it("a close waits for a posting under way, which stays in the closed month; a posting waits for a close under way and is refused", async () => {
    const c = await company();
    const last = addMonths(c.current, -1);
    await ok(await receipt(c, mid(last)));
    const manager = await currentUser(c.co.users.manager.id);
    const accountant = await currentUser(c.co.users.accountant.id);

    let inFlight: string[] = [];
    let closing!: Promise<unknown>;
    let closeSettled = false;
    await db().transaction(async (trx) => {
      const rows = await postInTransaction(trx, manager, {
        kind: "receipt", kitchen: c.co.kitchens[0]!.code, item: c.item.sku, quantity: "10", unit: "g", lot: { unitCost: "0.01" }, occurredAt: mid(last, 7),
      }, randomUUID());
      inFlight = rows.map((r) => r.id);
      closing = closePeriod(accountant, last).finally(() => { closeSettled = true; });
      await sleep(500);
      expect(closeSettled, "the close waits for the posting's transaction").toBe(false);
    });
    await closing;
    const closedAt = (await db()("accounting_periods").where({ company_id: c.co.company.id }).first("closed_at")).closed_at as Date;
    const m = await db()("stock_movements").whereIn("id", inFlight).first("recorded_at");
    expect(m.recorded_at.getTime()).toBeLessThan(closedAt.getTime());
    expect(await movementsIn(c, last)).toEqual(expect.arrayContaining(inFlight));

    // now the other way: a close under way (its lock taken, its row written, not yet committed)
    await ok(await reopen(c, last, { reason: "Second test" }), 200);
    let posting!: Promise<{ status: number; body: any }>;
    let postSettled = false;
    await db().transaction(async (trx) => {
      await lockPeriodsExclusive(trx, c.co.company.id);
      await trx("accounting_periods").insert({ company_id: c.co.company.id, month: `${last}-01`, closed_by: c.co.users.admin.id });
      posting = receipt(c, mid(last, 8)).finally(() => { postSettled = true; });
      await sleep(500);
      expect(postSettled, "the posting waits for the close's transaction").toBe(false);
    });
    expectPeriodClosed(await posting, last, c.current);
  });

  it("20 postings dated in the month racing its close: each either committed before the close or got 409, never one in the closed month after it", async () => {
    const c = await company();
    const last = addMonths(c.current, -1);
    const setup = (await ok(await receipt(c, mid(last)))).movements[0].id as string;
    const send = (i: number) => receipt(c, mid(last, 10 + i), "5");
    const first = Array.from({ length: 10 }, (_, i) => send(i));
    const closing = close(c, last);
    const second = Array.from({ length: 10 }, (_, i) => send(10 + i));
    const results = await Promise.all([...first, ...second]);
    await ok(await closing, 200);

    const committed: string[] = [];
    let refused = 0;
    for (const r of results) {
      if (r.status === 201) committed.push(r.body.movements[0].id);
      else {
        expect(r.status, JSON.stringify(r.body)).toBe(409);
        expect(r.body.error).toMatchObject({ code: "PERIOD_CLOSED", details: { month: last } });
        refused++;
      }
    }
    expect(committed.length + refused).toBe(20);
    console.log(`[periods race] ${committed.length} committed before the close, ${refused} refused`);
    // the month holds exactly what committed, and all of it was recorded before the close
    expect((await movementsIn(c, last)).sort()).toEqual([setup, ...committed].sort());
    const closedAt = (await db()("accounting_periods").where({ company_id: c.co.company.id }).first("closed_at")).closed_at as Date;
    const late = await db()("stock_movements").where({ company_id: c.co.company.id }).where("recorded_at", ">=", closedAt).whereIn("id", [setup, ...committed]);
    expect(late).toEqual([]);
    // and nothing gets in afterwards
    expectPeriodClosed(await send(40), last, c.current);
    expect(await ledgerMismatches(c.co.company.id)).toEqual([]);
  });
});

describe("tenancy", () => {
  let a: Co;
  let b: Co;
  beforeAll(async () => {
    [a, b] = await Promise.all([company(), company()]);
  });

  it("another company's months are its own", async () => {
    const last = addMonths(a.current, -1);
    await ok(await receipt(a, mid(last)));
    await ok(await close(a, last), 200);
    // b: nothing closed, postings in that month go through, and a's close is not in b's list
    await ok(await receipt(b, mid(last)));
    const seen = await ok(await list(b), 200);
    expect(seen.closedThrough).toBeNull();
    expect(seen.events).toEqual([]);
    expect(seen.periods.every((p: { status: string }) => p.status === "open")).toBe(true);
    // b's admin cannot reopen a's month: in b's company it is simply not closed
    const r = await reopen(b, last, { reason: "Not mine" });
    expect(r.body.error.code).toBe("PERIOD_NOT_CLOSED");
    expectPeriodClosed(await receipt(a, mid(last, 1)), last, a.current);
    // b closing its own month leaves a's trail alone
    await ok(await close(b, last), 200);
    expect((await ok(await list(a), 200)).events).toHaveLength(1);
  });
});
