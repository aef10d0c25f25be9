// A price-list-like set of import fields for the import engine's tests and benchmark (invented;
// the real price-list import declares its own).
import { defineImportFields } from "../../lib/import/fields";

export const TEST_FIELDS = defineImportFields([
  { key: "sku", label: "Supplier code", type: "text", required: true, synonyms: ["sku", "code", "article", "artikelnummer", "item code", "product code", "ref"] },
  { key: "description", label: "Description", type: "text", synonyms: ["name", "bezeichnung", "product", "designation"] },
  { key: "price", label: "Unit price", type: "decimal", required: true, synonyms: ["price", "preis", "prix", "cost"] },
  { key: "pack", label: "Pack size", type: "decimal", synonyms: ["pack", "menge", "quantity", "qty"] },
  { key: "validFrom", label: "Valid from", type: "date", synonyms: ["valid from", "gültig ab", "date"] },
]);
