// What a supplier's price list can tell us, as import fields (lib/import): the supplier's SKU and
// the price of one pack are required; the rest is checked when the file has it. Pure and
// client-safe: the mapping form lists these fields, the import reads them.
import { defineImportFields } from "../import/fields";

export const PRICE_LIST_FIELDS = defineImportFields([
  {
    key: "sku", label: "Supplier SKU", type: "text", required: true, maxLength: 60,
    synonyms: ["sku", "supplier sku", "article", "article no", "article number", "artikelnummer", "artikel nr", "art nr", "item code", "item no", "product code", "code", "ref", "reference", "part number", "order code", "code article"],
  },
  {
    key: "price", label: "Pack price", type: "decimal", required: true, signed: true,
    synonyms: ["price", "pack price", "unit price", "net price", "price per pack", "list price", "preis", "einzelpreis", "nettopreis", "prix", "prix unitaire", "cost"],
  },
  {
    key: "description", label: "Description", type: "text", maxLength: 500,
    synonyms: ["description", "name", "product", "product name", "item", "bezeichnung", "artikelbezeichnung", "designation", "libelle"],
  },
  {
    key: "pack", label: "Pack (as the supplier names it)", type: "text", maxLength: 80,
    synonyms: ["pack", "pack label", "packaging", "package", "packing", "unit of sale", "verpackung", "gebinde", "conditionnement"],
  },
  {
    key: "packQuantity", label: "Pack size", type: "decimal",
    synonyms: ["pack size", "pack quantity", "quantity", "qty", "contents", "content", "menge", "inhalt", "quantite"],
  },
  {
    key: "packUnit", label: "Pack unit", type: "text", maxLength: 30,
    synonyms: ["pack unit", "unit", "uom", "unit of measure", "einheit", "mengeneinheit", "unite"],
  },
  {
    key: "gtin", label: "GTIN (barcode)", type: "text", maxLength: 20,
    synonyms: ["gtin", "ean", "ean13", "ean code", "barcode", "upc", "gtin14"],
  },
  {
    key: "currency", label: "Currency", type: "text", maxLength: 10,
    synonyms: ["currency", "cur", "ccy", "waehrung", "wahrung", "devise"],
  },
  {
    key: "effectiveFrom", label: "Effective from", type: "date",
    synonyms: ["effective from", "effective", "effective date", "valid from", "price date", "start date", "gultig ab", "gueltig ab", "valable du"],
  },
]);

export type PriceListField = (typeof PRICE_LIST_FIELDS)[number]["key"];
export const PRICE_LIST_FIELD_KEYS = PRICE_LIST_FIELDS.map((f) => f.key);
