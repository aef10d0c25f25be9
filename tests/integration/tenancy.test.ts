import { beforeAll, describe, expect, it } from "vitest";
import { PATCH as companyPatch } from "../../app/api/company/route";
import { GET as invitationsList, POST as inviteRoute } from "../../app/api/invitations/route";
import { GET as kitchenGet, PATCH as kitchenPatch } from "../../app/api/kitchens/[id]/route";
import { GET as kitchensList, POST as kitchenCreate } from "../../app/api/kitchens/route";
import { GET as capturedRoute } from "../../app/api/mail/captured/route";
import { GET as userGet, PATCH as userPatch } from "../../app/api/users/[id]/route";
import { GET as usersList } from "../../app/api/users/route";
import { createCompany, uniqueEmail, type TestCompany } from "../support/factory";
import { sessionCookieFor } from "../support/sessions";
import { call } from "../support/http";
import { extractLink, waitForMail, waitForMails } from "../support/mail";

let a: TestCompany;
let b: TestCompany;
const cookies = { adminA: "", adminB: "", leadA: "" };
beforeAll(async () => {
  [a, b] = await Promise.all([createCompany({ kitchens: 2 }), createCompany({ kitchens: 2 })]);
  cookies.adminA = await sessionCookieFor(a.users.admin.id);
  cookies.adminB = await sessionCookieFor(b.users.admin.id);
  cookies.leadA = await sessionCookieFor(a.users.kitchen_lead.id);
});

const ids = (rows: { id: string }[]) => rows.map((r) => r.id).sort();
const captured = (cookie: string) => call(capturedRoute, { path: "/api/mail/captured", cookie });
const invite = (cookie: string, email: string) => call(inviteRoute, { path: "/api/invitations", cookie, body: { email, name: "Shared Person", role: "buyer" } });

describe("another company's records are 404", () => {
  it("kitchens: GET and PATCH", async () => {
    const kitchen = a.kitchens[0]!;
    const get = await call(kitchenGet, { path: `/api/kitchens/${kitchen.id}`, params: { id: kitchen.id }, cookie: cookies.adminB });
    expect(get.status).toBe(404);
    expect(get.body.error.code).toBe("NOT_FOUND");
    const patch = await call(kitchenPatch, {
      method: "PATCH", path: `/api/kitchens/${kitchen.id}`, params: { id: kitchen.id }, cookie: cookies.adminB, body: { name: "Taken over" },
    });
    expect(patch.status).toBe(404);
    // and A's kitchen is unchanged
    const own = await call(kitchenGet, { path: `/api/kitchens/${kitchen.id}`, params: { id: kitchen.id }, cookie: cookies.adminA });
    expect(own).toMatchObject({ status: 200, body: { id: kitchen.id, name: kitchen.name } });
  });

  it("users: GET and PATCH", async () => {
    const target = a.users.manager;
    const get = await call(userGet, { path: `/api/users/${target.id}`, params: { id: target.id }, cookie: cookies.adminB });
    expect(get.status).toBe(404);
    const patch = await call(userPatch, {
      method: "PATCH", path: `/api/users/${target.id}`, params: { id: target.id }, cookie: cookies.adminB, body: { disabled: true },
    });
    expect(patch.status).toBe(404);
    const own = await call(userGet, { path: `/api/users/${target.id}`, params: { id: target.id }, cookie: cookies.adminA });
    expect(own).toMatchObject({ status: 200, body: { id: target.id, disabled: false } });
  });

  it("kitchen ids of another company cannot be assigned", async () => {
    const target = b.users.kitchen_lead;
    const res = await call(userPatch, {
      method: "PATCH", path: `/api/users/${target.id}`, params: { id: target.id }, cookie: cookies.adminB, body: { kitchenIds: [a.kitchens[0]!.id] },
    });
    expect(res.status).toBe(422);
    expect(Object.keys(res.body.error.details.fields)).toEqual(["kitchenIds.0"]);
  });
});

describe("lists hold only the company's own records", () => {
  it("kitchens, users and invitations", async () => {
    const kitchens = await call(kitchensList, { path: "/api/kitchens", cookie: cookies.adminB });
    expect(ids(kitchens.body.kitchens)).toEqual(ids(b.kitchens));
    const users = await call(usersList, { path: "/api/users", cookie: cookies.adminB });
    expect(ids(users.body.users)).toEqual(ids(Object.values(b.users)));
    await invite(cookies.adminA, uniqueEmail("a-only"));
    const invitations = await call(invitationsList, { path: "/api/invitations", cookie: cookies.adminB });
    expect(invitations.status).toBe(200);
    expect(invitations.body.invitations).toEqual([]);
  });

  it("a kitchen code may repeat across companies", async () => {
    const res = await call(kitchenCreate, { path: "/api/kitchens", cookie: cookies.adminB, body: { code: a.kitchens[0]!.code, name: "Same code" } });
    expect(res.status).toBe(201);
    const dup = await call(kitchenCreate, { path: "/api/kitchens", cookie: cookies.adminB, body: { code: a.kitchens[0]!.code, name: "Again" } });
    expect(dup.status).toBe(409);
  });
});

describe("a kitchen lead", () => {
  it("gets 403 on admin-only endpoints", async () => {
    const lead = cookies.leadA;
    const own = a.kitchens[0]!; // the lead's assigned kitchen
    const target = a.users.buyer;
    const answers = await Promise.all([
      call(kitchenPatch, { method: "PATCH", path: `/api/kitchens/${own.id}`, params: { id: own.id }, cookie: lead, body: { name: "Mine now" } }),
      call(kitchenCreate, { path: "/api/kitchens", cookie: lead, body: { code: "LEAD1", name: "Lead's" } }),
      call(usersList, { path: "/api/users", cookie: lead }),
      call(userGet, { path: `/api/users/${target.id}`, params: { id: target.id }, cookie: lead }),
      call(userPatch, { method: "PATCH", path: `/api/users/${target.id}`, params: { id: target.id }, cookie: lead, body: { role: "admin" } }),
      call(companyPatch, { method: "PATCH", path: "/api/company", cookie: lead, body: { name: "Lead Co", timeZone: "UTC", currency: "EUR" } }),
      invite(lead, uniqueEmail("by-lead")),
      captured(lead),
    ]);
    for (const res of answers) {
      expect(res.status).toBe(403);
      expect(res.body).toEqual({ error: { code: "FORBIDDEN", message: expect.any(String) } });
    }
  });

  it("still gets 404, not 403, for another company's kitchen", async () => {
    const foreign = b.kitchens[0]!;
    const res = await call(kitchenPatch, { method: "PATCH", path: `/api/kitchens/${foreign.id}`, params: { id: foreign.id }, cookie: cookies.leadA, body: { name: "x" } });
    expect(res.status).toBe(404);
  });

  it("reads the kitchens of its company", async () => {
    const res = await call(kitchensList, { path: "/api/kitchens", cookie: cookies.leadA });
    expect(ids(res.body.kitchens)).toEqual(ids(a.kitchens));
  });
});

describe("captured mail", () => {
  it("shows each admin only their own company's messages", async () => {
    const toA = uniqueEmail("only-a");
    const toB = uniqueEmail("only-b");
    expect((await invite(cookies.adminA, toA)).status).toBe(201);
    expect((await invite(cookies.adminB, toB)).status).toBe(201);
    const [mailA, mailB] = await Promise.all([
      waitForMail({ to: toA, timeoutMs: 15_000 }),
      waitForMail({ to: toB, timeoutMs: 15_000 }),
    ]);
    const linkA = extractLink(mailA.text, "/invitation/");
    const linkB = extractLink(mailB.text, "/invitation/");

    const seenA = await captured(cookies.adminA);
    const seenB = await captured(cookies.adminB);
    expect(seenA.status).toBe(200);
    expect(seenB.status).toBe(200);
    expect(seenA.body.filter((m: { to: string[] }) => m.to.includes(toA))).toHaveLength(1);
    expect(seenB.body.filter((m: { to: string[] }) => m.to.includes(toB))).toHaveLength(1);
    const textA = JSON.stringify(seenA.body);
    const textB = JSON.stringify(seenB.body);
    expect(textA).toContain(linkA);
    expect(textA).not.toContain(toB);
    expect(textA).not.toContain(linkB);
    expect(textB).toContain(linkB);
    expect(textB).not.toContain(toA);
    expect(textB).not.toContain(linkA);
  });

  it("keeps them apart when both companies invite the same address", async () => {
    const shared = uniqueEmail("shared");
    expect((await invite(cookies.adminA, shared)).status).toBe(201);
    expect((await invite(cookies.adminB, shared)).status).toBe(201);
    // wait until the catcher holds both: one stamped with each company
    const mails = await waitForMails({ to: shared, count: 2, timeoutMs: 15_000 });
    expect(mails).toHaveLength(2);
    expect(mails.map((m) => m.companyId).sort()).toEqual([a.company.id, b.company.id].sort());
    const linkOf = (companyId: string) => extractLink(mails.find((m) => m.companyId === companyId)!.text, "/invitation/");

    const seenA = (await captured(cookies.adminA)).body.filter((m: { to: string[] }) => m.to.includes(shared));
    const seenB = (await captured(cookies.adminB)).body.filter((m: { to: string[] }) => m.to.includes(shared));
    expect(seenA).toHaveLength(1);
    expect(seenB).toHaveLength(1);
    expect(seenA[0].text).toContain(linkOf(a.company.id));
    expect(seenA[0].text).not.toContain(linkOf(b.company.id));
    expect(seenA[0].subject).toContain(a.company.name);
    expect(seenB[0].text).toContain(linkOf(b.company.id));
    expect(seenB[0].text).not.toContain(linkOf(a.company.id));
    expect(seenB[0].subject).toContain(b.company.name);
  });

  it("is 403 for every non-admin role", async () => {
    for (const role of ["manager", "buyer", "kitchen_lead", "accountant"] as const) {
      const res = await captured(await sessionCookieFor(a.users[role].id));
      expect(res.status, role).toBe(403);
    }
  });
});
