// When a person's digest is due, which kinds they get, and what the e-mail says.
// Clock-change dates: UK clocks go forward at 01:00 GMT on the last Sunday of March and back at
// 02:00 BST on the last Sunday of October (gov.uk, "When do the clocks change?"): 29 March and
// 25 October 2026. US Central time: UTC-6 in winter (CST), UTC-5 in summer (CDT), DST ending on the
// first Sunday of November (15 U.S.C. 260a): 1 November 2026. India: UTC+05:30 all year (IST, no DST).
// The instants below are worked by hand from those offsets.
import { describe, expect, it } from "vitest";
import { alertKindsFor, defaultAlertKinds, digestDue, lastDigestSlot } from "../../lib/alerts/digest";
import { CURE_CAUTION } from "../../lib/cure/caution";
import { alertDigestEmail, alertPath, type DigestAlert } from "../../lib/mail/alert-digest";

const at = (iso: string) => new Date(iso);

describe("lastDigestSlot", () => {
  it("is today's hour once the local clock has passed it, else yesterday's", () => {
    // London in December is GMT (UTC+0): 07:00 local = 07:00Z
    expect(lastDigestSlot(at("2026-12-02T06:59:59Z"), "Europe/London", 7).toISOString()).toBe("2026-12-01T07:00:00.000Z");
    expect(lastDigestSlot(at("2026-12-02T07:00:00Z"), "Europe/London", 7).toISOString()).toBe("2026-12-02T07:00:00.000Z");
    // London in July is BST (UTC+1): 07:00 local = 06:00Z
    expect(lastDigestSlot(at("2026-07-15T06:30:00Z"), "Europe/London", 7).toISOString()).toBe("2026-07-15T06:00:00.000Z");
  });

  it("reads the hour in the person's zone, including half-hour offsets and the date line", () => {
    // Chicago CST (UTC-6): 07:00 local = 13:00Z; at 12:00Z it is 06:00 local, so yesterday's slot
    expect(lastDigestSlot(at("2026-12-02T12:00:00Z"), "America/Chicago", 7).toISOString()).toBe("2026-12-01T13:00:00.000Z");
    // Kolkata IST (UTC+05:30): 07:00 local = 01:30Z
    expect(lastDigestSlot(at("2026-03-01T03:00:00Z"), "Asia/Kolkata", 7).toISOString()).toBe("2026-03-01T01:30:00.000Z");
    // Chicago at 23:00 local on 1 December is already 2 December in UTC (05:00Z): the slot is 1 December's 22:00 local
    expect(lastDigestSlot(at("2026-12-02T05:00:00Z"), "America/Chicago", 22).toISOString()).toBe("2026-12-02T04:00:00.000Z");
  });

  it("on clock-change days: a missing hour falls on the jump, a repeated one on its later reading", () => {
    // 29 March 2026, London: 01:00 GMT becomes 02:00 BST at 01:00Z; local 01:00 never happens
    expect(lastDigestSlot(at("2026-03-29T12:00:00Z"), "Europe/London", 1).toISOString()).toBe("2026-03-29T01:00:00.000Z");
    // 25 October 2026, London: local 01:00 happens at 00:00Z (BST) and again at 01:00Z (GMT)
    expect(lastDigestSlot(at("2026-10-25T12:00:00Z"), "Europe/London", 1).toISOString()).toBe("2026-10-25T01:00:00.000Z");
    // 1 November 2026, Chicago: 07:00 is after the change, so CST: 13:00Z (the day before it was CDT: 12:00Z)
    expect(lastDigestSlot(at("2026-11-01T18:00:00Z"), "America/Chicago", 7).toISOString()).toBe("2026-11-01T13:00:00.000Z");
    expect(lastDigestSlot(at("2026-10-31T18:00:00Z"), "America/Chicago", 7).toISOString()).toBe("2026-10-31T12:00:00.000Z");
  });
});

describe("digestDue", () => {
  const since = at("2026-11-01T00:00:00Z");
  it("is due once per slot: not again after a digest made after the slot", () => {
    expect(digestDue(at("2026-12-02T07:05:00Z"), "Europe/London", 7, at("2026-12-01T07:02:00Z"), since)).toBe(true);
    expect(digestDue(at("2026-12-02T07:20:00Z"), "Europe/London", 7, at("2026-12-02T07:05:00Z"), since)).toBe(false);
    expect(digestDue(at("2026-12-02T06:55:00Z"), "Europe/London", 7, at("2026-12-01T07:02:00Z"), since)).toBe(false);
  });
  it("catches up a slot the worker missed, once", () => {
    // the worker was down from 06:00 to 11:00; the 07:00 digest goes at 11:00, not again at 11:15
    expect(digestDue(at("2026-12-02T11:00:00Z"), "Europe/London", 7, at("2026-12-01T07:01:00Z"), since)).toBe(true);
    expect(digestDue(at("2026-12-02T11:15:00Z"), "Europe/London", 7, at("2026-12-02T11:00:00Z"), since)).toBe(false);
  });
  it("someone who never had a digest is due from the first slot after they joined", () => {
    expect(digestDue(at("2026-12-02T07:30:00Z"), "Europe/London", 7, null, at("2026-12-02T07:10:00Z"))).toBe(false);
    expect(digestDue(at("2026-12-03T07:00:00Z"), "Europe/London", 7, null, at("2026-12-02T07:10:00Z"))).toBe(true);
  });
});

describe("alert kinds", () => {
  it("default by role, and a person's own choice replaces the default", () => {
    expect(defaultAlertKinds("manager")).toEqual(["expiry", "reorder", "shortage"]);
    expect(defaultAlertKinds("buyer")).toEqual(["expiry", "reorder"]);
    expect(defaultAlertKinds("kitchen_lead")).toEqual(["expiry", "shortage"]);
    expect(defaultAlertKinds("accountant")).toEqual([]);
    expect(alertKindsFor("buyer", null)).toEqual(["expiry", "reorder"]);
    expect(alertKindsFor("buyer", ["shortage", "expiry"])).toEqual(["expiry", "shortage"]);
    expect(alertKindsFor("manager", [])).toEqual([]);
  });
});

describe("the alert e-mail", () => {
  const alerts: DigestAlert[] = [
    { id: "a1", kind: "expiry", title: "Curing salt No. 1, lot C-7: 5 days left", detail: "2.5 kg in Yard; use by 2026-12-07 (7-day warning).", kitchenName: "Yard", aboutCure: true, path: "/alerts" },
    { id: "a2", kind: "reorder", title: "Hog casings 32-35 mm below reorder point", detail: "Projected 1 hank, reorder point 3 hanks.", kitchenName: "Lane & <Co>", aboutCure: false, path: alertPath("reorder", "item", "x") },
  ];
  const mail = alertDigestEmail({ name: "Ada", companyName: "Test Larder", mode: "digest", appUrl: "http://app.test/", alerts });

  it("says how many, groups by kind, links into the product and carries the cure caution", () => {
    expect(mail.subject).toBe("Test Larder: 2 alerts in today's digest");
    expect(mail.text).toContain("Lots nearing their date (1)\n- Curing salt No. 1, lot C-7: 5 days left [Yard]");
    expect(mail.text).toContain("Below reorder point (1)");
    expect(mail.text).toContain("http://app.test/purchasing/reorder");
    expect(mail.text).toContain("http://app.test/account#alert-email");
    expect(mail.text).toContain(CURE_CAUTION);
    expect(mail.html).toContain('href="http://app.test/alerts"');
    expect(mail.html).toContain("Lane &amp; &lt;Co&gt;"); // escaped
    expect(mail.html).not.toContain("<Co>");
  });

  it("leaves the caution out when no alert is about cure, and words an immediate e-mail differently", () => {
    const one = alertDigestEmail({ name: "Ada", companyName: "Test Larder", mode: "immediate", appUrl: "http://app.test", alerts: [alerts[1]!] });
    expect(one.subject).toBe("Test Larder: 1 new alert");
    expect(one.text).not.toContain(CURE_CAUTION);
    expect(alertPath("shortage", "batch", "b-1")).toBe("/planning/batches/b-1");
  });
});
