// What a supplier's delivery note CSV can tell us, as import fields (lib/import). Quantities count
// the supplier's packs; the unit price is per pack. Pure and client-safe.
import type { DateKind } from "../../db/types";
import { defineImportFields } from "../import/fields";

export const DELIVERY_NOTE_FIELDS = defineImportFields([
  { key: "noteNumber", label: "Delivery note number", type: "text", maxLength: 80, synonyms: ["delivery note", "delivery note number", "note number", "note no", "dn", "dn number", "lieferschein", "lieferscheinnummer", "bon de livraison", "despatch note", "dispatch note"] },
  { key: "sku", label: "Supplier SKU", type: "text", maxLength: 60, synonyms: ["sku", "supplier sku", "article", "article no", "article number", "artikelnummer", "item code", "product code", "code", "ref", "reference"] },
  { key: "gtin", label: "GTIN (barcode)", type: "text", maxLength: 20, synonyms: ["gtin", "ean", "ean13", "barcode", "upc", "gtin14"] },
  { key: "description", label: "Description", type: "text", maxLength: 500, synonyms: ["description", "name", "product", "item", "bezeichnung", "designation"] },
  { key: "quantity", label: "Quantity (packs)", type: "decimal", required: true, synonyms: ["quantity", "qty", "packs", "delivered", "qty delivered", "menge", "quantite"] },
  { key: "pack", label: "Pack", type: "text", maxLength: 80, synonyms: ["pack", "packaging", "unit of sale", "verpackung", "gebinde", "conditionnement"] },
  { key: "unitPrice", label: "Price per pack", type: "decimal", synonyms: ["unit price", "price", "pack price", "net price", "preis", "einzelpreis", "prix"] },
  { key: "lot", label: "Lot", type: "text", maxLength: 80, synonyms: ["lot", "lot number", "lot no", "batch", "batch number", "charge", "chargennummer", "lot code"] },
  { key: "date", label: "Date", type: "date", synonyms: ["date", "use by", "best before", "expiry", "expiry date", "bbd", "mhd", "dlc", "ddm"] },
  { key: "dateKind", label: "Kind of date", type: "text", maxLength: 30, synonyms: ["date kind", "kind of date", "date type", "datumsart"] },
]);

export type DeliveryNoteField = (typeof DELIVERY_NOTE_FIELDS)[number]["key"];

/** "use by", "Use-By", "EXP" -> use_by; "best before", "BBD", "MHD" -> best_before; anything else null. */
export function dateKindFrom(text: string | null): DateKind | null | undefined {
  if (text === null) return undefined;
  const t = text.toLowerCase().replace(/[^a-z]/g, "");
  if (["useby", "ub", "exp", "expiry", "expires", "verbrauchsdatum", "dlc"].includes(t)) return "use_by";
  if (["bestbefore", "bb", "bbd", "bbe", "mhd", "ddm", "dluo"].includes(t)) return "best_before";
  return null;
}
