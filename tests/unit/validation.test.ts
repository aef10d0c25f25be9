import { describe, expect, it } from "vitest";
import { z } from "zod";
import { decimalString, email, isTimeZone } from "../../lib/validation/common";
import { invitationCreateInput, kitchenCreateInput, kitchenUpdateInput } from "../../lib/validation/company";

const K1 = "3f2b8c1e-4a5d-4e6f-8a9b-0c1d2e3f4a5b";

describe("decimalString", () => {
  const qty = decimalString({ scale: 3 });

  it("accepts a plain decimal string", () => {
    expect(qty.parse("12.5")).toBe("12.5");
    expect(qty.parse("0")).toBe("0");
    expect(qty.parse(" 7.125 ")).toBe("7.125");
  });

  it("refuses JSON numbers", () => {
    expect(qty.safeParse(12.5).success).toBe(false);
    expect(qty.safeParse(12).success).toBe(false);
    // the JSON a client would send: the number never reaches the schema as a string
    expect(qty.safeParse(JSON.parse('{"q":12.5}').q).success).toBe(false);
  });

  it("refuses exponents, signs by default, too many decimals and junk", () => {
    for (const bad of ["1e3", "1E3", "1.5e-2", "-1", "+1", "1.2345", ".5", "5.", "1,5", "", "NaN", "Infinity", "0x10"]) {
      expect(qty.safeParse(bad).success, bad).toBe(false);
    }
  });

  it("accepts a minus sign only when signed", () => {
    expect(decimalString({ signed: true }).parse("-3.25")).toBe("-3.25");
    expect(decimalString().safeParse("-3.25").success).toBe(false);
  });
});

describe("email", () => {
  it("trims and lower-cases", () => {
    expect(email.parse("  Ana.Pell@Example.COM ")).toBe("ana.pell@example.com");
  });

  it("refuses what is not an address", () => {
    expect(email.safeParse("ana").success).toBe(false);
    expect(email.safeParse("ana@").success).toBe(false);
    expect(email.safeParse(42).success).toBe(false);
  });
});

describe("isTimeZone", () => {
  it("knows IANA names", () => {
    // outside fact: these are IANA zone names the runtime's ICU data contains
    expect(isTimeZone("Europe/Vienna")).toBe(true);
    expect(isTimeZone("America/Chicago")).toBe(true);
    expect(isTimeZone("UTC")).toBe(true);
  });

  it("refuses unknown or empty names", () => {
    expect(isTimeZone("Mars/Olympus_Mons")).toBe(false);
    expect(isTimeZone("")).toBe(false);
    expect(isTimeZone("Europe/")).toBe(false);
  });
});

describe("invitationCreateInput", () => {
  const base = { email: "New.Cook@Example.com", name: "New Cook" };

  it("requires kitchens for a kitchen lead, naming the field", () => {
    const r = invitationCreateInput.safeParse({ ...base, role: "kitchen_lead" });
    expect(r.success).toBe(false);
    expect(z.flattenError(r.error!).fieldErrors).toHaveProperty("kitchenIds");
    expect(invitationCreateInput.safeParse({ ...base, role: "kitchen_lead", kitchenIds: [] }).success).toBe(false);
  });

  it("accepts a kitchen lead with a kitchen and other roles without", () => {
    expect(invitationCreateInput.parse({ ...base, role: "kitchen_lead", kitchenIds: [K1] })).toEqual({
      email: "new.cook@example.com", name: "New Cook", role: "kitchen_lead", kitchenIds: [K1],
    });
    expect(invitationCreateInput.parse({ ...base, role: "buyer" }).kitchenIds).toEqual([]);
  });

  it("refuses unknown roles and bad kitchen ids", () => {
    expect(invitationCreateInput.safeParse({ ...base, role: "owner" }).success).toBe(false);
    expect(invitationCreateInput.safeParse({ ...base, role: "kitchen_lead", kitchenIds: ["K1"] }).success).toBe(false);
  });
});

describe("kitchen inputs", () => {
  it("a new kitchen gets an empty address and the company's time zone by default", () => {
    expect(kitchenCreateInput.parse({ code: "north-1", name: "North" })).toEqual({ code: "NORTH-1", name: "North", address: "", timeZone: null });
  });

  it("an update carries only the fields sent (no defaults that would blank the others)", () => {
    expect(kitchenUpdateInput.parse({ name: "North" })).toEqual({ name: "North" });
    expect(kitchenUpdateInput.parse({})).toEqual({});
    expect(kitchenUpdateInput.parse({ timeZone: null, archived: true })).toEqual({ timeZone: null, archived: true });
  });
});
