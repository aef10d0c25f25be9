// GET /api/alerts, POST /api/alerts/:id/ack and /snooze: who sees which kitchen's alerts, per-user
// acknowledgement and snooze, validation, tenancy. Alerts come from the real expiry scan.
import { addDays, formatISO } from "date-fns";
import { beforeAll, describe, expect, it } from "vitest";
import { GET as listRoute } from "../../app/api/alerts/route";
import { POST as ackRoute } from "../../app/api/alerts/[id]/ack/route";
import { POST as snoozeRoute } from "../../app/api/alerts/[id]/snooze/route";
import { db } from "../../db/client";
import { runExpiryScan } from "../../jobs/definitions/expiry-scan";
import { lastExpiryScan } from "../../lib/data/alerts";
import { CURE_CAUTION } from "../../lib/cure/caution";
import { postMovement } from "../../lib/data/ledger";
import { call } from "../support/http";
import { createCompany, tag, type TestCompany } from "../support/factory";
import { currentUser, sessionCookieFor } from "../support/sessions";
import { createItem } from "../support/stock";

async function receiveLot(co: TestCompany, kitchenIndex: number, category: "cure" | "spice", daysOut: number) {
  const item = await createItem(co.company.id, { category, trackLots: true, trackDates: true });
  const [m] = await postMovement(await currentUser(co.users.manager.id), {
    kind: "receipt", kitchen: co.kitchens[kitchenIndex]!.code, item: item.sku, quantity: "100", unit: "g",
    lot: { code: `L-${tag()}`, date: formatISO(addDays(new Date(), daysOut), { representation: "date" }), dateKind: "use_by", unitCost: "0.01" },
  } as never);
  return m!.lot.id as string;
}

let co: TestCompany;
let other: TestCompany;
const cookies: Record<string, string> = {};
let cureLot: string;
let spiceLot: string;
let otherAlertId: string;

const list = (who: string, query = "") => call(listRoute, { path: `/api/alerts${query}`, cookie: cookies[who] });
const ack = (who: string, id: string) => call(ackRoute, { path: `/api/alerts/${id}/ack`, method: "POST", params: { id }, cookie: cookies[who] });
const snooze = (who: string, id: string, body: unknown) => call(snoozeRoute, { path: `/api/alerts/${id}/snooze`, params: { id }, body, cookie: cookies[who] });

beforeAll(async () => {
  co = await createCompany({ kitchens: 2 });
  other = await createCompany({ kitchens: 1 });
  cureLot = await receiveLot(co, 0, "cure", 20); // cure 60/30/7: two alerts in kitchen 1 (see the two scans)
  spiceLot = await receiveLot(co, 1, "spice", 20); // spice 90/30: two alerts in kitchen 2
  await receiveLot(other, 0, "cure", 3);
  // a scan 15 days ago (35 days left: cure 60, spice 90), then today's (20 left: 30 for both)
  await runExpiryScan(db(), { companyId: co.company.id }, new Date(Date.now() - 15 * 24 * 3600_000));
  await runExpiryScan(db(), { companyId: co.company.id });
  await runExpiryScan(db(), { companyId: other.company.id });
  otherAlertId = (await db()("alerts").where({ company_id: other.company.id }).first()).id;
  for (const role of ["manager", "kitchen_lead", "buyer", "accountant", "admin"] as const) cookies[role] = await sessionCookieFor(co.users[role].id);
  cookies.otherManager = await sessionCookieFor(other.users.manager.id);
});

describe("GET /api/alerts", () => {
  it("a manager sees every kitchen's alerts, unread, with the cure caution on cure alerts", async () => {
    const r = await list("manager");
    expect(r.status).toBe(200);
    expect(r.body.unreadCount).toBe(4);
    expect(r.body.alerts).toHaveLength(4);
    const cure = r.body.alerts.filter((a: { subjectId: string }) => a.subjectId === cureLot);
    expect(cure.map((a: { thresholdDays: number }) => a.thresholdDays).sort()).toEqual([30, 60]);
    expect(cure[0]).toMatchObject({ kind: "expiry", subjectType: "lot", unread: true, caution: CURE_CAUTION, kitchen: { id: co.kitchens[0]!.id } });
    expect(cure[0].data).toMatchObject({ quantity: "100", unit: "g", dateKind: "use_by", category: "cure" });
    const spice = r.body.alerts.find((a: { subjectId: string }) => a.subjectId === spiceLot);
    expect(spice.caution).toBeNull();
    expect(r.body.alerts.some((a: { id: string }) => a.id === otherAlertId)).toBe(false);
  });

  it("filters by kind and kitchen; a kitchen lead sees only their own kitchens", async () => {
    const k2 = await list("manager", `?kitchen=${co.kitchens[1]!.code}`);
    expect(k2.body.alerts.map((a: { subjectId: string }) => a.subjectId)).toEqual([spiceLot, spiceLot]);
    expect((await list("manager", "?kind=reorder")).body.alerts).toEqual([]);

    const lead = await list("kitchen_lead");
    expect(lead.status).toBe(200);
    expect(lead.body.alerts.every((a: { kitchen: { id: string } }) => a.kitchen.id === co.kitchens[0]!.id)).toBe(true);
    expect(lead.body.unreadCount).toBe(2);
    expect((await list("kitchen_lead", `?kitchen=${co.kitchens[1]!.code}`)).status).toBe(403);
    expect((await list("buyer")).body.alerts).toHaveLength(4);
  });

  it("refuses roles without alerts, bad filters and other companies' kitchens", async () => {
    expect((await list("accountant")).status).toBe(403);
    const bad = await list("manager", "?kind=weather&limit=0");
    expect(bad.status).toBe(422);
    expect(Object.keys(bad.body.error.details.fields).sort()).toEqual(["kind", "limit"]);
    expect((await list("manager", `?kitchen=${other.kitchens[0]!.id}`)).status).toBe(404);
    expect((await call(listRoute, { path: "/api/alerts" })).status).toBe(401);
  });
});

describe("acknowledge and snooze", () => {
  it("acknowledging is per user, repeatable, and hides the alert from the default list", async () => {
    const alerts = (await list("admin")).body.alerts as { id: string; subjectId: string }[];
    const target = alerts.find((a) => a.subjectId === cureLot)!;
    const first = await ack("admin", target.id);
    expect(first.status).toBe(200);
    expect(first.body).toMatchObject({ id: target.id, unread: false });
    expect(first.body.acknowledgedAt).toEqual(expect.any(String));
    const again = await ack("admin", target.id);
    expect(again.body.acknowledgedAt).toBe(first.body.acknowledgedAt);

    const after = await list("admin");
    expect(after.body.unreadCount).toBe(3);
    expect(after.body.alerts.some((a: { id: string }) => a.id === target.id)).toBe(false);
    expect((await list("admin", "?includeAcknowledged=true")).body.alerts.some((a: { id: string }) => a.id === target.id)).toBe(true);
    expect((await list("manager")).body.unreadCount).toBe(4); // others still have it unread
  });

  it("snoozing keeps the alert listed but not unread; the body is checked", async () => {
    const target = ((await list("buyer")).body.alerts as { id: string }[])[0]!;
    const r = await snooze("buyer", target.id, { hours: 24 });
    expect(r.status).toBe(200);
    expect(r.body.unread).toBe(false);
    expect(new Date(r.body.snoozedUntil).getTime()).toBeGreaterThan(Date.now() + 23 * 3600_000);
    const after = await list("buyer");
    expect(after.body.unreadCount).toBe(3);
    expect(after.body.alerts.find((a: { id: string }) => a.id === target.id)).toMatchObject({ unread: false });

    for (const body of [{}, { hours: 2, until: new Date(Date.now() + 3600_000).toISOString() }, { until: "2020-01-01T00:00:00Z" }, { hours: 24 * 31 }]) {
      const bad = await snooze("buyer", target.id, body);
      expect(bad.status).toBe(422);
      expect(Object.keys(bad.body.error.details.fields)).toEqual([body.hours === 24 * 31 ? "hours" : "until"]);
    }
  });

  it("another company's alert is 404; another kitchen's is 403 for a kitchen lead", async () => {
    expect((await ack("manager", otherAlertId)).status).toBe(404);
    expect((await snooze("manager", otherAlertId, { hours: 1 })).status).toBe(404);
    expect((await ack("manager", "not-a-uuid")).status).toBe(404);
    const spiceAlert = await db()("alerts").where({ company_id: co.company.id, subject_id: spiceLot }).first();
    expect((await ack("kitchen_lead", spiceAlert.id)).status).toBe(403);
    expect((await ack("accountant", spiceAlert.id)).status).toBe(403);
  });
});

describe("lastExpiryScan", () => {
  it("says when the scan last ran and whether alerts are late (over 26 h)", async () => {
    const manager = await currentUser(co.users.manager.id);
    const now = new Date();
    const fresh = await lastExpiryScan(manager, now);
    expect(fresh.late).toBe(false);
    expect(fresh.lastRunAt).toEqual(expect.any(String));
    expect((await lastExpiryScan(manager, new Date(now.getTime() + 27 * 3600_000))).late).toBe(true);
    const never = await createCompany({ kitchens: 1 });
    expect(await lastExpiryScan(await currentUser(never.users.manager.id), now)).toEqual({ lastRunAt: null, late: true });
  });
});
