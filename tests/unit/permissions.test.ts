import { describe, expect, it } from "vitest";
import { ROLES, type Role } from "../../db/types";
import { can, canSomewhere, kitchensWhere, MATRIX, type Action, type Actor } from "../../lib/auth/permissions";

// The permission matrix as the product documents it, written out independently of MATRIX so that
// any change to MATRIX has to be made here too, on purpose.
//   all   = in every kitchen of the company
//   own   = only in the kitchens assigned to the user
//   limit = only up to the company's approval threshold
//   -     = never
const EXPECTED = `
  action               admin  manager  buyer  kitchen_lead  accountant
  company.manage       all    -        -      -             -
  users.manage         all    -        -      -             -
  kitchens.manage      all    -        -      -             -
  jobs.manage          all    -        -      -             -
  mail.readCaptured    all    -        -      -             -
  api.readReference    all    -        -      -             -
  period.reopen        all    -        -      -             -
  period.close         all    all      -      -             all
  items.manage         all    all      all    -             -
  stock.read           all    all      all    all           all
  stock.receive        all    all      all    -             -
  stock.post           all    all      -      own           -
  levels.manage        all    all      all    own           -
  transfers.request    all    all      -      own           -
  transfers.fulfil     all    all      -      own           -
  planning.read        all    all      -      all           all
  recipes.manage       all    all      -      all           -
  planning.manage      all    all      -      own           -
  production.post      all    all      -      own           -
  limits.override      all    all      -      -             -
  purchasing.read      all    all      all    -             all
  purchasing.manage    all    all      all    -             -
  orders.approve       all    all      limit  -             -
  reports.read         all    all      -      -             all
  reports.export       all    all      -      -             all
  accounts.manage      all    -        -      -             all
  alerts.read          all    all      all    own           -
  dashboard.read       all    all      all    own           all
`;

type Cell = "all" | "own" | "limit" | "-";

function parseTable(table: string): Map<Action, Record<Role, Cell>> {
  const [header, ...rows] = table.trim().split("\n").map((l) => l.trim().split(/\s+/));
  const roles = header!.slice(1) as Role[];
  return new Map(rows.map(([action, ...cells]) => [action as Action, Object.fromEntries(roles.map((r, i) => [r, cells[i] as Cell])) as Record<Role, Cell>]));
}

const expected = parseTable(EXPECTED);
const K1 = "00000000-0000-4000-8000-000000000001";
const K2 = "00000000-0000-4000-8000-000000000002";
const K3 = "00000000-0000-4000-8000-000000000003";
const actor = (role: Role, assignedKitchenIds: string[] = []): Actor => ({ id: "u1", companyId: "c1", role, assignedKitchenIds });

describe("permission matrix", () => {
  it("the table names every action and every role exactly once", () => {
    expect([...expected.keys()].sort()).toEqual(Object.keys(MATRIX).sort());
    for (const cells of expected.values()) expect(Object.keys(cells).sort()).toEqual([...ROLES].sort());
    for (const cells of expected.values()) for (const c of Object.values(cells)) expect(["all", "own", "limit", "-"]).toContain(c);
  });

  for (const [action, cells] of expected) {
    for (const role of ROLES) {
      const cell = cells[role];
      it(`${action} / ${role}: ${cell}`, () => {
        // the same user, assigned K1, asked about their own kitchen, another kitchen and no kitchen
        const a = actor(role, [K1]);
        const approval = { amountMinor: 100n, approvalThresholdMinor: 1000n };
        const answers = {
          own: can(a, action, { kitchenId: K1, ...approval }),
          other: can(a, action, { kitchenId: K2, ...approval }),
          none: can(a, action, approval),
        };
        const want = {
          all: { own: true, other: true, none: true },
          limit: { own: true, other: true, none: true }, // within the threshold
          own: { own: true, other: false, none: false },
          "-": { own: false, other: false, none: false },
        }[cell];
        expect(answers).toEqual(want);
      });
    }
  }
});

describe("kitchen lead scoping", () => {
  const lead = actor("kitchen_lead", [K1, K3]);

  it("allows an own-kitchen action in an assigned kitchen", () => {
    expect(can(lead, "stock.post", { kitchenId: K1 })).toBe(true);
    expect(can(lead, "production.post", { kitchenId: K3 })).toBe(true);
  });

  it("refuses it in another kitchen", () => {
    expect(can(lead, "stock.post", { kitchenId: K2 })).toBe(false);
    expect(can(lead, "transfers.fulfil", { kitchenId: K2 })).toBe(false);
  });

  it("refuses it when no kitchen is named", () => {
    expect(can(lead, "stock.post")).toBe(false);
    expect(can(lead, "planning.manage", {})).toBe(false);
  });

  it("refuses everything kitchen-scoped to a lead with no kitchens", () => {
    const unassigned = actor("kitchen_lead", []);
    expect(can(unassigned, "stock.post", { kitchenId: K1 })).toBe(false);
    expect(can(unassigned, "stock.read", { kitchenId: K1 })).toBe(true); // company-wide reads still work
  });
});

describe("buyer order approval", () => {
  const buyer = actor("buyer");
  const threshold = 50_000n; // 500.00 in minor units

  it("approves below and exactly at the threshold", () => {
    expect(can(buyer, "orders.approve", { amountMinor: 49_999n, approvalThresholdMinor: threshold })).toBe(true);
    expect(can(buyer, "orders.approve", { amountMinor: 50_000n, approvalThresholdMinor: threshold })).toBe(true);
  });

  it("refuses above the threshold", () => {
    expect(can(buyer, "orders.approve", { amountMinor: 50_001n, approvalThresholdMinor: threshold })).toBe(false);
  });

  it("refuses when the amount or the threshold is unknown", () => {
    expect(can(buyer, "orders.approve", { approvalThresholdMinor: threshold })).toBe(false);
    expect(can(buyer, "orders.approve", { amountMinor: 1n })).toBe(false);
    expect(can(buyer, "orders.approve")).toBe(false);
  });

  it("does not limit managers and admins", () => {
    expect(can(actor("manager"), "orders.approve", { amountMinor: 10n ** 12n, approvalThresholdMinor: threshold })).toBe(true);
    expect(can(actor("admin"), "orders.approve", { amountMinor: 10n ** 12n, approvalThresholdMinor: threshold })).toBe(true);
  });
});

describe("canSomewhere", () => {
  it("is true for company-wide reach and false for none", () => {
    expect(canSomewhere(actor("manager"), "stock.post")).toBe(true);
    expect(canSomewhere(actor("accountant"), "stock.post")).toBe(false);
    expect(canSomewhere(actor("buyer"), "orders.approve")).toBe(true);
  });

  it("for own reach, depends on having a kitchen", () => {
    expect(canSomewhere(actor("kitchen_lead", [K1]), "stock.post")).toBe(true);
    expect(canSomewhere(actor("kitchen_lead", []), "stock.post")).toBe(false);
  });
});

describe("kitchensWhere", () => {
  const all = [K1, K2, K3];

  it("gives a lead only the assigned kitchens for an own action", () => {
    expect(kitchensWhere(actor("kitchen_lead", [K2]), "stock.post", all)).toEqual([K2]);
  });

  it("gives a lead every kitchen for a company-wide read", () => {
    expect(kitchensWhere(actor("kitchen_lead", [K2]), "stock.read", all)).toEqual(all);
  });

  it("gives company-wide roles every kitchen and others none", () => {
    expect(kitchensWhere(actor("admin"), "stock.post", all)).toEqual(all);
    expect(kitchensWhere(actor("accountant"), "stock.post", all)).toEqual([]);
  });

  it("ignores assigned kitchens that are not in the company's list", () => {
    expect(kitchensWhere(actor("kitchen_lead", [K1, "foreign"]), "stock.post", [K1, K2])).toEqual([K1]);
  });
});
