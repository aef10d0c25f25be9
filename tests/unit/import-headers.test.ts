// lib/import/headers: the first-use proposal of a column mapping from the file's header names.
import { describe, expect, it } from "vitest";
import { normalizeHeader, proposeMapping } from "@/lib/import/headers";
import { TEST_FIELDS } from "../support/import-fields";

describe("normalizeHeader", () => {
  it("ignores case, spaces, accents and punctuation", () => {
    expect(normalizeHeader("  Unit Price (€) ")).toBe("unitprice");
    expect(normalizeHeader("Gültig ab")).toBe("gultigab");
    expect(normalizeHeader("Größe")).toBe("grosse");
    expect(normalizeHeader("PRIX_UNITAIRE")).toBe("prixunitaire");
    expect(normalizeHeader("Item-Code")).toBe("itemcode");
  });
});

describe("proposeMapping", () => {
  it("matches exact names and synonyms in any case or spacing", () => {
    const p = proposeMapping(["ITEM CODE", "name", "Unit-Price", "Qty", "Valid From"], TEST_FIELDS);
    expect(p.columns).toEqual({
      sku: { header: "ITEM CODE" }, description: { header: "name" }, price: { header: "Unit-Price" }, pack: { header: "Qty" }, validFrom: { header: "Valid From" },
    });
    expect(p.missingRequired).toEqual([]);
    expect(p.unusedHeaders).toEqual([]);
    expect(p.problem).toBeNull();
  });

  it("matches a header that contains a name (\"Price EUR\") and leaves the rest for the person", () => {
    const p = proposeMapping(["Artikelnummer", "Price EUR", "Colour", "Origin"], TEST_FIELDS);
    expect(p.columns).toEqual({ sku: { header: "Artikelnummer" }, price: { header: "Price EUR" } });
    expect(p.matched).toEqual([
      { field: "sku", header: "Artikelnummer", column: 1 },
      { field: "price", header: "Price EUR", column: 2 },
    ]);
    expect(p.unusedHeaders).toEqual(["Colour", "Origin"]);
  });

  it("uses each column once, and proposes a column number where the header is repeated", () => {
    const p = proposeMapping(["Code", "Price", "Price"], TEST_FIELDS);
    expect(p.columns).toEqual({ sku: { header: "Code" }, price: { column: 2 } });
  });

  it("names the required fields it could not find", () => {
    const p = proposeMapping(["Description", "Pack"], TEST_FIELDS);
    expect(p.missingRequired).toEqual(["sku", "price"]);
    expect(p.problem).toBeNull();
  });

  it("reports no matching columns clearly, naming the file's columns and the fields looked for", () => {
    const p = proposeMapping(["Contact", "Phone", "E-mail"], TEST_FIELDS);
    expect(p.columns).toEqual({});
    expect(p.problem).toBe(
      'No matching columns: none of this file\'s columns ("Contact", "Phone", "E-mail") looks like "Supplier code", "Description", "Unit price", "Pack size", "Valid from". Check that this is the right file, or choose the columns by hand.',
    );
  });
});
