// The OpenAPI 3.1 document of app/api, generated from the same zod schemas the routes parse with
// (lib/validation/*) and the response schemas in lib/validation/responses.ts. Served at
// GET /api/openapi.json and rendered for admins at /settings/api.
//
// The route files are not touched: request schemas are documented through clones named with
// zod's own `.meta({ id })`, so zod is not extended and the originals stay exactly as parsed.
// What the route wrapper adds to every endpoint (401 without a session, 403 cross-site, 413/415/
// 400/422 around the body, Idempotency-Key) is derived here from each entry's flags, which
// tests/unit/openapi.test.ts checks against the `route({...})` options in each route file.
import "server-only";
import {
  OpenAPIRegistry,
  OpenApiGeneratorV31,
  type ResponseConfig,
  type RouteConfig,
} from "@asteasolutions/zod-to-openapi";
import { z } from "zod";
import type { meBody } from "../../app/api/me/me-body";
import { SESSION_COOKIE } from "../auth/session";
import type { Alert } from "../data/alerts";
import type { Dashboard } from "../data/dashboard";
import type { UsageReport, ValuationReport } from "../data/reports";
import type { AccountMapping } from "../data/accounts";
import type { Journal } from "../data/journal";
import type { CapturedMail } from "../data/captured-mail";
import type { CasingCalculation } from "../data/casing-calculation";
import type { Batch, ReserveAllResult } from "../data/batches";
import type { BatchTrace, LotTrace } from "../data/trace";
import type { Company } from "../data/companies";
import type { Recipe, RecipeSummary } from "../data/recipes";
import type { InvitationSummary } from "../data/invitations";
import type { JobHealth } from "../data/job-health";
import type { Period, PeriodList } from "../data/periods";
import type { Item } from "../data/items";
import type { Kitchen } from "../data/kitchens";
import type { Supplier, SupplierItem } from "../data/suppliers";
import type { ItemPrices } from "../data/item-prices";
import type { PriceVarianceReport } from "../data/price-variance";
import type { PriceListImport, PriceListResult } from "../data/price-lists";
import type { PurchaseOrder, PurchaseOrderPage } from "../data/purchase-orders";
import type { ReorderSuggestions } from "../data/reorder-suggestions";
import type { TransferLotChoices, TransferRequest } from "../data/transfer-requests";
import type { UserSummary } from "../data/users";
import { DOCUMENT_FILE_TYPES, FILE_TYPES } from "../uploads/file-types";
import { alertListQuery, alertListResponse, alertResponse, alertSnoozeInput } from "../validation/alerts";
import { alertPreferencesInput, alertPreferencesResponse } from "../validation/preferences";
import { dashboardResponse } from "../validation/dashboard";
import { usageQueryFields, usageResponse, valuationQuery, valuationResponse } from "../validation/reports";
import { accountMappingInput, accountMappingResponse } from "../validation/accounts";
import { journalQueryFields, journalResponse } from "../validation/journal";
import { invitationAcceptInput, passwordResetConfirmInput, passwordResetRequestInput, signInInput } from "../validation/auth";
import { companyUpdateInput, invitationCreateInput, kitchenCreateInput, kitchenUpdateInput, userUpdateInput } from "../validation/company";
import { casingCalculationInput, casingCalculationResponse } from "../validation/casing";
import { cureCalculationInput, cureCalculationResponse } from "../validation/cure";
import {
  batchChangeInput, batchCreateInput, batchListQuery, batchListResponse, batchProduceInput, batchReserveAllInput, batchResponse, batchTraceResponse, holdReleaseInput, lotTraceResponse,
  reserveAllResponse, traceQuery,
} from "../validation/batches";
import { gs1LabelResponse, gs1ParseInput } from "../validation/gs1";
import { jobHealthResponse, retryJobResponse, runScanResponse } from "../validation/jobs";
import { periodListQuery, periodListResponse, periodMonthParams, periodReopenInput, periodResponse } from "../validation/periods";
import { houseLimitsInput, houseLimitsResponse } from "../validation/house-limits";
import { itemCreateInput, itemListQuery, itemPatchInput } from "../validation/items";
import {
  supplierCreateInput, supplierItemCreateInput, supplierItemListQuery, supplierItemListResponse, supplierItemPatchInput, supplierItemResponse,
  supplierListQuery, supplierListResponse, supplierPatchInput, supplierResponse,
} from "../validation/suppliers";
import {
  purchaseOrderCreateInput, purchaseOrderListQuery, purchaseOrderListResponse, purchaseOrderPatchInput, purchaseOrderReasonInput, purchaseOrderResponse,
} from "../validation/purchase-orders";
import {
  deliveryKeyedInput, deliveryLineInput, deliveryLinePatchInput, deliveryListQuery, deliveryListResponse, deliveryPatchInput, deliveryResponse,
} from "../validation/deliveries";
import {
  itemPricesQuery, itemPricesResponse, priceListImportListResponse, priceListResultResponse, priceListUploadQuery,
} from "../validation/price-lists";
import { priceVarianceQueryFields, priceVarianceResponse } from "../validation/price-variance";
import { reorderOrdersInput, reorderOrdersResponse, reorderSuggestionsQuery, reorderSuggestionsResponse } from "../validation/reorder";
import { recipeCreateInput, recipeGetQuery, recipeListQuery, recipeListResponse, recipeResponse, recipeVersionInput } from "../validation/recipes";
import {
  countSheetInput, movementInput, reverseInput, stockLevelInput, transferDeclineInput, transferFulfilInput, transferRequestInput, transferRequestsQuery,
} from "../validation/movements";
import { lotsQuery, movementsQuery, stockQuery } from "../validation/stock";
import {
  capturedMailListResponse, companyResponse, errorResponse, invitationListResponse, invitationSummaryResponse, kitchenListResponse,
  kitchenResponse, meResponse, okMessageResponse, okResponse, openApiDocumentResponse, signInResponse, userListResponse,
  userSummaryResponse, validationErrorResponse,
} from "../validation/responses";
import {
  countPostedResponse, expiringLotListResponse, itemListResponse, itemResponse, movementListResponse,
  movementPageResponse, stockLevelResponse, stockResponse, transferFulfilledResponse, transferLotChoicesResponse, transferRequestListResponse, transferRequestResponse,
} from "../validation/responses";
import { DEFAULT_MAX_BODY_BYTES } from "./route";

export const OPENAPI_VERSION = "3.1.0";
export const API_VERSION = "0.1.0";
export const SECURITY_SCHEME = "session";

// ---------------------------------------------------------------------------------------------
// Response schemas must stay what the routes return: a drift fails `tsc`, not a client.
type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
type Assert<T extends true> = T;
export type ResponseShapesMatch = [
  Assert<Same<z.infer<typeof kitchenResponse>, Kitchen>>,
  Assert<Same<z.infer<typeof companyResponse>, Company>>,
  Assert<Same<z.infer<typeof userSummaryResponse>, UserSummary>>,
  Assert<Same<z.infer<typeof invitationSummaryResponse>, InvitationSummary>>,
  Assert<Same<z.infer<typeof capturedMailListResponse>, CapturedMail[]>>,
  Assert<Same<z.infer<typeof meResponse>, ReturnType<typeof meBody>>>,
  Assert<Same<z.infer<typeof itemResponse>, Item>>,
  Assert<Same<z.infer<typeof supplierResponse>, Supplier>>,
  Assert<Same<z.infer<typeof supplierItemResponse>, SupplierItem>>,
  Assert<Same<z.infer<typeof purchaseOrderResponse>, PurchaseOrder>>,
  Assert<Same<z.infer<typeof purchaseOrderListResponse>, PurchaseOrderPage>>,
  Assert<Same<z.infer<typeof reorderSuggestionsResponse>, ReorderSuggestions>>,
  Assert<Same<z.infer<typeof reorderOrdersResponse>, { orders: PurchaseOrder[] }>>,
  Assert<Same<z.infer<typeof casingCalculationResponse>, CasingCalculation>>,
  Assert<Same<z.infer<typeof recipeResponse>, Recipe>>,
  Assert<Same<z.infer<typeof batchResponse>, Batch>>,
  Assert<Same<z.infer<typeof reserveAllResponse>, ReserveAllResult>>,
  Assert<Same<z.infer<typeof lotTraceResponse>, LotTrace>>,
  Assert<Same<z.infer<typeof batchTraceResponse>, BatchTrace>>,
  Assert<Same<z.infer<typeof recipeListResponse>, { recipes: RecipeSummary[] }>>,
  Assert<Same<z.infer<typeof transferLotChoicesResponse>, TransferLotChoices>>,
  Assert<Same<z.infer<typeof transferRequestResponse>, TransferRequest>>,
  Assert<Same<z.infer<typeof priceListResultResponse>, PriceListResult>>,
  Assert<Same<z.infer<typeof priceListImportListResponse>, { imports: PriceListImport[] }>>,
  Assert<Same<z.infer<typeof itemPricesResponse>, ItemPrices>>,
  Assert<Same<z.infer<typeof alertResponse>, Alert>>,
  Assert<Same<z.infer<typeof jobHealthResponse>, JobHealth>>,
  Assert<Same<z.infer<typeof periodResponse>, Period>>,
  Assert<Same<z.infer<typeof periodListResponse>, PeriodList>>,
  Assert<Same<z.infer<typeof dashboardResponse>, Dashboard>>,
  Assert<Same<z.infer<typeof priceVarianceResponse>, PriceVarianceReport>>,
  Assert<Same<z.infer<typeof usageResponse>, UsageReport>>,
  Assert<Same<z.infer<typeof valuationResponse>, ValuationReport>>,
  Assert<Same<z.infer<typeof accountMappingResponse>, AccountMapping>>,
  Assert<Same<z.infer<typeof journalResponse>, Journal>>,
];

// ---------------------------------------------------------------------------------------------
// Request bodies: named clones of the routes' own schemas, with notes a reader needs.

type FieldNotes = Record<string, { description?: string; format?: string; example?: unknown }>;

/**
 * A clone of `schema` registered as a component, each noted field wrapped with its note. The
 * clone keeps the original's checks (refinements included); the original is never modified.
 */
function requestBody(refId: string, schema: z.ZodObject, notes: FieldNotes = {}): z.ZodType {
  const def = schema._zod.def;
  const shape: Record<string, z.ZodType> = { ...def.shape };
  for (const [key, note] of Object.entries(notes)) {
    const field = shape[key];
    if (!field) throw new Error(`OpenAPI notes name ${refId}.${key}, which the schema does not have.`);
    shape[key] = field.meta(note);
  }
  return schema.clone({ ...def, shape } as typeof def).meta({ id: refId });
}

const EMAIL = { format: "email", description: "Trimmed and lower-cased.", example: "cook@example.com" };
const TIME_ZONE = { description: "An IANA time zone name.", example: "Europe/Vienna" };
const LINK_TOKEN = { description: "The token from the e-mailed link." };
const KITCHEN_IDS = { description: "Kitchens of your company (a kitchen lead acts only in these)." };

const DECIMAL = (description: string, example: string) => ({ description: `${description} A decimal string; a JSON number is 422.`, example });
const ITEM_NOTES: FieldNotes = {
  sku: { description: "Unique in the company; letters, digits, dots, dashes, underscores; kept as typed. Not UUID-shaped (GET /api/items/{id} takes either).", example: "HOG-32-35" },
  category: { description: "casing, cure, spice or ingredient. Fixed once the item has lots." },
  unit: { description: "The stock unit: g, m, ml or pc. A casing in put-ups: pc (one pc = one put-up, fractions allowed); a cure: g. Fixed once the item has lots." },
  trackLots: { description: "Default true. A cure's lots are always tracked (false is 422)." },
  trackDates: { description: "Use-by/best-before per lot; needs trackLots. Default: as trackLots. Always true for a cure." },
  packs: { description: "Purchase packs with exact sizes, e.g. {\"name\": \"25 lb pail\", \"quantity\": \"25\", \"unit\": \"lb\"}; the unit may be any unit of the item, its put-up or another pack. A unit that does not convert is 422 on packs.N.unit." },
  casingKind: { description: "Casings: natural_hog, natural_sheep, natural_beef, collagen, fibrous or cellulose." },
  calibreMinMm: DECIMAL("Casings: smallest calibre in mm (32 of 32/35).", "32"),
  calibreMaxMm: DECIMAL("Casings: largest calibre in mm (35 of 32/35); default the smallest.", "35"),
  putUp: { description: "Casings: hank (hog, sheep), beef_set (beef), tubed_strand, stick or box. Required for natural casings." },
  putUpMetres: DECIMAL("Casings: metres in one put-up. Default 91.44 for a hank (100 yd); required for the other put-ups.", "91.44"),
  capacityKgPerPutUp: DECIMAL("Casings: kg of filling one put-up holds. Default from the trade's calibre table (the lower bound of the band chosen by the lower calibre: a 32/35 mm hog hank holds 45 kg); outside the table a natural casing needs it entered (422).", "45"),
  storage: { description: "Casings: salted, brine or dry. Default salted for natural casings, dry for manufactured." },
  nitriteFraction: DECIMAL("Cures, required: nitrite (the salt in nitriteSalt) as a fraction of the cure's mass, from the label (6.25 % is 0.0625). Never assumed.", "0.0625"),
  nitrateFraction: DECIMAL("Cures, required: nitrate (the salt in nitrateSalt) as a fraction, from the label (0 when there is none). Nitrite plus nitrate is more than 0 and at most 1.", "0"),
  nitriteSalt: { description: "Cures: sodium (default) or potassium nitrite, as printed on the label. Potassium nitrite is checked against the regulation's potassium figures (1.2335 x sodium). Only for cures (422 otherwise).", example: "sodium" },
  nitrateSalt: { description: "Cures: sodium (default) or potassium nitrate, as printed on the label. Only for cures (422 otherwise).", example: "sodium" },
  form: { description: "Spices and ingredients: ground, whole, flakes, liquid, culture..." },
  densityGPerMl: DECIMAL("Spices and ingredients: grams per millilitre, for recipes given by volume. Not for cures (by mass only).", "1.03"),
};

const SUPPLIER_NOTES: FieldNotes = {
  name: { description: "Unique in the company, whatever the case.", example: "Fenwick & Rudd Casings" },
  contactName: { description: "Who to ask for. Default empty." },
  orderEmail: { ...EMAIL, description: "Where orders are e-mailed; trimmed and lower-cased. Left out or null: none.", example: "orders@supplier.example" },
  phone: { description: "Digits, spaces and + ( ) - . /.", example: "+44 1632 960 123" },
  leadTimeDays: { description: "Whole days from order to delivery, 0 to 365 (a JSON integer).", example: 3 },
  minOrderValue: DECIMAL("Minimum order value in the company's currency (every supplier trades in it), at most as many decimals as the currency has; null or left out: no minimum.", "150.00"),
  notes: { description: "Free text, at most 2000 characters." },
  active: { description: "Default true." },
};

const SUPPLIER_ITEM_NOTES: FieldNotes = {
  sku: { description: "The supplier's own code; unique per supplier, whatever the case (409 otherwise).", example: "FR-H3235-B5" },
  description: { description: "As on the supplier's price list." },
  item: { description: "Our stock item, by id or SKU. Not archived. Several supplier items of the same item are alternatives for it.", example: "HOG-32-35" },
  packLabel: { description: "What the supplier calls the pack; left out or empty: the quantity and unit (\"5 hank\").", example: "bundle of 5 hanks" },
  packQuantity: DECIMAL("The pack's size in packUnit.", "5"),
  packUnit: { description: "Any unit of the item: a global unit (kg, lb, m, yd...), its put-up (hank) or one of its packs. Converted exactly to the item's stock unit (packSizeStock); a unit that does not convert is 422 on packUnit, naming both units.", example: "hank" },
  gtin: { description: "GTIN-8, -12, -13 or -14 with a correct check digit (spaces allowed), stored padded to 14 digits. A bad one is 422 on gtin.", example: "036000291452" },
  active: { description: "Default true." },
};

const PURCHASE_ORDER_NOTES: FieldNotes = {
  supplier: { description: "The supplier's id; an active supplier of your company (422 on supplier otherwise)." },
  kitchen: { description: "The delivery kitchen, by id or code; not archived.", example: "YARD" },
  lines: {
    description: "1 to 200 lines: {supplierItem, packs, packPrice?}. supplierItem: an active item of this supplier, once per order (422 on lines.N.supplierItem). packs: whole packs as a string (\"2.5\" is 422 on lines.N.packs). packPrice: the price of one pack in the company's currency, up to 4 decimals; left out: the supplier item's current price (the latest on or before today), and with none known 422 on lines.N.packPrice. Line totals and the order total are worked out by the server.",
    example: [{ supplierItem: "0b8c4f4e-3f7e-4a51-9d7e-2f1d8f0f6a10", packs: "2", packPrice: "189.50" }],
  },
  deliverBy: { description: "Asked-for delivery date, yyyy-mm-dd, today or later; null or left out: none.", example: "2026-12-09" },
  notes: { description: "For the supplier: printed on the PDF and quoted in the e-mail. At most 2000 characters." },
};

const bodies = {
  signIn: requestBody("SignInInput", signInInput, { email: EMAIL }),
  passwordResetRequest: requestBody("PasswordResetRequestInput", passwordResetRequestInput, { email: EMAIL }),
  passwordResetConfirm: requestBody("PasswordResetConfirmInput", passwordResetConfirmInput, { token: LINK_TOKEN }),
  invitationAccept: requestBody("InvitationAcceptInput", invitationAcceptInput, {
    token: LINK_TOKEN,
    name: { description: "Overrides the name the admin typed in the invitation." },
  }),
  companyUpdate: requestBody("CompanyUpdateInput", companyUpdateInput, {
    timeZone: TIME_ZONE,
    currency: { description: "ISO 4217 code, upper-cased.", example: "EUR" },
    weekStart: { description: "The first day of the planning week: monday, sunday or saturday. Left out: unchanged.", example: "sunday" },
    approvalThreshold: DECIMAL("Buyers approve purchase orders up to this total, managers and admins above it; in the currency sent, at most its decimals (422 otherwise). Left out: unchanged.", "750.00"),
    scanSeparator: { description: "What the company's scanners type instead of GS (ASCII 29) on case labels, used by POST /api/gs1/parse when a request sends no separator: 1 to 8 characters, at least one never found in GS1 data (e.g. | ~ ^ #); 422 otherwise. null: none. Left out: unchanged.", example: "|" },
    costFormula: { description: "The reports' cost formula (IAS 2): fifo or average. Changeable only while no month is closed (409 COST_FORMULA_LOCKED). Left out: unchanged.", example: "fifo" },
    expiryWindows: { description: "The expiry scan's warnings per category (cure, casing, spice, ingredient): whole days before a lot's date, 1-3650, at most five, each once; [] for none. A category sent replaces its list; one left out is unchanged.", example: { cure: [60, 30, 7] } },
  }),
  kitchenCreate: requestBody("KitchenCreateInput", kitchenCreateInput, {
    code: { description: "Unique in the company; upper-cased.", example: "NORTH-1" },
    timeZone: { ...TIME_ZONE, description: "An IANA time zone name; null: the company's." },
  }),
  kitchenUpdate: requestBody("KitchenUpdateInput", kitchenUpdateInput, {
    code: { description: "Unique in the company; upper-cased.", example: "NORTH-1" },
    timeZone: { ...TIME_ZONE, description: "An IANA time zone name; null: the company's." },
    archived: { description: "true hides the kitchen from pickers; false brings it back." },
  }),
  invitationCreate: requestBody("InvitationCreateInput", invitationCreateInput, {
    email: EMAIL,
    kitchenIds: { description: "Kitchens of your company; a kitchen lead needs at least one." },
  }),
  itemCreate: requestBody("ItemCreateInput", itemCreateInput, ITEM_NOTES),
  recipeCreate: requestBody("RecipeCreateInput", recipeCreateInput, {
    code: { description: "1 to 16 letters, digits or dashes, upper-cased; batch codes start with it.", example: "FARM-1" },
    productClass: { description: "Fixes the cure method and the limits checked. Dry and fermented sausages are comminuted (chopped), never dry_cured." },
    meatBlock: { description: "Meat and fat by share of the block's green weight; the shares add up to 100. Every rate is per kg of this block.", example: [{ name: "Pork shoulder, lean", percent: "70" }, { name: "Back fat", percent: "30" }] },
    lines: { description: "Non-meat items: rate in g/kg, % or ml/kg of the meat block (basis meat_block) or of the pickle (basis pickle). ml/kg needs the item's density; cure only by mass. A cure over a statutory maximum is 422 on lines.N.rate." },
    pickle: { description: "Pumped and immersion-cured products only: kg of pickle per kg of meat, and (pumped) the pump level as a fraction of green weight." },
    casing: { description: "A casing item, or a calibre range (an item must lie within it), with a link length or a link weight." },
  }),
  casingCalculation: requestBody("CasingCalculationInput", casingCalculationInput, {
    fillingMass: { description: "Everything stuffed: meat block plus water, salt, cure and spices, in any mass unit.", example: { quantity: "90", unit: "kg" } },
    item: { description: "A casing item by id or SKU.", example: "HOG-32-35" },
  }),
  cureCalculation: requestBody("CureCalculationInput", cureCalculationInput, {
    method: { description: "comminuted (cure mixed into chopped meat), dry (a mix rubbed on; cures[].quantity is the mix applied), pumped (pickle injected) or immersion (cuts covered in pickle)." },
    productClass: { description: "Default from the method. comminuted covers every chopped or ground product, dry and fermented sausages included (never dry_cured); dry_cured, immersion_cured, pumped; bacon_pumped, bacon_immersion, bacon_dry (9 CFR 424.22(b)). A class the method cannot make is 422." },
    storage: { description: "keep_refrigerated adds the 120 ppm minimum (FSIS policy, a warning); shelf_stable does not. Left out: not checked (a note says so)." },
    table: { description: "us, eu or none; default the company's (Settings > Company). eu needs batchMass. none: no check, nothing blocked." },
    meatBlock: { description: "Green weight of the meat block, any mass unit; every US ppm is on it.", example: { quantity: "1", unit: "kg" } },
    cures: { description: "One or more cures; they add up. Each: quantity and unit (left out for the one cure of an inverse calculation), nitriteFraction (required, from the label: 6.25 % is \"0.0625\"), nitrateFraction, nitriteSalt/nitrateSalt (sodium by default, or potassium).", example: [{ quantity: "2.5", unit: "g", nitriteFraction: "0.0625" }] },
    cure: { description: "A single cure instead of cures." },
    pickle: { description: "Pumped and immersion: the pickle's weight (the cures are what is dissolved in it)." },
    pumpFraction: DECIMAL("Pumped: pickle injected per green weight (10 % is 0.1).", "0.1"),
    batchMass: { description: "EU: the whole batch (meat and everything added); EU figures are mg per kg of it. Required with table eu." },
    heatTreatment: { description: "EU: not_heat_treated (08.3.1), heat_treated or sterilised (08.3.2)." },
    targetNitritePpm: DECIMAL("Inverse: the nitrite wanted (ppm of the cure's nitrite salt); give one cure without quantity and get requiredCure.", "120"),
  }),
  movement: requestBody("MovementInput", movementInput, {
    kind: { description: "receipt, transfer, use, waste, adjustment or count." },
    kitchen: { description: "The kitchen's code.", example: "YARD" },
    item: { description: "The item's id or SKU.", example: "HOG-32-35" },
    quantity: DECIMAL("Positive; an adjustment is signed and non-zero; a count is the counted quantity (zero or more).", "2.5"),
    unit: { description: "Any unit of the item: g, kg, oz, lb, m, yd, ml, l, its put-up (hank...) or a pack name.", example: "hank" },
    lot: { description: "A receipt: the new lot {code, date, dateKind, unitCost (per the unit typed)} or an existing lot's id. Other kinds: an existing lot's id, or leave it out to draw first-expired-first-out (expired lots skipped)." },
    toKitchen: { description: "Transfers: the receiving kitchen's code.", example: "LANE" },
    reason: { description: "Required for waste." },
    occurredAt: { description: "When it happened; may be back-dated, never in the future. Default now." },
  }),
  reverse: requestBody("ReverseInput", reverseInput),
  periodReopen: requestBody("PeriodReopenInput", periodReopenInput, {
    reason: { description: "Why the month is reopened (1 to 500 characters); kept on the audit trail.", example: "Supplier credit note for a March delivery booked late" },
  }),
  transferRequest: requestBody("TransferRequestInput", transferRequestInput, {
    fromKitchen: { description: "The kitchen asked to send, by code.", example: "LANE" },
    toKitchen: { description: "Your kitchen, which receives, by code.", example: "YARD" },
    quantity: DECIMAL("Above zero, in unit.", "2"),
    batch: { description: "The planned batch whose shortage this is for (its bill of materials' suggestion): planned in toKitchen, still planned or reserved, with the item on a line. One open request per batch and item." },
  }),
  transferFulfil: requestBody("TransferFulfilInput", transferFulfilInput, {
    lot: { description: "The id of the lot to send: a lot of the requested item with enough available in the sending kitchen (GET /api/transfer-requests/{id}/lots lists them). Left out: first-expired-first-out, expired lots skipped. An expired lot named here is sent (the ledger refuses only to use one)." },
  }),
  transferDecline: requestBody("TransferDeclineInput", transferDeclineInput),
  alertPreferences: requestBody("AlertPreferencesInput", alertPreferencesInput, {
    alertEmail: { description: "off, digest (one e-mail a day at digestHour) or immediate (after each check that finds something).", example: "digest" },
    digestHour: { description: "The digest's hour, 0-23, in your time zone (your profile's, else the company's).", example: 7 },
    alertKinds: { description: "Which kinds to e-mail: expiry, reorder, shortage. null: your role's default.", example: ["expiry", "shortage"] },
  }),
  alertSnooze: requestBody("AlertSnoozeInput", alertSnoozeInput, {
    until: { description: "Snooze until this instant (in the future, at most 30 days ahead).", format: "date-time", example: "2026-12-03T08:00:00+01:00" },
    hours: { description: "Or: snooze for this many whole hours from now (1-720).", example: 24 },
  }),
  countSheet: requestBody("CountSheetInput", countSheetInput, {
    kitchen: { description: "The kitchen's code.", example: "YARD" },
    lines: { description: "One line per item (per lot for lot-tracked items): counted quantity and unit. All lines post together or none." },
  }),
  stockLevel: requestBody("StockLevelInput", stockLevelInput, {
    parLevel: DECIMAL("In unit (default the stock unit); null clears it.", "4"),
    reorderPoint: DECIMAL("In unit; not above the par level; null clears it.", "2"),
  }),
  supplierCreate: requestBody("SupplierCreateInput", supplierCreateInput, SUPPLIER_NOTES),
  supplierPatch: requestBody("SupplierPatchInput", supplierPatchInput, {
    ...SUPPLIER_NOTES,
    orderEmail: { ...SUPPLIER_NOTES.orderEmail, description: "Where orders are e-mailed; null clears it." },
    minOrderValue: { ...SUPPLIER_NOTES.minOrderValue, description: "In the company's currency, at most its decimals; null clears it (no minimum). A decimal string; a JSON number is 422." },
    active: { description: "false takes the supplier off the buying lists; its items and history stay." },
  }),
  supplierItemCreate: requestBody("SupplierItemCreateInput", supplierItemCreateInput, SUPPLIER_ITEM_NOTES),
  supplierItemPatch: requestBody("SupplierItemPatchInput", supplierItemPatchInput, {
    ...SUPPLIER_ITEM_NOTES,
    gtin: { ...SUPPLIER_ITEM_NOTES.gtin, description: "GTIN-8, -12, -13 or -14 with a correct check digit (spaces allowed), stored padded to 14 digits; null clears it." },
    active: { description: "false takes the supplier item off the buying lists; it stays on record." },
  }),
  purchaseOrderCreate: requestBody("PurchaseOrderCreateInput", purchaseOrderCreateInput, PURCHASE_ORDER_NOTES),
  purchaseOrderPatch: requestBody("PurchaseOrderPatchInput", purchaseOrderPatchInput, {
    kitchen: PURCHASE_ORDER_NOTES.kitchen!,
    notes: PURCHASE_ORDER_NOTES.notes!,
    lines: { ...PURCHASE_ORDER_NOTES.lines, description: `Replaces every line. ${PURCHASE_ORDER_NOTES.lines!.description}` },
    deliverBy: { description: "yyyy-mm-dd, today or later; null clears it.", example: "2026-12-09" },
  }),
  reorderOrders: requestBody("ReorderOrdersInput", reorderOrdersInput, {
    kitchen: { description: "The delivery kitchen, by id or code; of your company (422 on kitchen otherwise), not archived, where you may draft orders (403).", example: "YARD" },
    lines: {
      description: "1 to 500 lines: {supplierItemId, packs, packPrice?}, as the suggestion chose them or changed. supplierItemId: an active item of an active supplier of your company, once per request (422 on lines.N.supplierItemId). packs: whole packs as a string. packPrice: only needed when the supplier item has no current price (422 on lines.N.packPrice otherwise). The lines make one draft per supplier.",
      example: [{ supplierItemId: "0b8c4f4e-3f7e-4a51-9d7e-2f1d8f0f6a10", packs: "4" }],
    },
  }),
  deliveryKeyed: requestBody("DeliveryKeyedInput", deliveryKeyedInput, {
    kitchen: { description: "The receiving kitchen, by id or code.", example: "YARD" },
    order: { description: "The purchase order the delivery is against (sent or partly received, this supplier's, this kitchen's). Left out: the supplier's open orders for the kitchen, oldest first." },
    lines: { description: "Lines as the note has them: quantity in the supplier's packs, unitPrice per pack; may be empty and filled one by one (POST .../lines)." },
  }),
  deliveryLine: requestBody("DeliveryLineInput", deliveryLineInput, {
    source: { description: "keyed (typed in) or scan (read from a case label: GTIN, lot and date)." },
    quantity: DECIMAL("Packs as the note counts them.", "4"),
    gtin: { description: "GTIN-8/12/13/14; stored as GTIN-14 and matched to the supplier's items." },
  }),
  deliveryPatch: requestBody("DeliveryPatchInput", deliveryPatchInput, {
    freight: DECIMAL("Freight on the note, in the company's currency (at most its decimals); spread over the accepted lines by value into the landed cost.", "18.00"),
  }),
  deliveryLinePatch: requestBody("DeliveryLinePatchInput", deliveryLinePatchInput, {
    decision: { description: "accept, reject or pending. An expired line cannot be accepted (422 on decision); a line naming no supplier item neither (422 on corrections.supplierItem)." },
  }),
  purchaseOrderReason: requestBody("PurchaseOrderReasonInput", purchaseOrderReasonInput, {
    reason: { description: "Why, in a few words (1 to 500 characters); kept on the order and shown in its history.", example: "Supplier out of stock until March" },
  }),
  itemPatch: requestBody("ItemPatchInput", itemPatchInput, {
    ...ITEM_NOTES,
    packs: { description: "Replaces every pack of the item." },
    archived: { description: "true hides the item from lists and pickers; false brings it back. Its records stay." },
  }),
  gs1Parse: requestBody("Gs1ParseInput", gs1ParseInput, {
    data: {
      description: "What the scanner typed: an element string with GS (ASCII 29, \\u001d in JSON) after each variable-length value that is not last, optionally led by a symbology identifier (]C1, ]d2, ]Q3, ]e0; ]E0, ]E4, ]I1 carry a bare GTIN); or the bracketed form printed under the barcode; or a bare GTIN-8/12/13/14. At most 2500 characters.",
      example: "]C10112345678901231172703001012345",
    },
    separator: {
      description: "The character(s) a keyboard-wedge scanner types instead of GS, e.g. \"|\". 1 to 8 characters, at least one of them never part of GS1 data (not a letter, digit or one of ! \" % & ' ( ) * + , - . / : ; < = > ? _). GS is always accepted as well. Left out: the company's scanSeparator, if it has one.",
      example: "|",
    },
  }),
  userUpdate: requestBody("UserUpdateInput", userUpdateInput, {
    kitchenIds: { ...KITCHEN_IDS, description: "Replaces the user's kitchens. Kitchens of your company; a kitchen lead needs at least one." },
    disabled: { description: "true signs the user out everywhere and refuses sign-in." },
  }),
};

// ---------------------------------------------------------------------------------------------
// Errors: what the wrapper adds, plus what each endpoint's data layer can throw.

type ErrorStatus = 400 | 401 | 403 | 404 | 409 | 413 | 415 | 422 | 429 | 500 | 503;
/** [code, when it happens] */
type Cause = readonly [code: string, when: string];

const WRAPPER = {
  badJson: ["BAD_REQUEST", "The body is not valid JSON."],
  unauthenticated: ["UNAUTHENTICATED", "No valid session: the hl_session cookie is missing or expired, or the account is disabled."],
  crossSite: ["FORBIDDEN", "Sent from a browser on another site: the Origin header names another host."],
  tooLarge: ["PAYLOAD_TOO_LARGE", `The body is larger than ${DEFAULT_MAX_BODY_BYTES} bytes.`],
  mediaType: ["UNSUPPORTED_MEDIA_TYPE", "The body is not sent as application/json."],
  invalid: ["VALIDATION", "A field is missing or not valid (a JSON number where a decimal string is expected, too); details.fields names every bad field."],
  keyInvalid: ["VALIDATION", "The Idempotency-Key is longer than 200 characters, or was used before with a different body."],
  keyBusy: ["CONFLICT", "The first request with this Idempotency-Key is still being processed: retry shortly with the same key."],
  internal: ["INTERNAL", "Our side failed; the message never carries internals. Try again later."],
  internalKeyed: ["INTERNAL", "Our side failed; the Idempotency-Key is released, so a retry with the same key runs the request again."],
} as const satisfies Record<string, Cause>;

const STATUS_TITLES: Record<ErrorStatus, string> = {
  400: "Bad request",
  401: "Not signed in",
  403: "Forbidden",
  404: "Not found",
  409: "Conflict",
  413: "Payload too large",
  415: "Unsupported media type",
  422: "Validation failed",
  429: "Rate limited",
  500: "Internal error",
  503: "Service unavailable",
};

const ADMIN_ONLY = (what: string): Cause => ["FORBIDDEN", `Your role may not ${what} (admins only).`];

// ---------------------------------------------------------------------------------------------
// The endpoints. One entry per exported handler in app/api/**/route.ts.

type Method = "get" | "post" | "put" | "patch" | "delete";

export interface EndpointDoc {
  method: Method;
  /** OpenAPI form: /api/kitchens/{id} for app/api/kitchens/[id]/route.ts */
  path: string;
  operationId: string;
  tag: TagName;
  summary: string;
  description: string;
  /** false: reachable without a session (the route's `auth: false`). */
  auth: boolean;
  body?: z.ZodType;
  /** A multipart/form-data upload the route streams itself (no `body` in route()): the parts. */
  upload?: z.ZodType;
  idempotent?: boolean;
  params?: z.ZodObject;
  query?: z.ZodObject;
  success: {
    status: 200 | 201 | 202;
    description: string;
    schema: z.ZodType;
    setsCookie?: string;
    /** A file download (e.g. application/pdf, or the types a stored file may be) instead of JSON; schema then describes the bytes. */
    mediaType?: string | readonly string[];
  };
  /** What the endpoint itself (its data-layer calls) can answer, beyond the wrapper's errors. */
  errors?: Partial<Record<ErrorStatus, Cause[]>>;
}

export const TAGS = [
  { name: "Auth", description: "Signing in and out, password resets. Reachable without a session." },
  { name: "Account", description: "The signed-in user." },
  { name: "Company", description: "The company every record belongs to." },
  { name: "Kitchens", description: "The company's kitchens: where stock lives and who may act where." },
  { name: "Items", description: "The catalogue: casings, cures, spices and other ingredients, with their purchase packs." },
  { name: "Suppliers", description: "Who we buy from: contacts, lead time, minimum order, and each supplier's items with their SKU, pack and GTIN." },
  { name: "Purchase orders", description: "Orders to suppliers: drafted, approved (buyers up to the company's approval threshold, managers above it), e-mailed to the supplier with a PDF and a CSV, closed short or cancelled." },
  { name: "Deliveries", description: "Receiving a supplier's delivery note (CSV, keyed in or scanned): each line matched to the open orders with its findings, decided by the buyer, then posted as receipts with the landed cost." },
  { name: "Stock", description: "On hand, reserved and available per kitchen and lot; par levels; lots about to expire." },
  { name: "Ledger", description: "Movements: receipts, transfers, use, waste, adjustments and counts; reversals; count sheets." },
  { name: "GS1 labels", description: "Reading the barcodes on case labels (GS1-128, GS1 DataMatrix, GS1 QR, EAN/UPC, ITF-14) for buying and receiving." },
  { name: "Planning", description: "Calculators and, as they land, recipes, batch plans and reservations." },
  { name: "Users", description: "People in the company, their roles and kitchens. Admins only." },
  { name: "Invitations", description: "Single-use e-mailed links that create accounts." },
  { name: "Mail catcher", description: "Local development only: e-mail caught instead of sent." },
  { name: "Dashboard", description: "The Overview: cure expiring soon, items below their reorder point, next week's shortages, stock value by kitchen and the usage trend, over the kitchens you may read. Money by the company's cost formula (FIFO cost or moving average cost)." },
  { name: "Alerts", description: "What the daily scans found (lots near their date, items below their reorder point, batches short of stock), per kitchen, with each user's acknowledgements and snoozes." },
  { name: "Reports", description: "The accountant's reports: usage and cost by month, stock valuation at a date (by the company's cost formula, FIFO or moving average, per kitchen), price variance, the movement journal with account codes from the accountant's mapping; JSON or CSV." },
  { name: "Jobs", description: "The background jobs behind alerts and e-mail (admins): queue counts, your company's failed jobs, each scan's last and next run, running a scan now." },
  { name: "Periods", description: "Closing months (calendar months in the company's time zone): once a month is closed, stock movements dated in it are refused (409 PERIOD_CLOSED) and corrections go into the open months. Months close in order; only admins reopen, with a reason; every close and reopen is on the audit trail." },
  { name: "Reference", description: "This document." },
] as const;
type TagName = (typeof TAGS)[number]["name"];

const idParam = (what: string) =>
  z.object({
    id: z.uuid().meta({ description: `The ${what}'s id. An id that is not a UUID, or not in your company, answers 404.` }),
  });

const BATCH_ID = z.object({ id: z.uuid().meta({ description: "The batch's id. Not in your company: 404." }) });

const PURCHASING_READ: Cause = ["FORBIDDEN", "Your role may not see buying (admins, managers, buyers and accountants only)."];
const PURCHASING_MANAGE: Cause = ["FORBIDDEN", "Your role may not manage suppliers (admins, managers and buyers only)."];

const PURCHASING_ORDERS: Cause = ["FORBIDDEN", "Your role may not draft, change, send, close or cancel orders (admins, managers and buyers only)."];
const ORDER_NOT_FOUND: Cause = ["NOT_FOUND", "No such order in your company (another company's order is 404 too)."];
const ORDER_STATUS = (when: string): Cause => ["ORDER_STATUS", `The step does not fit the order's status: ${when}. The message says why; details.status is the status.`];
const PDF_FILE = z.string().meta({ id: "PurchaseOrderPdf", description: "The PDF's bytes.", format: "binary" });
const CSV_FILE = z.string().meta({ id: "PurchaseOrderCsv", description: "UTF-8 CSV text, CRLF line ends, a header row." });

const SUPPLIER_ITEM_PARAMS = z.object({
  id: z.uuid().meta({ description: "The supplier's id. Not in your company: 404." }),
  supplierItemId: z.uuid().meta({ description: "The supplier item's id; an item of another supplier answers 404." }),
});

const ITEM_REF = z.object({
  id: z.string().meta({ description: "The item's id (a UUID) or its SKU. Not in your company: 404.", example: "HOG-32-35" }),
});

const PRICE_LIST_UPLOAD = z
  .object({
    file: z.string().meta({ format: "binary", description: "The price list: CSV or text (.csv, .txt, .tsv), at most 25 MB; UTF-8 with or without a byte-order mark, UTF-16 with one, or Windows-1252; comma, semicolon, tab or | between cells. Its type is read from its first bytes (a workbook renamed .csv is 422)." }),
    mapping: z.string().optional().meta({
      description: "The column mapping as JSON (CsvMapping): headerRow (1; 0 = no header), columns (field -> {\"header\": \"Price\"} or {\"column\": 3}) for sku and price (required) and description, pack, packQuantity, packUnit, gtin, currency, effectiveFrom; delimiter (null = detect), decimal \".\" or \",\", thousands \"\", \".\", \",\", \" \" or \"'\", dateFormat. Left out: the mapping remembered for this supplier (saved when a list is applied) if the file has its columns, else one proposed from the headers.",
      example: "{\"columns\":{\"sku\":{\"header\":\"Artikelnummer\"},\"price\":{\"header\":\"Preis\"}},\"decimal\":\",\",\"thousands\":\".\",\"dateFormat\":\"dd.MM.yyyy\"}",
    }),
    effectiveFrom: z.string().optional().meta({ description: "yyyy-mm-dd: when the prices take effect, for rows without a date of their own (an effectiveFrom column). Default the company's today.", example: "2027-01-01" }),
    dryRun: z.enum(["true", "false"]).optional().meta({ description: "true: the preview; nothing is written but the upload record. Default false (apply). ?dryRun=true on the query does the same." }),
  })
  .meta({ id: "PriceListUpload" });

const DELIVERY_UPLOAD = z
  .object({
    file: z.string().meta({ format: "binary", description: "The delivery note as CSV, at most 25 MB (encodings and delimiters as for price lists)." }),
    supplier: z.uuid().meta({ description: "The supplier's id." }),
    kitchen: z.string().meta({ description: "The receiving kitchen's id or code.", example: "YARD" }),
    order: z.uuid().optional().meta({ description: "The purchase order (sent or partly received). Left out: the supplier's open orders for the kitchen, oldest first." }),
    noteNumber: z.string().optional().meta({ description: "The delivery note number, when the file has no column for it." }),
    noteDate: z.string().optional().meta({ description: "yyyy-mm-dd." }),
    mapping: z.string().optional().meta({ description: "A CsvMapping as JSON: columns for noteNumber, sku, gtin, description, quantity (packs, required), pack, unitPrice (per pack), lot, date, dateKind. Left out: the one remembered for this supplier, else one proposed from the headers." }),
  })
  .meta({ id: "DeliveryUpload" });

const DELIVERY_DOCUMENT_FILE = z.string().meta({ id: "DeliveryDocumentFile", description: "The stored note's bytes, as uploaded.", format: "binary" });
const DELIVERY_DOCUMENT_UPLOAD = z
  .object({ file: z.string().meta({ format: "binary", description: "The paper delivery note: PDF, JPEG, PNG, HEIC or WebP, at most 25 MB." }) })
  .meta({ id: "DeliveryDocumentUpload" });

const sessionCookieNote = (what: string) => `The ${SESSION_COOKIE} cookie (HttpOnly, SameSite=Lax, Path=/; Secure over HTTPS) ${what}.`;

export const ENDPOINTS: readonly EndpointDoc[] = [
  // Auth ----------------------------------------------------------------------------------
  {
    method: "post", path: "/api/auth/sign-in", operationId: "signIn", tag: "Auth", auth: false,
    summary: "Sign in",
    description: "Checks the e-mail and password and starts a 30-day session (extended while in use). Repeated failures for one e-mail are slowed down.",
    body: bodies.signIn,
    success: { status: 200, description: "Signed in: the user, and the session cookie.", schema: signInResponse, setsCookie: sessionCookieNote("carrying the new session") },
    errors: {
      401: [["UNAUTHENTICATED", "The e-mail or password is wrong (the same answer for an unknown e-mail or a disabled account)."]],
      429: [["RATE_LIMITED", "Too many failed sign-ins for this e-mail; details.retryAfterSeconds and Retry-After say when to try again."]],
    },
  },
  {
    method: "post", path: "/api/auth/sign-out", operationId: "signOut", tag: "Auth", auth: false,
    summary: "Sign out",
    description: "Ends the current session, if any, and clears the cookie. Safe to call when already signed out.",
    success: { status: 200, description: "Signed out.", schema: okResponse, setsCookie: sessionCookieNote("emptied, Max-Age=0") },
  },
  {
    method: "post", path: "/api/auth/password-reset", operationId: "requestPasswordReset", tag: "Auth", auth: false,
    summary: "Ask for a password reset link",
    description: "E-mails a reset link, valid for one hour, to an active account with this address. The answer is the same whether or not the address is known.",
    body: bodies.passwordResetRequest,
    success: { status: 202, description: "Accepted; a link is on its way if the account exists.", schema: okMessageResponse },
  },
  {
    method: "post", path: "/api/auth/password-reset/confirm", operationId: "confirmPasswordReset", tag: "Auth", auth: false,
    summary: "Set a new password from a reset link",
    description: "Sets the password, spends the link and signs the account out everywhere. Sign in again afterwards.",
    body: bodies.passwordResetConfirm,
    success: { status: 200, description: "Password changed.", schema: okResponse },
    errors: {
      404: [["NOT_FOUND", "No such reset link."]],
      409: [["RESET_USED", "The link has already been used."], ["RESET_EXPIRED", "The link is older than one hour."]],
    },
  },
  // Account -------------------------------------------------------------------------------
  {
    method: "get", path: "/api/me", operationId: "getMe", tag: "Account", auth: true,
    summary: "The signed-in user",
    description: "Who is signed in: role, company and the kitchens the user acts in.",
    success: { status: 200, description: "The user.", schema: meResponse },
  },
  {
    method: "get", path: "/api/me/preferences", operationId: "getMyPreferences", tag: "Account", auth: true,
    summary: "Your alert e-mail preferences",
    description: "How alerts reach you by e-mail: off, a daily digest at your hour in your time zone, or at once; and which kinds. Everyone may read their own.",
    success: { status: 200, description: "Your preferences.", schema: alertPreferencesResponse },
  },
  {
    method: "put", path: "/api/me/preferences", operationId: "setMyPreferences", tag: "Account", auth: true,
    summary: "Change your alert e-mail preferences",
    description: "Replaces all three settings. An alert already e-mailed to you is never e-mailed again, whatever you change; switching to a digest starts from now.",
    body: bodies.alertPreferences,
    success: { status: 200, description: "Your preferences as saved.", schema: alertPreferencesResponse },
    errors: { 422: [["VALIDATION", "A mode other than off/digest/immediate, an hour outside 0-23, or an unknown or repeated kind (details.fields names it)."]] },
  },
  // Company -------------------------------------------------------------------------------
  {
    method: "get", path: "/api/company", operationId: "getCompany", tag: "Company", auth: true,
    summary: "Your company",
    description: "Name, default time zone, currency, the first day of the planning week and the purchase order approval threshold of the signed-in user's company.",
    success: { status: 200, description: "The company.", schema: companyResponse },
  },
  {
    method: "patch", path: "/api/company", operationId: "updateCompany", tag: "Company", auth: true,
    summary: "Change the company",
    description: "Replaces the company's name, default time zone and currency (all three are required) and, when sent, the first day of the planning week (weekStart), the purchase order approval threshold (approvalThreshold), the receiving checks (receiving), the scanners' stand-in for GS (scanSeparator), the expiry scan's warning windows (expiryWindows) and the cost formula (costFormula); left out: unchanged. Admins only.",
    body: bodies.companyUpdate,
    success: { status: 200, description: "The company as saved.", schema: companyResponse },
    errors: { 403: [ADMIN_ONLY("manage the company")], 409: [["COST_FORMULA_LOCKED", "A change of the cost formula while a month is closed."]] },
  },
  // Kitchens ------------------------------------------------------------------------------
  {
    method: "get", path: "/api/kitchens", operationId: "listKitchens", tag: "Kitchens", auth: true,
    summary: "List kitchens",
    description: "Every kitchen of the company, by code. Everyone may read them (availability is shown across kitchens).",
    query: z.object({
      archived: z.enum(["true", "false"]).optional().meta({ description: "true includes archived kitchens." }),
    }),
    success: { status: 200, description: "The kitchens.", schema: kitchenListResponse },
  },
  {
    method: "post", path: "/api/kitchens", operationId: "createKitchen", tag: "Kitchens", auth: true, idempotent: true,
    summary: "Create a kitchen",
    description: "Adds a kitchen to the company. Send an Idempotency-Key so a retried request cannot create it twice.",
    body: bodies.kitchenCreate,
    success: { status: 201, description: "The new kitchen.", schema: kitchenResponse },
    errors: {
      403: [ADMIN_ONLY("manage kitchens")],
      409: [["CONFLICT", "A kitchen with this code already exists (details.fields.code)."]],
    },
  },
  {
    method: "get", path: "/api/kitchens/{id}", operationId: "getKitchen", tag: "Kitchens", auth: true,
    summary: "One kitchen",
    description: "A kitchen of your company.",
    params: idParam("kitchen"),
    success: { status: 200, description: "The kitchen.", schema: kitchenResponse },
    errors: { 404: [["NOT_FOUND", "No such kitchen in your company (another company's kitchen is 404 too)."]] },
  },
  {
    method: "patch", path: "/api/kitchens/{id}", operationId: "updateKitchen", tag: "Kitchens", auth: true,
    summary: "Change or archive a kitchen",
    description: "Changes only the fields sent. Archiving keeps the kitchen's history and hides it from pickers.",
    params: idParam("kitchen"),
    body: bodies.kitchenUpdate,
    success: { status: 200, description: "The kitchen as saved.", schema: kitchenResponse },
    errors: {
      403: [ADMIN_ONLY("manage kitchens")],
      404: [["NOT_FOUND", "No such kitchen in your company."]],
      409: [["CONFLICT", "Another kitchen already has this code (details.fields.code)."]],
    },
  },
  // Stock and ledger ------------------------------------------------------------------------
  {
    method: "get", path: "/api/stock", operationId: "getStock", tag: "Stock", auth: true,
    summary: "Stock per kitchen",
    description: "Every item of the company with on hand, reserved and available, and its lots with stock (date, kind, days). With kitchen: that kitchen; without: every kitchen, per kitchen. Read from balances kept with each movement.",
    query: stockQuery.extend({ kitchen: stockQuery.shape.kitchen.meta({ description: "A kitchen code." }) }),
    success: { status: 200, description: "The stock.", schema: stockResponse },
    errors: { 404: [["NOT_FOUND", "No such kitchen in your company."]] },
  },
  {
    method: "get", path: "/api/lots", operationId: "listExpiringLots", tag: "Stock", auth: true,
    summary: "Lots expiring soon",
    description: "Dated lots with stock expiring within N days (default 30), soonest first, with the stock per kitchen; expired ones only with includeExpired=true.",
    query: lotsQuery,
    success: { status: 200, description: "The lots.", schema: expiringLotListResponse },
  },
  {
    method: "put", path: "/api/stock-levels", operationId: "setStockLevel", tag: "Stock", auth: true,
    summary: "Set par level and reorder point",
    description: "For one item in one kitchen. Admins, managers and buyers anywhere; kitchen leads in their own kitchens.",
    body: bodies.stockLevel,
    success: { status: 200, description: "The levels as saved, in the stock unit.", schema: stockLevelResponse },
    errors: { 403: [["FORBIDDEN", "Not your kitchen, or your role may not set levels."]], 404: [["NOT_FOUND", "No such kitchen or item in your company."]] },
  },
  {
    method: "get", path: "/api/movements", operationId: "listMovements", tag: "Ledger", auth: true,
    summary: "Movement history",
    description: "Newest first, filtered by kitchen, item, lot, kind and time; pages by cursor. Each movement carries the name of the person who posted it (userName). format=csv answers text/csv with the same columns plus user (the name; \"former user\" when the user is no longer in the company; empty when none is recorded), X-Next-Cursor header for the next page.",
    query: movementsQuery,
    success: { status: 200, description: "A page of movements.", schema: movementPageResponse },
    errors: { 404: [["NOT_FOUND", "No such kitchen or item in your company."]] },
  },
  {
    method: "post", path: "/api/movements", operationId: "postMovement", tag: "Ledger", auth: true, idempotent: true,
    summary: "Post a movement",
    description: "A receipt creates its lot (a cure needs lot code, date and its kind); withdrawals that name no lot draw first-expired-first-out and may split across lots; a transfer moves a lot's stock to another kitchen; a count sets on hand to the counted quantity and posts the difference. Answers one movement per lot and kitchen touched. Send an Idempotency-Key so a retry cannot post twice.",
    body: bodies.movement,
    success: { status: 201, description: "The movements posted.", schema: movementListResponse },
    errors: {
      403: [["FORBIDDEN", "Not your kitchen, or your role may not post this kind (accountants post nothing; buyers receive)."]],
      404: [["NOT_FOUND", "No such kitchen, item or lot in your company."]],
      409: [["INSUFFICIENT_STOCK", "Not enough available stock (details.available, details.requested, details.unit)."], ["LOT_EXPIRED", "The named lot is past its date and cannot be used (waste it instead)."], ["LOT_EXISTS", "A receipt named a lot code the item already has; receive into it by id."]],
      422: [["VALIDATION", "A unit that does not convert, a wrong sign, a transfer to the same kitchen, a lot of another item, a date in the future... (details.fields)."]],
    },
  },
  {
    method: "post", path: "/api/movements/{id}/reverse", operationId: "reverseMovement", tag: "Ledger", auth: true, idempotent: true,
    summary: "Reverse a movement",
    description: "Posts an equal and opposite movement (both legs of a transfer). Movements are never edited.",
    params: idParam("movement"),
    body: bodies.reverse,
    success: { status: 201, description: "The reversing movements.", schema: movementListResponse },
    errors: {
      403: [["FORBIDDEN", "Not your kitchen, or your role may not post."]],
      404: [["NOT_FOUND", "No such movement in your company."]],
      409: [["ALREADY_REVERSED", "It has been reversed already."], ["CANNOT_REVERSE", "It is itself a reversal."], ["INSUFFICIENT_STOCK", "The stock it added has been used since."]],
    },
  },
  {
    method: "post", path: "/api/counts", operationId: "postCount", tag: "Ledger", auth: true, idempotent: true,
    summary: "Post a count sheet",
    description: "Every line's counted quantity, posted together in one transaction: all or nothing. Each line posts the difference to on hand (recorded also when it is zero).",
    body: bodies.countSheet,
    success: { status: 201, description: "The count's id and its movements.", schema: countPostedResponse },
    errors: {
      403: [["FORBIDDEN", "Not your kitchen, or your role may not count."]],
      404: [["NOT_FOUND", "No such kitchen in your company."]],
      422: [["VALIDATION", "A line is wrong: details.fields names it as lines.N.field."]],
    },
  },
  {
    method: "get", path: "/api/recipes", operationId: "listRecipes", tag: "Planning", auth: true,
    summary: "Recipes",
    description: "The company's recipes with their current version's product class; archived ones with includeArchived=true.",
    query: recipeListQuery,
    success: { status: 200, description: "The recipes, by name.", schema: recipeListResponse },
    errors: { 403: [["FORBIDDEN", "Your role does not read plans and recipes."]] },
  },
  {
    method: "post", path: "/api/recipes", operationId: "createRecipe", tag: "Planning", auth: true, idempotent: true,
    summary: "Write a recipe",
    description: "A new recipe and its version 1. Every line is checked against the catalogue and the cure against the company's table: a recipe over a statutory maximum cannot be saved.",
    body: bodies.recipeCreate,
    success: { status: 201, description: "The recipe with its version 1 and its cure check.", schema: recipeResponse },
    errors: {
      403: [["FORBIDDEN", "Your role does not write recipes."]],
      422: [["VALIDATION", "A field is wrong (shares not adding up to 100, an unknown item, a casing outside the calibre range, the cure over a statutory maximum...): details.fields names it."]],
    },
  },
  {
    method: "get", path: "/api/recipes/{id}", operationId: "getRecipe", tag: "Planning", auth: true,
    summary: "A recipe",
    description: "A recipe by id or code, with its current version (or ?version=N), the list of its versions and the cure check at its exact rates.",
    params: z.object({ id: z.string().meta({ description: "The recipe's id or code. Not in your company: 404.", example: "FARM-1" }) }),
    query: recipeGetQuery,
    success: { status: 200, description: "The recipe.", schema: recipeResponse },
    errors: { 403: [["FORBIDDEN", "Your role does not read plans and recipes."]], 404: [["NOT_FOUND", "No such recipe or version in your company."]] },
  },
  {
    method: "post", path: "/api/recipes/{id}/versions", operationId: "addRecipeVersion", tag: "Planning", auth: true, idempotent: true,
    summary: "Write a new version of a recipe",
    description: "The new version becomes the current one; earlier versions stay exactly as written (batches keep the version they were planned with).",
    params: z.object({ id: z.string().meta({ description: "The recipe's id or code." }) }),
    body: requestBody("RecipeVersionInput", recipeVersionInput),
    success: { status: 201, description: "The recipe with its new version.", schema: recipeResponse },
    errors: {
      403: [["FORBIDDEN", "Your role does not write recipes."]],
      404: [["NOT_FOUND", "No such recipe in your company."]],
      409: [["CONFLICT", "The recipe is archived."]],
      422: [["VALIDATION", "A field is wrong: details.fields names it."]],
    },
  },
  {
    method: "get", path: "/api/batches", operationId: "listBatches", tag: "Planning", auth: true,
    summary: "Batch plans",
    description: "Batches by production day, each with its bill of materials, reservations, shortages and suggestions; filter by kitchen, dates and status.",
    query: batchListQuery,
    success: { status: 200, description: "The batches.", schema: batchListResponse },
    errors: { 403: [["FORBIDDEN", "Your role does not read plans."]], 404: [["NOT_FOUND", "No such kitchen in your company."]] },
  },
  {
    method: "post", path: "/api/batches", operationId: "planBatch", tag: "Planning", auth: true, idempotent: true,
    summary: "Plan a batch",
    description: "A recipe version and a meat block (or links x link weight) in one kitchen on one day become the exact bill of materials in each item's stock unit, casing metres and put-ups, and cure grams rounded to the kitchen scale toward compliance with the ppm verdict on the rounded amount. A plan over a statutory maximum cannot be saved (422).",
    body: requestBody("BatchCreateInput", batchCreateInput),
    success: { status: 201, description: "The planned batch with its shortages.", schema: batchResponse },
    errors: {
      403: [["FORBIDDEN", "Not your kitchen, or your role does not plan."]],
      404: [["NOT_FOUND", "No such kitchen or recipe in your company."]],
      422: [["VALIDATION", "A field is wrong (a zero meat block, a unit that is not a mass, a day in the past, a casing outside the recipe's calibre range, the cure over a statutory maximum): details.fields names it."]],
    },
  },
  {
    method: "get", path: "/api/batches/{id}", operationId: "getBatch", tag: "Planning", auth: true,
    summary: "A batch plan",
    description: "The batch with its lines, the lots reserved for each, what is short and where it could come from.",
    params: BATCH_ID,
    success: { status: 200, description: "The batch.", schema: batchResponse },
    errors: { 403: [["FORBIDDEN", "Your role does not read plans."]], 404: [["NOT_FOUND", "No such batch in your company."]] },
  },
  {
    method: "patch", path: "/api/batches/{id}", operationId: "changeBatch", tag: "Planning", auth: true, idempotent: true,
    summary: "Change a batch plan",
    description: "A new day, meat block (or links), casing or note for a planned batch. Its reservations are released and its lines worked out again from the same recipe version, with the same checks as a new plan; reserve again afterwards. A different recipe is a new plan.",
    params: BATCH_ID,
    body: requestBody("BatchChangeInput", batchChangeInput),
    success: { status: 200, description: "The changed batch, planned.", schema: batchResponse },
    errors: {
      403: [["FORBIDDEN", "Not your kitchen."]],
      404: [["NOT_FOUND", "No such batch in your company."]],
      409: [["CONFLICT", "The batch is produced, on hold or cancelled."]],
      422: [["VALIDATION", "A field is wrong, the cure would be over a statutory maximum, or a house limit is missed without a manager's reason: details.fields names it."]],
    },
  },
  {
    method: "post", path: "/api/batches/{id}/reserve", operationId: "reserveBatch", tag: "Planning", auth: true, idempotent: true,
    summary: "Reserve a batch's stock",
    description: "Allocates lots first-expired-first-out (dated lots by date, then undated by receipt; lots expiring on or before the production day are skipped), splitting across lots, all or nothing. Available stock drops at once. Reserving again tops up what is missing.",
    params: BATCH_ID,
    success: { status: 200, description: "The batch with its reservations.", schema: batchResponse },
    errors: {
      403: [["FORBIDDEN", "Not your kitchen."]],
      404: [["NOT_FOUND", "No such batch in your company."]],
      409: [["SHORTAGE", "Not enough stock: details.lines names each line short; nothing was reserved."], ["CONFLICT", "The batch is produced, on hold or cancelled."]],
    },
  },
  {
    method: "post", path: "/api/batches/{id}/release", operationId: "releaseBatch", tag: "Planning", auth: true, idempotent: true,
    summary: "Release a batch's reservations",
    description: "Gives the reserved lots back to available stock; the batch stays planned.",
    params: BATCH_ID,
    success: { status: 200, description: "The batch.", schema: batchResponse },
    errors: { 403: [["FORBIDDEN", "Not your kitchen."]], 404: [["NOT_FOUND", "No such batch in your company."]], 409: [["CONFLICT", "The batch is produced, on hold or cancelled."]] },
  },
  {
    method: "post", path: "/api/batches/{id}/cancel", operationId: "cancelBatch", tag: "Planning", auth: true, idempotent: true,
    summary: "Cancel a batch plan",
    description: "Releases what the batch held and marks it cancelled.",
    params: BATCH_ID,
    success: { status: 200, description: "The cancelled batch.", schema: batchResponse },
    errors: { 403: [["FORBIDDEN", "Not your kitchen."]], 404: [["NOT_FOUND", "No such batch in your company."]], 409: [["CONFLICT", "The batch is produced, on hold or cancelled."]] },
  },
  {
    method: "post", path: "/api/batches/{id}/produce", operationId: "produceBatch", tag: "Planning", auth: true, idempotent: true,
    summary: "Record a batch as made",
    description: "The actual meat block, what was weighed per line (default: as planned) and from which lots (default: the reserved ones, then first-expired-first-out), posted as use movements naming the batch in one transaction; the batch gets its code (RECIPE-YYMMDD-N) and the variance to plan. The cure check runs again on the actual weights: over a statutory maximum the batch is put on hold with the caution.",
    params: BATCH_ID,
    body: requestBody("BatchProduceInput", batchProduceInput),
    success: { status: 200, description: "The batch with its production (and hold, if any).", schema: batchResponse },
    errors: {
      403: [["FORBIDDEN", "Not your kitchen, or your role does not record production."]],
      404: [["NOT_FOUND", "No such batch or lot in your company."]],
      409: [["NOT_PRODUCIBLE", "The batch is already produced, on hold or cancelled."], ["INSUFFICIENT_STOCK", "A lot or the kitchen has less than was used."], ["LOT_EXPIRED", "A named lot is past its date: it cannot be used."]],
      422: [["VALIDATION", "A field is wrong (a line the batch does not have, lots not adding up to the quantity used, a unit of the wrong dimension): details.fields names it."]],
    },
  },
  {
    method: "post", path: "/api/batches/{id}/release-hold", operationId: "releaseBatchHold", tag: "Planning", auth: true, idempotent: true,
    summary: "Release a batch held over a cure limit",
    description: "A manager (or admin) action, with the corrective action taken as the reason; recorded in the audit trail.",
    params: BATCH_ID,
    body: requestBody("HoldReleaseInput", holdReleaseInput),
    success: { status: 200, description: "The released batch.", schema: batchResponse },
    errors: { 403: [["FORBIDDEN", "Only a manager or admin releases a hold."]], 404: [["NOT_FOUND", "No such batch in your company."]], 409: [["CONFLICT", "The batch is not on hold."]] },
  },
  {
    method: "get", path: "/api/trace/lots/{id}", operationId: "traceLot", tag: "Planning", auth: true,
    summary: "Trace a lot forward",
    description: "Who supplied the lot, its movements between kitchens, the batches that used it and what is left where; ?format=csv for a recall file. Shipments to customers are outside the product, and the report says so.",
    params: z.object({ id: z.uuid().meta({ description: "The lot's id. Not in your company: 404." }) }),
    query: traceQuery,
    success: { status: 200, description: "The lot's trace (text/csv with format=csv).", schema: lotTraceResponse },
    errors: { 403: [["FORBIDDEN", "Your role does not read plans."]], 404: [["NOT_FOUND", "No such lot in your company."]] },
  },
  {
    method: "get", path: "/api/trace/batches/{id}", operationId: "traceBatch", tag: "Planning", auth: true,
    summary: "Trace a batch back",
    description: "Every lot a produced batch used, with its supplier, lot code, date and the quantity used; ?format=csv for a recall file.",
    params: BATCH_ID,
    query: traceQuery,
    success: { status: 200, description: "The batch's trace (text/csv with format=csv).", schema: batchTraceResponse },
    errors: { 403: [["FORBIDDEN", "Your role does not read plans."]], 404: [["NOT_FOUND", "No such produced batch in your company."]] },
  },
  {
    method: "post", path: "/api/batches/reserve-all", operationId: "reserveAllBatches", tag: "Planning", auth: true, idempotent: true,
    summary: "Reserve every planned batch of a kitchen between two days",
    description: "Each planned batch all or nothing, in production-day order; the answer counts and names per batch what happened: reserved now, already reserved (nothing posted again, so a second call changes nothing), short (which lines) or skipped (produced, on hold or cancelled).",
    body: requestBody("BatchReserveAllInput", batchReserveAllInput),
    success: { status: 200, description: "Counts per outcome and each batch's outcome.", schema: reserveAllResponse },
    errors: { 403: [["FORBIDDEN", "Not your kitchen."]], 404: [["NOT_FOUND", "No such kitchen in your company."]] },
  },
  {
    method: "get", path: "/api/house-limits", operationId: "listHouseLimits", tag: "Planning", auth: true,
    summary: "House limits",
    description: "The company's own cure limits, stricter than the regulation's, per product class and substance. Plans are checked against them; a manager may plan past one with a reason.",
    success: { status: 200, description: "The house limits.", schema: houseLimitsResponse },
    errors: { 403: [["FORBIDDEN", "Your role does not read plans."]] },
  },
  {
    method: "put", path: "/api/house-limits", operationId: "setHouseLimits", tag: "Planning", auth: true,
    summary: "Set the house limits",
    description: "Replaces every house limit of the company (admins). Statutory limits are not set here: they come with the product and cannot be overridden.",
    body: requestBody("HouseLimitsInput", houseLimitsInput),
    success: { status: 200, description: "The house limits now in force.", schema: houseLimitsResponse },
    errors: { 403: [["FORBIDDEN", "Admins only."]], 422: [["VALIDATION", "A limit is wrong or set twice: details.fields names it as limits.N.field."]] },
  },
  {
    method: "post", path: "/api/calculations/casing", operationId: "calculateCasing", tag: "Planning", auth: true,
    summary: "Casing for a filling mass",
    description: "Metres of casing, put-ups to open (rounded up) and links (rounded down) for a filling mass. A natural casing is planned from its capacity per put-up (the item's, or the calibre table's lower bound); a manufactured casing or a bare calibre as a cylinder with a fill factor (default 0.9) and density (default 1.03 g/cm³). Computes only; writes nothing.",
    body: bodies.casingCalculation,
    success: { status: 200, description: "The casing needed.", schema: casingCalculationResponse },
    errors: {
      403: [["FORBIDDEN", "Your role does not plan."]],
      404: [["NOT_FOUND", "No such item in your company."]],
      422: [["VALIDATION", "A field is wrong (a unit of the wrong dimension, a fill factor over 1, an item that is not a casing, a natural casing with no known capacity): details.fields names it."]],
    },
  },
  {
    method: "post", path: "/api/calculations/cure", operationId: "calculateCure", tag: "Planning", auth: true,
    summary: "Ingoing nitrite of a cure, checked",
    description: "FSIS method (Directive 7620.3): ingoing nitrite and nitrate ppm on the meat block's green weight, exact, answered to 4 places, and every check of the table (the company's unless `table` says otherwise) with its entry, citation and date read, kind (max, min, target), limit and verdict decided on exact values (max means ppm <= limit: 2.5 g/kg of a 6.25 % cure, 156.25 ppm, is within the comminuted maximum). Verified statutory maxima block (`blocked`); minima and required levels warn with the deviation; bacon's alternative levels are checks of their own. EU figures are mg/kg of the whole batch as the ion; those not read in the annex text are marked unverified and not applied. With targetNitritePpm and one cure without quantity: `requiredCure`, rounded to the company's scale resolution toward compliance, verdict on the rounded amount. The answer always carries the cure caution. Computes only; writes nothing.",
    body: bodies.cureCalculation,
    success: { status: 200, description: "The ppm, the checks, notes and the caution.", schema: cureCalculationResponse },
    errors: {
      403: [["FORBIDDEN", "Your role does not plan (planning.read)."]],
      422: [["VALIDATION", "A field is wrong, named in details.fields: a cure without nitriteFraction (cures.N.nitriteFraction), a meat block of zero or less, a unit that is not a mass, an unknown productClass, table or method, a class the method cannot make, table eu without batchMass, a pumped cure without pickle or pumpFraction."]],
    },
  },
  // GS1 labels ----------------------------------------------------------------------------
  {
    method: "post", path: "/api/gs1/parse", operationId: "parseGs1Label", tag: "GS1 labels", auth: true,
    summary: "Read a GS1 case label",
    description: "Splits a scan into GS1 Application Identifiers by GS1's table of predefined lengths (so AIs this product does not read land in `other` instead of breaking the scan) and reads (00) SSCC, (01) GTIN and (02) contained GTIN with their check digits, (10) lot, (11) (13) (15) (16) (17) dates, (30) and (37) counts, (310n) kg and (320n) lb net weights as exact decimal strings with the label's decimals. Two-digit years are placed within -49..+50 years of the current year in your time zone (GS1 General Specifications 7.12). Day 00: best before, sell by and expiration are read as the last day of the month; production and packaging dates are answered as YYYY-MM. A stand-in separator: the request's `separator`, else the company's `scanSeparator` (PATCH /api/company), else none. For anyone with purchasing.read or stock.receive. Computes only; writes nothing.",
    body: bodies.gs1Parse,
    success: { status: 200, description: "What the label says; absent fields are null.", schema: gs1LabelResponse },
    errors: {
      403: [["FORBIDDEN", "Your role neither buys nor receives (purchasing.read or stock.receive)."]],
      422: [["VALIDATION", "The scan cannot be read: message and details.fields.data say what is wrong and name the AI (a wrong check digit in (01), a value cut short, a date that does not exist, (37) with (01), data after the end, an empty scan...); details.gs1 carries {reason, ai, position} for programs (reason: EMPTY, NO_AI, UNKNOWN_AI, TOO_SHORT, TOO_LONG, EMPTY_VALUE, NOT_NUMERIC, INVALID_CHARACTER, BAD_CHECK_DIGIT, INVALID_DATE, NOT_ALLOWED_TOGETHER, DUPLICATE_AI, DATA_AFTER_END, BAD_BRACKETS, BAD_SEPARATOR)."]],
    },
  },
  {
    method: "get", path: "/api/transfer-requests", operationId: "listTransferRequests", tag: "Ledger", auth: true,
    summary: "Transfer requests",
    description: "Requests between the company's kitchens, newest first; kitchen filters those the kitchen sends or receives.",
    query: transferRequestsQuery,
    success: { status: 200, description: "The requests.", schema: transferRequestListResponse },
  },
  {
    method: "post", path: "/api/transfer-requests", operationId: "requestTransfer", tag: "Ledger", auth: true, idempotent: true,
    summary: "Ask another kitchen for stock",
    description: "A kitchen lead asks for its own kitchen (managers and admins for any); the sending kitchen's lead or a manager fulfils or declines it. With batch, the request is for that batch's shortage (the batch sheet's transfer suggestion) and shows on the batch's line while it is open. Send an Idempotency-Key so a double click asks once.",
    body: bodies.transferRequest,
    success: { status: 201, description: "The open request.", schema: transferRequestResponse },
    errors: {
      403: [["FORBIDDEN", "You may ask only for your own kitchen."]],
      404: [["NOT_FOUND", "No such kitchen, item or batch in your company."]],
      409: [["ALREADY_REQUESTED", "A request for this batch and item is still open: details.request is that request."]],
    },
  },
  {
    method: "post", path: "/api/transfer-requests/{id}/fulfil", operationId: "fulfilTransferRequest", tag: "Ledger", auth: true, idempotent: true,
    summary: "Fulfil a transfer request",
    description: "Posts the transfer from the asked kitchen and closes the request, in one transaction: the lot named, or first-expired-first-out across lots. A shortfall leaves it open. Send an Idempotency-Key so a retry cannot send twice.",
    params: idParam("transfer request"),
    body: bodies.transferFulfil,
    success: { status: 201, description: "The closed request and the transfer's movements.", schema: transferFulfilledResponse },
    errors: {
      403: [["FORBIDDEN", "Only the sending kitchen's lead, a manager or an admin."]],
      404: [["NOT_FOUND", "No such request in your company."]],
      409: [
        ["REQUEST_CLOSED", "Already fulfilled, declined or cancelled."],
        ["INSUFFICIENT_STOCK", "Not enough available in the sending kitchen (details.available, details.requested, details.unit); with a lot named, in that lot (details.fields.lot)."],
      ],
      422: [["VALIDATION", "The lot is not a lot of the requested item, or no lot of your company (details.fields.lot)."]],
    },
  },
  {
    method: "get", path: "/api/transfer-requests/{id}/lots", operationId: "listTransferLotChoices", tag: "Ledger", auth: true,
    summary: "Lots that could fill a transfer request",
    description: "The sending kitchen's lots of the requested item with stock available (code, date and its kind, days left, available), in first-expired-first-out order, and which of them fulfilling without a lot would take now.",
    params: idParam("transfer request"),
    success: { status: 200, description: "The lots and the suggested draw.", schema: transferLotChoicesResponse },
    errors: { 404: [["NOT_FOUND", "No such request in your company."]] },
  },
  {
    method: "post", path: "/api/transfer-requests/{id}/decline", operationId: "declineTransferRequest", tag: "Ledger", auth: true,
    summary: "Decline a transfer request",
    description: "With a reason the asking kitchen sees.",
    params: idParam("transfer request"),
    body: bodies.transferDecline,
    success: { status: 200, description: "The declined request.", schema: transferRequestResponse },
    errors: {
      403: [["FORBIDDEN", "Only the sending kitchen's lead, a manager or an admin."]],
      404: [["NOT_FOUND", "No such request in your company."]],
      409: [["REQUEST_CLOSED", "Already fulfilled, declined or cancelled."]],
    },
  },
  // Dashboard -----------------------------------------------------------------------------
  {
    method: "get", path: "/api/dashboard", operationId: "getDashboard", tag: "Dashboard", auth: true,
    summary: "The Overview's panels",
    description: "Every panel of the Overview page at once, over the open kitchens you may read (dashboard.read: admins, managers, buyers and accountants every kitchen, kitchen leads their own). cureExpiring: cure lots with stock dated up to today + the company's largest cure warning window, past-date ones too, fewest days left first. belowReorder: what Buying > Reorder suggests (the same rule and figures). shortages: the short lines of planned and reserved batches from today to today + 6, as the planner works them out. stockValue: each kitchen's stock value at the end of today, the kitchen totals of GET /api/reports/valuation for today. usageTrend: use and waste (net of reversals) per month and category over the last six months, this one included, the costs of GET /api/reports/usage?groupBy=category. Money follows the company's cost formula (costFormula: fifo, FIFO cost, or average, moving average cost; kept per kitchen, a transfer carrying its cost), from one costing run over every kitchen of the company up to the end of today; a kitchen lead sees only their kitchens' figures. A cure lot's value is its on hand x the kitchen's unit value of the item under the formula (the item's value in the kitchen / its quantity there), rounded half-even to the currency's decimals. Every value shown is rounded half-even to the currency's decimals (a figure made of parts, as in the reports, adds the parts rounded); totals add the values shown. Dates and months are the company's.",
    success: { status: 200, description: "The panels.", schema: dashboardResponse },
    errors: { 403: [["FORBIDDEN", "A kitchen lead with no kitchen assigned."]] },
  },
  // Reports -------------------------------------------------------------------------------
  {
    method: "get", path: "/api/reports/usage", operationId: "getUsageReport", tag: "Reports", auth: true,
    summary: "Usage and cost by month",
    description: "Stock used (in production or by hand) and wasted, net of reversals, per month (the company's time zone; from and to inclusive) and per item, category or kitchen, with its cost by the company's cost formula (costFormula: fifo, cost layers in receipt order, or average, the moving weighted average; kept per kitchen; a transfer carries its cost). Count differences and adjustments are shown apart (gains at the item's latest receipt cost in the kitchen). Rows by item carry quantities in the stock unit; rows by category or kitchen carry cost only (units differ). Each row's money is rounded half-even to the currency's decimals; totals add the rows. ?format=csv: the same rows as RFC 4180 CSV (UTF-8; bom=true starts it with a byte order mark for spreadsheet programs; text a spreadsheet would run is neutralised, numbers stay numbers). Accountants, managers and admins (reports.read).",
    query: usageQueryFields.extend({
      from: usageQueryFields.shape.from.meta({ description: "First month, YYYY-MM.", example: "2026-10" }),
      to: usageQueryFields.shape.to.meta({ description: "Last month, YYYY-MM, inclusive; at most 36 months after from.", example: "2026-11" }),
      groupBy: usageQueryFields.shape.groupBy.meta({ description: "item (default), category or kitchen." }),
      kitchen: usageQueryFields.shape.kitchen.meta({ description: "Only this kitchen (code or id)." }),
      format: usageQueryFields.shape.format.meta({ description: "json (default) or csv." }),
      bom: usageQueryFields.shape.bom.meta({ description: "csv: true starts the file with a UTF-8 byte order mark." }),
    }),
    success: { status: 200, description: "The report (text/csv with format=csv).", schema: usageResponse },
    errors: {
      403: [["FORBIDDEN", "Your role does not read reports."]],
      404: [["NOT_FOUND", "No such kitchen in your company."]],
      422: [["VALIDATION", "A month not as YYYY-MM, to before from, more than 36 months, or another bad parameter (details.fields)."]],
    },
  },
  {
    method: "get", path: "/api/reports/valuation", operationId: "getValuationReport", tag: "Reports", auth: true,
    summary: "Stock valuation at a date",
    description: "What each kitchen held of each item at the end of asOf (the company's time zone) and its value by the company's cost formula (FIFO layers or moving average, per kitchen). Rows with nothing on hand and no value are left out. Values rounded half-even to the currency's decimals per row; totals (overall, by category, by kitchen code) add the rows. ?format=csv as for the usage report. Accountants, managers and admins (reports.read).",
    query: valuationQuery.extend({
      asOf: valuationQuery.shape.asOf.meta({ description: "The day, YYYY-MM-DD: stock at its end.", example: "2026-11-30" }),
      kitchen: valuationQuery.shape.kitchen.meta({ description: "Only this kitchen (code or id)." }),
      format: valuationQuery.shape.format.meta({ description: "json (default) or csv." }),
      bom: valuationQuery.shape.bom.meta({ description: "csv: true starts the file with a UTF-8 byte order mark." }),
    }),
    success: { status: 200, description: "The valuation (text/csv with format=csv).", schema: valuationResponse },
    errors: {
      403: [["FORBIDDEN", "Your role does not read reports."]],
      404: [["NOT_FOUND", "No such kitchen in your company."]],
      422: [["VALIDATION", "asOf not a real day as YYYY-MM-DD, or another bad parameter (details.fields)."]],
    },
  },
  {
    method: "get", path: "/api/reports/journal", operationId: "getMovementJournal", tag: "Reports", auth: true,
    summary: "The movement journal, with account codes",
    description: "One double entry per movement dated in the months from..to (the company's time zone, inclusive) whose value by the company's cost formula is not zero, with the account codes from the account mapping (GET /api/reports/accounts). The sides: use and waste: Dr the expense account of the kind (movement:use, movement:waste), Cr the inventory account of the item's category (inventory:<category>); a count or adjustment loss: Dr movement:loss, Cr inventory; a gain: Dr inventory, Cr movement:gain; a receipt: Dr inventory, Cr goods received (movement:receipt) at quantity x the receipt's unit cost, and when the cost formula values it otherwise (a reversal under the moving average, a backdated issue's shortfall settled) the difference on a third line to movement:gain or movement:loss. Transfers are left out: the value moves between kitchens within the same inventory account (transfersLeftOut counts the legs); only a transfer whose two legs do not net to zero books the difference on its arriving leg to gain or loss. A reversal is its own entry, dated when it was posted, with the sides swapped (a reversed count keeps the original's loss or gain account). Each line is rounded half-even to the currency's decimals, so every entry and the totals balance (debits = credits) as shown; a month's use + waste equals the usage report's cost whenever values are whole cents (else by rounding). A key with no account code has account null and is listed in unmapped. byAccount sums the lines per account code. kitchen: only entries of that kitchen. ?format=csv: one line per journal line (date, movement_id, posting_id, kind, kitchen_code, sku, account, account_name, mapping, debit, credit, currency, description; RFC 4180, UTF-8, bom=true for a byte order mark, text a spreadsheet would run neutralised, numbers left as numbers; needs reports.export). Accountants, managers and admins (reports.read).",
    query: journalQueryFields.extend({
      from: journalQueryFields.shape.from.meta({ description: "First month, YYYY-MM.", example: "2026-10" }),
      to: journalQueryFields.shape.to.meta({ description: "Last month, YYYY-MM, inclusive; at most 36 months after from.", example: "2026-11" }),
      kitchen: journalQueryFields.shape.kitchen.meta({ description: "Only this kitchen (code or id)." }),
      format: journalQueryFields.shape.format.meta({ description: "json (default) or csv." }),
      bom: journalQueryFields.shape.bom.meta({ description: "csv: true starts the file with a UTF-8 byte order mark." }),
    }),
    success: { status: 200, description: "The journal (text/csv with format=csv).", schema: journalResponse },
    errors: {
      403: [["FORBIDDEN", "Your role does not read reports (or, for the CSV, export them)."]],
      404: [["NOT_FOUND", "No such kitchen in your company."]],
      422: [["VALIDATION", "A month not as YYYY-MM, to before from, more than 36 months, or another bad parameter (details.fields)."]],
    },
  },
  {
    method: "get", path: "/api/reports/accounts", operationId: "getAccountMapping", tag: "Reports", auth: true,
    summary: "The account mapping",
    description: "The account codes the movement journal books to: inventory per item category (casing, cure, spice, ingredient) and, per movement, receipt (the goods-received clearing account), use and waste (expense accounts), loss and gain (count and adjustment differences, and cost differences the formula leaves). Transfers need none. unmapped lists the keys without a code. Accountants, managers and admins (reports.read).",
    success: { status: 200, description: "The mapping.", schema: accountMappingResponse },
    errors: { 403: [["FORBIDDEN", "Your role does not read reports."]] },
  },
  {
    method: "put", path: "/api/reports/accounts", operationId: "setAccountMapping", tag: "Reports", auth: true,
    summary: "Set the account mapping",
    description: "Replaces the whole mapping (a key left out becomes unmapped), all or nothing: one bad entry and nothing is written. Admins and accountants (accounts.manage); managers may read it only.",
    body: requestBody("AccountMappingInput", accountMappingInput, {
      entries: {
        description: "{kind, key, accountCode, name?}: kind inventory with key casing, cure, spice or ingredient; kind movement with key receipt, use, waste, loss or gain; each key once. accountCode: 1 to 20 letters, digits, dots or dashes, starting with a letter or digit. name: up to 100 characters, optional.",
        example: [{ kind: "inventory", key: "cure", accountCode: "1300", name: "Stock - cures" }, { kind: "movement", key: "use", accountCode: "5010", name: "Materials used" }],
      },
    }),
    success: { status: 200, description: "The mapping now in force.", schema: accountMappingResponse },
    errors: {
      403: [["FORBIDDEN", "Admins and accountants only."]],
      422: [["VALIDATION", "An entry is wrong or maps a key twice: details.fields names it as entries.N.field."]],
    },
  },
  {
    method: "get", path: "/api/reports/price-variance", operationId: "getPriceVariance", tag: "Reports", auth: true,
    summary: "Price variance per supplier and month",
    description: "Every accepted line of the deliveries posted (booked into stock) in the months from..to, in the company's time zone, compared per stock unit: the delivered price (the note's or the buyer's correction, else the order line's, per the supplier item's pack) against the order line it was matched to (per that line's pack) and against the supplier item's price list on the day it was booked (the latest price from on or before it). Pack prices become prices per stock unit exactly (pack price / pack size in stock units); freight is not a price and stays out. orderVariance = (delivered - ordered) x quantity and listVariance = (delivered - list) x quantity in the company's currency: exact, each line's value rounded half-even to the currency's decimals, group and report totals the exact sum rounded once (so a total can differ by a cent from the sum of the rounded lines). A line with no order line or no list price has null there, never 0, is left out of that total and counted in withoutOrder / withoutListPrice. Groups per supplier and month. ?format=csv: the rows as CSV (RFC 4180; numbers as plain decimals, text that a spreadsheet would run neutralised; empty cell = null; needs reports.export, the same roles).",
    query: priceVarianceQueryFields.extend({
      from: priceVarianceQueryFields.shape.from.meta({ description: "The first month, yyyy-mm.", example: "2027-01" }),
      to: priceVarianceQueryFields.shape.to.meta({ description: "The last month, yyyy-mm, included; not before from, at most 24 months in all (422 on to).", example: "2027-03" }),
      supplier: priceVarianceQueryFields.shape.supplier.meta({ description: "Only this supplier (its id); another company's or unknown: 404." }),
      format: priceVarianceQueryFields.shape.format.meta({ description: "json (default) or csv." }),
    }),
    success: { status: 200, description: "The report (text/csv with format=csv: the rows).", schema: priceVarianceResponse },
    errors: {
      403: [["FORBIDDEN", "Your role may not read reports (admins, managers and accountants only)."]],
      404: [["NOT_FOUND", "No such supplier in your company."]],
      422: [["VALIDATION", "A query parameter that is not valid (details.fields names it: a month not yyyy-mm, to before from, more than 24 months)."]],
    },
  },
  // Alerts --------------------------------------------------------------------------------
  {
    method: "get", path: "/api/alerts", operationId: "listAlerts", tag: "Alerts", auth: true,
    summary: "Your alerts",
    description: "Alerts of the kitchens you may see (alerts.read: admins, managers and buyers every kitchen, kitchen leads their own), newest first. Left out unless asked: those you acknowledged, and reorder and shortage alerts that have cleared. Snoozed alerts are listed but not unread; cleared ones are never unread. unreadCount counts your unread alerts in every kitchen you may see, whatever the filters. The daily expiry scan raises one alert per lot, kitchen and crossed warning window (company setting; defaults cure 60/30/7 days, casings 30/7, spices 90/30). The daily reorder scan raises one per kitchen and item below its reorder point (the figures of GET /api/reorder-suggestions), the shortage scan one per batch of the next 7 days (today and six more) short of stock; each clears when the need goes and a return is a new alert. Reads the database only: the list answers while the job queue is down, though new alerts then wait for it.",
    query: alertListQuery.extend({
      kind: alertListQuery.shape.kind.meta({ description: "Only this kind." }),
      kitchen: alertListQuery.shape.kitchen.meta({ description: "Only this kitchen, by id or code.", example: "YARD" }),
      includeAcknowledged: alertListQuery.shape.includeAcknowledged.meta({ description: "true: also those you acknowledged." }),
      includeCleared: alertListQuery.shape.includeCleared.meta({ description: "true: also reorder and shortage alerts whose need has gone (clearedAt set)." }),
      limit: alertListQuery.shape.limit.meta({ description: "At most this many (1-500, default 200)." }),
    }),
    success: { status: 200, description: "The alerts and your unread count.", schema: alertListResponse },
    errors: {
      403: [["FORBIDDEN", "Your role does not receive alerts (accountants), or the kitchen is not one of yours."]],
      404: [["NOT_FOUND", "No kitchen of your company has this id or code."]],
    },
  },
  {
    method: "post", path: "/api/alerts/{id}/ack", operationId: "acknowledgeAlert", tag: "Alerts", auth: true, idempotent: true,
    summary: "Acknowledge an alert",
    description: "Marks the alert read for you (others still see it unread). Acknowledging again keeps the first time.",
    params: idParam("alert"),
    success: { status: 200, description: "The alert as you now see it.", schema: alertResponse },
    errors: {
      403: [["FORBIDDEN", "The alert is about a kitchen you do not look after."]],
      404: [["NOT_FOUND", "No such alert in your company."]],
    },
  },
  {
    method: "post", path: "/api/alerts/{id}/snooze", operationId: "snoozeAlert", tag: "Alerts", auth: true, idempotent: true,
    summary: "Snooze an alert",
    description: "Leaves the alert out of your unread count until a time (until) or for some hours (hours), at most 30 days. Snoozing again replaces the time.",
    params: idParam("alert"),
    body: bodies.alertSnooze,
    success: { status: 200, description: "The alert as you now see it.", schema: alertResponse },
    errors: {
      403: [["FORBIDDEN", "The alert is about a kitchen you do not look after."]],
      404: [["NOT_FOUND", "No such alert in your company."]],
      422: [["VALIDATION", "Neither or both of until and hours, or until not in the future or more than 30 days ahead (details.fields.until)."]],
    },
  },
  // Items ---------------------------------------------------------------------------------
  {
    method: "get", path: "/api/items", operationId: "listItems", tag: "Items", auth: true,
    summary: "List items",
    description: "The company's items: casings first, then cures, spices and ingredients, each by SKU. Every role reads the catalogue.",
    query: itemListQuery.extend({
      category: itemListQuery.shape.category.meta({ description: "Only this category." }),
      q: itemListQuery.shape.q.meta({ description: "Part of the SKU or name, any case." }),
      archived: itemListQuery.shape.archived.meta({ description: "true: archived items too." }),
    }),
    success: { status: 200, description: "The items.", schema: itemListResponse },
    errors: { 422: [["VALIDATION", "An unknown category, or a query parameter that is not valid (details.fields)."]] },
  },
  {
    method: "post", path: "/api/items", operationId: "createItem", tag: "Items", auth: true, idempotent: true,
    summary: "Add an item",
    description: "Adds a casing, cure, spice or ingredient with its purchase packs; each pack's size is converted exactly to the stock unit and stored with it. Defaults: a hank is 91.44 m; a natural casing's capacity comes from the trade's calibre table; storage salted (natural) or dry; lots and dates tracked. A cure needs its nitrite and nitrate fractions from the label. Send an Idempotency-Key so a retried request cannot add it twice.",
    body: bodies.itemCreate,
    success: { status: 201, description: "The new item.", schema: itemResponse },
    errors: {
      403: [["FORBIDDEN", "Your role may not manage items (admins, managers and buyers only)."]],
      409: [["CONFLICT", "Another item of your company has this SKU (details.fields.sku)."]],
      422: [["VALIDATION", "A rule of the category is broken, e.g. a cure without its fractions, a casing capacity outside the trade table, or a pack unit that does not convert (details.fields names each, e.g. \"packs.0.unit\")."]],
    },
  },
  {
    method: "get", path: "/api/items/{id}", operationId: "getItem", tag: "Items", auth: true,
    summary: "One item",
    description: "An item of your company, by id or SKU.",
    params: ITEM_REF,
    success: { status: 200, description: "The item.", schema: itemResponse },
    errors: { 404: [["NOT_FOUND", "No such item in your company (another company's item is 404 too)."]] },
  },
  {
    method: "patch", path: "/api/items/{id}", operationId: "updateItem", tag: "Items", auth: true,
    summary: "Change or archive an item",
    description: "Changes the fields sent; null clears an optional attribute (a cleared put-up length or capacity takes its default again). The item is then checked as a whole. A new category drops the old category's attributes; a new casing kind, lower calibre, put-up or length takes the capacity from the trade table again unless one is sent. `packs` replaces every pack.",
    params: ITEM_REF,
    body: bodies.itemPatch,
    success: { status: 200, description: "The item as saved.", schema: itemResponse },
    errors: {
      403: [["FORBIDDEN", "Your role may not manage items (admins, managers and buyers only)."]],
      404: [["NOT_FOUND", "No such item in your company."]],
      409: [
        ["CONFLICT", "Another item of your company has this SKU (details.fields.sku)."],
        ["ITEM_HAS_LOTS", "The item has lots: its category and stock unit can no longer change (details.fields names which)."],
      ],
      422: [["VALIDATION", "The item after the change breaks a rule of its category (details.fields names each field)."]],
    },
  },
  {
    method: "get", path: "/api/items/{id}/prices", operationId: "getItemPrices", tag: "Items", auth: true,
    summary: "An item's prices across suppliers",
    description: "Every supplier item of this item (its alternatives) with the current pack price (the latest on or before `on`), the price per stock unit (6 decimals) and per kg and lb, l and gal, m and yd, or per put-up (hank) and m and yd of casing (4 decimals, half-even), cheapest per stock unit first and flagged; and the price history, newest first, with each change in percent. ?format=csv: the history as CSV, text that a spreadsheet would run neutralised with a leading apostrophe.",
    params: ITEM_REF,
    query: itemPricesQuery.extend({
      on: itemPricesQuery.shape.on.meta({ description: "yyyy-mm-dd: the day current prices are for. Default the company's today.", example: "2027-02-01" }),
      format: itemPricesQuery.shape.format.meta({ description: "json (default) or csv." }),
    }),
    success: { status: 200, description: "The prices (text/csv with format=csv).", schema: itemPricesResponse },
    errors: {
      403: [PURCHASING_READ],
      404: [["NOT_FOUND", "No such item in your company."]],
      422: [["VALIDATION", "A query parameter that is not valid (details.fields)."]],
    },
  },
  // Suppliers -----------------------------------------------------------------------------
  {
    method: "get", path: "/api/suppliers", operationId: "listSuppliers", tag: "Suppliers", auth: true,
    summary: "List suppliers",
    description: "The company's suppliers by name, each with its number of active items. Inactive suppliers only with inactive=true.",
    query: supplierListQuery.extend({
      q: supplierListQuery.shape.q.meta({ description: "Part of the name or the contact's name." }),
      inactive: supplierListQuery.shape.inactive.meta({ description: "true: inactive suppliers too." }),
    }),
    success: { status: 200, description: "The suppliers.", schema: supplierListResponse },
    errors: {
      403: [PURCHASING_READ],
      422: [["VALIDATION", "A query parameter that is not valid (details.fields)."]],
    },
  },
  {
    method: "post", path: "/api/suppliers", operationId: "createSupplier", tag: "Suppliers", auth: true, idempotent: true,
    summary: "Add a supplier",
    description: "Adds a supplier in the company's currency. Send an Idempotency-Key so a retried request cannot add it twice.",
    body: bodies.supplierCreate,
    success: { status: 201, description: "The new supplier.", schema: supplierResponse },
    errors: {
      403: [PURCHASING_MANAGE],
      409: [["CONFLICT", "Another supplier of your company has this name (details.fields.name)."]],
      422: [["VALIDATION", "A field is not valid, e.g. more decimals in minOrderValue than the currency has (details.fields)."]],
    },
  },
  {
    method: "get", path: "/api/suppliers/{id}", operationId: "getSupplier", tag: "Suppliers", auth: true,
    summary: "One supplier",
    description: "A supplier of your company.",
    params: idParam("supplier"),
    success: { status: 200, description: "The supplier.", schema: supplierResponse },
    errors: { 403: [PURCHASING_READ], 404: [["NOT_FOUND", "No such supplier in your company (another company's supplier is 404 too)."]] },
  },
  {
    method: "patch", path: "/api/suppliers/{id}", operationId: "updateSupplier", tag: "Suppliers", auth: true,
    summary: "Change a supplier",
    description: "Changes only the fields sent; null clears the order e-mail or the minimum order value. active=false takes the supplier off the buying lists; nothing is deleted.",
    params: idParam("supplier"),
    body: bodies.supplierPatch,
    success: { status: 200, description: "The supplier as saved.", schema: supplierResponse },
    errors: {
      403: [PURCHASING_MANAGE],
      404: [["NOT_FOUND", "No such supplier in your company."]],
      409: [["CONFLICT", "Another supplier of your company has this name (details.fields.name)."]],
      422: [["VALIDATION", "A field is not valid (details.fields)."]],
    },
  },
  {
    method: "get", path: "/api/suppliers/{id}/items", operationId: "listSupplierItems", tag: "Suppliers", auth: true,
    summary: "A supplier's items",
    description: "What the supplier sells us, by the supplier's SKU: our item, the pack as entered and its exact size in the item's stock unit (and in metres for casings), the GTIN-14. Inactive ones only with inactive=true.",
    params: idParam("supplier"),
    query: supplierItemListQuery.extend({ inactive: supplierItemListQuery.shape.inactive.meta({ description: "true: inactive supplier items too." }) }),
    success: { status: 200, description: "The supplier's items.", schema: supplierItemListResponse },
    errors: {
      403: [PURCHASING_READ],
      404: [["NOT_FOUND", "No such supplier in your company."]],
      422: [["VALIDATION", "A query parameter that is not valid (details.fields)."]],
    },
  },
  {
    method: "post", path: "/api/suppliers/{id}/items", operationId: "createSupplierItem", tag: "Suppliers", auth: true, idempotent: true,
    summary: "Add a supplier item",
    description: "Lists one of our items under the supplier's SKU, in one pack (\"bundle of 5 hanks\" = 5 hank). The pack is converted exactly to the item's stock unit and stored with it (12 decimals, half-even). Send an Idempotency-Key so a retried request cannot add it twice.",
    params: idParam("supplier"),
    body: bodies.supplierItemCreate,
    success: { status: 201, description: "The new supplier item.", schema: supplierItemResponse },
    errors: {
      403: [PURCHASING_MANAGE],
      404: [["NOT_FOUND", "No such supplier in your company."]],
      409: [["CONFLICT", "The supplier already has an item with this SKU (details.fields.sku) or this GTIN (details.fields.gtin)."]],
      422: [["VALIDATION", "No such item, an archived item (details.fields.item), a pack unit that does not convert to the item's stock unit (details.fields.packUnit, naming both units), or a bad GTIN check digit or length (details.fields.gtin)."]],
    },
  },
  {
    method: "get", path: "/api/suppliers/{id}/items/{supplierItemId}", operationId: "getSupplierItem", tag: "Suppliers", auth: true,
    summary: "One supplier item",
    description: "An item of this supplier of your company.",
    params: SUPPLIER_ITEM_PARAMS,
    success: { status: 200, description: "The supplier item.", schema: supplierItemResponse },
    errors: { 403: [PURCHASING_READ], 404: [["NOT_FOUND", "No such item of this supplier in your company."]] },
  },
  {
    method: "patch", path: "/api/suppliers/{id}/items/{supplierItemId}", operationId: "updateSupplierItem", tag: "Suppliers", auth: true,
    summary: "Change a supplier item",
    description: "Changes only the fields sent; null clears the GTIN. A new item, pack quantity or pack unit converts the pack again. active=false takes it off the buying lists; nothing is deleted.",
    params: SUPPLIER_ITEM_PARAMS,
    body: bodies.supplierItemPatch,
    success: { status: 200, description: "The supplier item as saved.", schema: supplierItemResponse },
    errors: {
      403: [PURCHASING_MANAGE],
      404: [["NOT_FOUND", "No such item of this supplier in your company."]],
      409: [["CONFLICT", "The supplier already has an item with this SKU (details.fields.sku) or this GTIN (details.fields.gtin)."]],
      422: [["VALIDATION", "As when adding: item, packUnit or gtin (details.fields)."]],
    },
  },
  {
    method: "get", path: "/api/suppliers/{id}/price-lists", operationId: "listPriceLists", tag: "Suppliers", auth: true,
    summary: "A supplier's applied price lists",
    description: "The price lists applied for this supplier, newest first (at most 200): the file, the mapping it was read with, the default effective date, the counts (up, down, unchanged, first prices, unknown SKUs skipped) and the first 100 warnings.",
    params: idParam("supplier"),
    success: { status: 200, description: "The applied price lists.", schema: priceListImportListResponse },
    errors: { 403: [PURCHASING_READ], 404: [["NOT_FOUND", "No such supplier in your company."]] },
  },
  {
    method: "post", path: "/api/suppliers/{id}/price-lists", operationId: "importPriceList", tag: "Suppliers", auth: true,
    summary: "Preview or apply a price list (CSV)",
    description: "Streams the file (multipart/form-data, field \"file\"), reads it through the column mapping and checks every row against the supplier's items by SKU (case-insensitive). Row findings name the spreadsheet row and column: an unknown SKU is a warning (the row is skipped); the same SKU twice, a price of 0 or below or with more than 4 decimals, another currency than the company's, a bad GTIN check digit, or a pack size/unit that does not convert to the item's stock unit are errors; a pack that converts but differs from the one on record, or another valid GTIN, is a warning. dryRun=true answers the preview (summary, errors, warnings, and each change up or down in percent and per unit) and writes nothing but the upload record. Applying is all or nothing: any row error is 422 with the same details and nothing written; otherwise every price is written with its effective date (a price already set for that supplier item and date is replaced), the import recorded and the mapping remembered for the supplier. The same file (SHA-256) applied again for the same supplier answers 200 already_applied with the earlier import and posts nothing; this, not an Idempotency-Key, is what makes a retry safe. Text cells are kept as text exactly as sent, never evaluated.",
    params: idParam("supplier"),
    query: priceListUploadQuery.extend({ dryRun: priceListUploadQuery.shape.dryRun.meta({ description: "true: the preview (as the form field)." }) }),
    upload: PRICE_LIST_UPLOAD,
    success: { status: 201, description: "Applied (201); a preview or a file already applied answers 200 with the same shape (status says which).", schema: priceListResultResponse },
    errors: {
      400: [["BAD_REQUEST", "The multipart body is incomplete or malformed."]],
      403: [PURCHASING_MANAGE, ["FORBIDDEN", "Refused before any of the body is read."]],
      404: [["NOT_FOUND", "No such supplier in your company (refused before any of the body is read)."]],
      409: [["PRICES_CHANGED", "A price for one of the items and dates was written by someone else while the list was applied; nothing was written. Apply it again."]],
      413: [["PAYLOAD_TOO_LARGE", "The file is larger than 25 MB; reading stops there and nothing is stored."]],
      415: [["UNSUPPORTED_MEDIA_TYPE", "The body is not multipart/form-data."]],
      422: [
        ["VALIDATION", "details.fields.file: the file is not CSV text (what it is instead), no column matches a price-list field (\"No matching columns\", with details.file: the headers found and the first rows), or, when applying, the rows' errors (details also carries the whole result: summary, errors [{row, column, field, message}], warnings, changes). details.fields.mapping / effectiveFrom / dryRun: a text field that is not valid."],
      ],
    },
  },
  // Purchase orders -----------------------------------------------------------------------
  {
    method: "get", path: "/api/purchase-orders", operationId: "listPurchaseOrders", tag: "Purchase orders", auth: true,
    summary: "List purchase orders",
    description: "The company's orders, newest first, a page at a time, filtered by status, supplier and delivery kitchen.",
    query: purchaseOrderListQuery.extend({
      status: purchaseOrderListQuery.shape.status.meta({ description: "Only orders in this status." }),
      supplier: purchaseOrderListQuery.shape.supplier.meta({ description: "Only orders to this supplier (its id)." }),
      kitchen: purchaseOrderListQuery.shape.kitchen.meta({ description: "Only orders delivered to this kitchen (its code).", example: "YARD" }),
      page: purchaseOrderListQuery.shape.page.meta({ description: "Page number, from 1. Default 1." }),
      perPage: purchaseOrderListQuery.shape.perPage.meta({ description: "Orders per page, 1 to 100. Default 25." }),
    }),
    success: { status: 200, description: "A page of orders and the number matching.", schema: purchaseOrderListResponse },
    errors: { 403: [PURCHASING_READ], 422: [["VALIDATION", "A query parameter that is not valid (details.fields)."]] },
  },
  {
    method: "post", path: "/api/purchase-orders", operationId: "createPurchaseOrder", tag: "Purchase orders", auth: true, idempotent: true,
    summary: "Draft a purchase order",
    description: "A draft for one supplier and one delivery kitchen, numbered PO-year-sequence. Whole packs; each line's pack price as sent, else the supplier item's current price; line totals (packs x pack price, half-even to the currency's decimals) and the total are worked out here. Send an Idempotency-Key so a retried request cannot draft it twice.",
    body: bodies.purchaseOrderCreate,
    success: { status: 201, description: "The new draft.", schema: purchaseOrderResponse },
    errors: {
      403: [PURCHASING_ORDERS],
      422: [["VALIDATION", "details.fields names each problem: supplier (not of your company, or switched off), kitchen (not of your company, or archived), deliverBy (before today), lines.N.packs (not whole packs), lines.N.supplierItem (not an active item of this supplier, or twice on the order), lines.N.packPrice (no current price: send one)."]],
    },
  },
  {
    method: "get", path: "/api/purchase-orders/{id}", operationId: "getPurchaseOrder", tag: "Purchase orders", auth: true,
    summary: "One purchase order",
    description: "The order with its lines (ordered, received and still to come in the item's stock unit), its history (created, approved, sent, closed short, cancelled: who and when) and the steps the signed-in user may take now.",
    params: idParam("purchase order"),
    success: { status: 200, description: "The order.", schema: purchaseOrderResponse },
    errors: { 403: [PURCHASING_READ], 404: [ORDER_NOT_FOUND] },
  },
  {
    method: "patch", path: "/api/purchase-orders/{id}", operationId: "updatePurchaseOrder", tag: "Purchase orders", auth: true,
    summary: "Change a draft",
    description: "Changes the fields sent; lines replaces every line (totals worked out again). Only drafts change; the supplier stays.",
    params: idParam("purchase order"),
    body: bodies.purchaseOrderPatch,
    success: { status: 200, description: "The draft as saved.", schema: purchaseOrderResponse },
    errors: {
      403: [PURCHASING_ORDERS],
      404: [ORDER_NOT_FOUND],
      409: [ORDER_STATUS("the order is no longer a draft")],
      422: [["VALIDATION", "As for a new draft (details.fields names each field and line)."]],
    },
  },
  {
    method: "post", path: "/api/purchase-orders/{id}/approve", operationId: "approvePurchaseOrder", tag: "Purchase orders", auth: true, idempotent: true,
    summary: "Approve a draft",
    description: "A buyer approves an order whose total is at most the company's approval threshold (Settings > Company, PATCH /api/company approvalThreshold); above it a manager or admin approves. Two approvals at once: one succeeds, the other is 409. Send an Idempotency-Key so a retry replays the first answer.",
    params: idParam("purchase order"),
    success: { status: 200, description: "The approved order.", schema: purchaseOrderResponse },
    errors: {
      403: [
        ["FORBIDDEN", "Your role may not approve orders (kitchen leads and accountants)."],
        ["FORBIDDEN", "You are a buyer and the total is above the approval threshold: the message names both amounts and says a manager must approve."],
      ],
      404: [ORDER_NOT_FOUND],
      409: [ORDER_STATUS("the order is not a draft (already approved, for instance)")],
    },
  },
  {
    method: "post", path: "/api/purchase-orders/{id}/send", operationId: "sendPurchaseOrder", tag: "Purchase orders", auth: true, idempotent: true,
    summary: "Send an approved order to the supplier",
    description: "E-mails the supplier's order address with the order attached as PDF and CSV (the same files GET .../pdf and .../csv give), written in the same transaction as the status change (sent) and sent by the worker. Sending again is 409. Send an Idempotency-Key so a retry replays the first answer instead.",
    params: idParam("purchase order"),
    success: { status: 200, description: "The sent order.", schema: purchaseOrderResponse },
    errors: {
      403: [PURCHASING_ORDERS],
      404: [ORDER_NOT_FOUND],
      409: [ORDER_STATUS("the order is not approved (a draft, or already sent)")],
      422: [["VALIDATION", "The supplier has no order e-mail address (details.fields[\"supplier.orderEmail\"]): add one to the supplier first."]],
    },
  },
  {
    method: "post", path: "/api/purchase-orders/{id}/close", operationId: "closePurchaseOrderShort", tag: "Purchase orders", auth: true, idempotent: true,
    summary: "Close an order short",
    description: "A sent or partly received order whose rest will not come: closed with a reason; nothing more is expected against it.",
    params: idParam("purchase order"),
    body: bodies.purchaseOrderReason,
    success: { status: 200, description: "The order, closed short.", schema: purchaseOrderResponse },
    errors: { 403: [PURCHASING_ORDERS], 404: [ORDER_NOT_FOUND], 409: [ORDER_STATUS("the order was not sent, or is already received, closed or cancelled")] },
  },
  {
    method: "post", path: "/api/purchase-orders/{id}/cancel", operationId: "cancelPurchaseOrder", tag: "Purchase orders", auth: true, idempotent: true,
    summary: "Cancel an order",
    description: "A draft, an approved order, or a sent one before anything was received, with a reason. A sent order's supplier is e-mailed the cancellation at the address the order went to.",
    params: idParam("purchase order"),
    body: bodies.purchaseOrderReason,
    success: { status: 200, description: "The order, cancelled.", schema: purchaseOrderResponse },
    errors: {
      403: [PURCHASING_ORDERS],
      404: [ORDER_NOT_FOUND],
      409: [ORDER_STATUS("goods were received against it (close it short instead), or it is already closed or cancelled")],
    },
  },
  {
    method: "get", path: "/api/purchase-orders/{id}/pdf", operationId: "getPurchaseOrderPdf", tag: "Purchase orders", auth: true,
    summary: "The order as PDF",
    description: "The PDF the supplier gets, dated the day it was sent (not yet sent: today), as a download (Content-Disposition: attachment; filename PO-....pdf).",
    params: idParam("purchase order"),
    success: { status: 200, description: "The PDF.", schema: PDF_FILE, mediaType: "application/pdf" },
    errors: { 403: [PURCHASING_READ], 404: [ORDER_NOT_FOUND] },
  },
  {
    method: "get", path: "/api/purchase-orders/{id}/csv", operationId: "getPurchaseOrderCsv", tag: "Purchase orders", auth: true,
    summary: "The order as CSV",
    description: "The CSV the supplier gets (RFC 4180, one row per line: order_number, line, supplier_sku, description, pack, packs, pack_price, line_total, currency, deliver_to, deliver_by), as a download.",
    params: idParam("purchase order"),
    success: { status: 200, description: "The CSV.", schema: CSV_FILE, mediaType: "text/csv" },
    errors: { 403: [PURCHASING_READ], 404: [ORDER_NOT_FOUND] },
  },
  // Deliveries ----------------------------------------------------------------------------
  {
    method: "get", path: "/api/deliveries", operationId: "listDeliveries", tag: "Deliveries", auth: true,
    summary: "Deliveries", description: "Drafts and posted deliveries, newest first (at most 200).",
    query: deliveryListQuery,
    success: { status: 200, description: "The deliveries.", schema: deliveryListResponse },
    errors: { 403: [["FORBIDDEN", "Your role may not receive stock (admins, managers and buyers only), or not into this kitchen."]] },
  },
  {
    method: "post", path: "/api/deliveries", operationId: "uploadDelivery", tag: "Deliveries", auth: true,
    upload: DELIVERY_UPLOAD,
    summary: "Reconcile a delivery note CSV",
    description: "multipart/form-data: the CSV in `file` (at most 25 MB; csv), and text fields `supplier` (id), `kitchen` (id or code), `order` (id, optional), `noteNumber`, `noteDate` (yyyy-mm-dd) and `mapping` (a CsvMapping as JSON: columns for noteNumber, sku, gtin, description, quantity (packs), pack, unitPrice (per pack), lot, date, dateKind; left out: the mapping remembered for this supplier, else one proposed from the headers). Makes a draft delivery: every line matched by supplier SKU (case-insensitive) or GTIN to the supplier's items and to the open order lines, with its findings (as_ordered, short, over, different_item, not_on_order, price_differs beyond the company's tolerance, lot_missing, date_missing, expired, short_dated). A row that cannot be read is 422 with `details.errors` [{row, column, field, message}] and nothing is made. The same file again: the draft made from it (200, duplicate true), or 409 when it was posted.",
    success: { status: 201, description: "The draft delivery with its reconciliation (200 with duplicate true for a file sent before).", schema: deliveryResponse },
    errors: {
      403: [["FORBIDDEN", "Your role may not receive stock (admins, managers and buyers only), or not into this kitchen."]],
      409: [["DELIVERY_ALREADY_POSTED", "This file, or a note with this number from this supplier, was already posted: details.deliveryId names it."]],
      413: [["PAYLOAD_TOO_LARGE", "The file is larger than 25 MB; nothing was stored."]],
      415: [["UNSUPPORTED_MEDIA_TYPE", "Not multipart/form-data."]],
      422: [["VALIDATION", "A bad field (supplier, kitchen, order, mapping), a file that is not CSV, or rows that cannot be read (details.errors with row and column)."]],
    },
  },
  {
    method: "post", path: "/api/deliveries/keyed", operationId: "createKeyedDelivery", tag: "Deliveries", auth: true, idempotent: true,
    summary: "Key in a delivery", description: "A draft delivery from lines typed in (or none yet, to scan them one by one), reconciled like a CSV.",
    body: bodies.deliveryKeyed,
    success: { status: 201, description: "The draft delivery.", schema: deliveryResponse },
    errors: { 403: [["FORBIDDEN", "Your role may not receive stock (admins, managers and buyers only), or not into this kitchen."]], 409: [["DELIVERY_ALREADY_POSTED", "A note with this number from this supplier was already posted."]] },
  },
  {
    method: "get", path: "/api/deliveries/{id}", operationId: "getDelivery", tag: "Deliveries", auth: true,
    summary: "A delivery", description: "The delivery with every line, its match and its findings.",
    params: idParam("delivery"),
    success: { status: 200, description: "The delivery.", schema: deliveryResponse },
    errors: { 403: [["FORBIDDEN", "Your role may not receive stock (admins, managers and buyers only), or not into this kitchen."]], 404: [["NOT_FOUND", "No such delivery in your company (another company's is 404 too)."]] },
  },
  {
    method: "patch", path: "/api/deliveries/{id}", operationId: "updateDelivery", tag: "Deliveries", auth: true,
    summary: "Note number, date and freight", description: "Changes a draft's note number, note date or freight.",
    params: idParam("delivery"), body: bodies.deliveryPatch,
    success: { status: 200, description: "The delivery.", schema: deliveryResponse },
    errors: { 403: [["FORBIDDEN", "Your role may not receive stock (admins, managers and buyers only), or not into this kitchen."]], 404: [["NOT_FOUND", "No such delivery in your company (another company's is 404 too)."]], 409: [["DELIVERY_POSTED", "The delivery is already posted and cannot be changed."], ["DELIVERY_ALREADY_POSTED", "A note with this number from this supplier was already posted."]] },
  },
  {
    method: "post", path: "/api/deliveries/{id}/lines", operationId: "addDeliveryLine", tag: "Deliveries", auth: true, idempotent: true,
    summary: "Add a line", description: "A line keyed in or read from a case label (GTIN, lot, date); the delivery is reconciled again.",
    params: idParam("delivery"), body: bodies.deliveryLine,
    success: { status: 201, description: "The delivery.", schema: deliveryResponse },
    errors: { 403: [["FORBIDDEN", "Your role may not receive stock (admins, managers and buyers only), or not into this kitchen."]], 404: [["NOT_FOUND", "No such delivery in your company (another company's is 404 too)."]], 409: [["DELIVERY_POSTED", "The delivery is already posted and cannot be changed."]] },
  },
  {
    method: "patch", path: "/api/deliveries/{id}/lines/{lineId}", operationId: "updateDeliveryLine", tag: "Deliveries", auth: true,
    summary: "Decide or correct a line", description: "Accept, reject or correct (supplier item, quantity, price, lot, date) one line; the findings are worked out again for every line.",
    params: z.object({ id: z.uuid().meta({ description: "The delivery's id." }), lineId: z.uuid().meta({ description: "The line's id." }) }),
    body: bodies.deliveryLinePatch,
    success: { status: 200, description: "The delivery.", schema: deliveryResponse },
    errors: { 403: [["FORBIDDEN", "Your role may not receive stock (admins, managers and buyers only), or not into this kitchen."]], 404: [["NOT_FOUND", "No such delivery in your company (another company's is 404 too)."]], 409: [["DELIVERY_POSTED", "The delivery is already posted and cannot be changed."]], 422: [["VALIDATION", "An expired line cannot be accepted; a line without a supplier item neither."]] },
  },
  {
    method: "post", path: "/api/deliveries/{id}/document", operationId: "attachDeliveryDocument", tag: "Deliveries", auth: true,
    upload: DELIVERY_DOCUMENT_UPLOAD,
    summary: "Attach the delivery note", description: "multipart/form-data with the note as PDF, JPEG, PNG, HEIC or WebP in `file` (at most 25 MB).",
    params: idParam("delivery"),
    success: { status: 200, description: "The delivery.", schema: deliveryResponse },
    errors: { 403: [["FORBIDDEN", "Your role may not receive stock (admins, managers and buyers only), or not into this kitchen."]], 404: [["NOT_FOUND", "No such delivery in your company (another company's is 404 too)."]], 413: [["PAYLOAD_TOO_LARGE", "Larger than 25 MB."]], 415: [["UNSUPPORTED_MEDIA_TYPE", "Not multipart/form-data."]], 422: [["VALIDATION", "Not a PDF or photo."]] },
  },
  {
    method: "get", path: "/api/deliveries/{id}/document", operationId: "getDeliveryDocument", tag: "Deliveries", auth: true,
    summary: "Download the delivery note",
    description: "The PDF or photo attached with POST .../document, byte for byte, with the media type its bytes showed on upload and Content-Disposition: inline with the file name as sent (filename*, UTF-8). For purchasing.read (admins, managers, buyers, accountants) or stock.receive in the delivery's kitchen.",
    params: idParam("delivery"),
    success: { status: 200, description: "The document.", schema: DELIVERY_DOCUMENT_FILE, mediaType: DOCUMENT_FILE_TYPES.map((t) => FILE_TYPES[t].mediaType) },
    errors: { 403: [["FORBIDDEN", "Your role neither reads purchasing nor receives into this kitchen."]], 404: [["NOT_FOUND", "No such delivery in your company (another company's is 404 too), or no document is attached."]] },
  },
  {
    method: "post", path: "/api/deliveries/{id}/post", operationId: "postDelivery", tag: "Deliveries", auth: true, idempotent: true,
    summary: "Post the delivery",
    description: "One transaction: receipts into the delivery's kitchen for the accepted lines (lots with supplier, lot code, date and the landed unit cost per stock unit = (line value + freight share by value) / quantity), the order lines' received quantities and the orders' status (partly received or received). Every line must be decided (422 naming lines.N.decision); accepted lot-tracked lines (every cure) need a lot and date. Posting again, also at the same time, answers the posted delivery and posts nothing.",
    params: idParam("delivery"),
    success: { status: 200, description: "The posted delivery.", schema: deliveryResponse },
    errors: {
      403: [["FORBIDDEN", "Your role may not receive stock (admins, managers and buyers only), or not into this kitchen."]], 404: [["NOT_FOUND", "No such delivery in your company (another company's is 404 too)."]],
      409: [["DELIVERY_ALREADY_POSTED", "A note with this number from this supplier was posted meanwhile."]],
      422: [["VALIDATION", "Lines still pending, accepted lines without lot, date or price, an expired line accepted, or no note number."]],
    },
  },
  // Reorder suggestions -------------------------------------------------------------------
  {
    method: "get", path: "/api/reorder-suggestions", operationId: "getReorderSuggestions", tag: "Purchase orders", auth: true,
    summary: "What to reorder",
    description: "Per kitchen, the items with a reorder point whose projection falls below it, grouped by the preselected supplier. For each supplier that lists the item: projected = on hand - reserved - planned batch use not yet reserved (batches dated up to today + the supplier's lead time) + what sent or partly received orders still bring by then; suggested when projected < reorder point; packs = (par level, or the reorder point without one) - projected, rounded up to whole packs. The cheapest offer per stock unit is preselected; the others are alternatives with their own figures. A supplier's lines are raised by whole packs to its minimum order value. Drafts and approved orders are listed as pending, not counted. Quantities are in the item's stock unit.",
    query: reorderSuggestionsQuery.extend({
      kitchen: reorderSuggestionsQuery.shape.kitchen.meta({ description: "One kitchen, by id or code. Left out: every open kitchen you may see.", example: "YARD" }),
    }),
    success: { status: 200, description: "The suggestions, per kitchen.", schema: reorderSuggestionsResponse },
    errors: { 403: [PURCHASING_READ], 404: [["NOT_FOUND", "No open kitchen of your company has this id or code."]] },
  },
  {
    method: "post", path: "/api/reorder-suggestions/orders", operationId: "createReorderOrders", tag: "Purchase orders", auth: true, idempotent: true,
    summary: "Draft orders from reorder suggestions",
    description: "One draft purchase order per supplier of the lines, delivered to the kitchen and asked for by today + the supplier's lead time. Every line is checked before any draft is made; the drafts are made one after the other (each in its own transaction), and if one still fails, those already made by this request are cancelled and the error names the request's line. Send an Idempotency-Key: a retry replays the first answer and makes nothing new.",
    body: bodies.reorderOrders,
    success: { status: 201, description: "The drafts made.", schema: reorderOrdersResponse },
    errors: {
      403: [PURCHASING_ORDERS],
      422: [["VALIDATION", "details.fields names each problem: kitchen (not of your company, or archived), lines.N.supplierItemId (not of your company, switched off, its supplier switched off, its item archived, or twice), lines.N.packs (not whole packs), lines.N.packPrice (no current price: send one)."]],
    },
  },
  // Users ---------------------------------------------------------------------------------
  {
    method: "get", path: "/api/users", operationId: "listUsers", tag: "Users", auth: true,
    summary: "List users",
    description: "Everyone in the company, by name, with their kitchens.",
    success: { status: 200, description: "The users.", schema: userListResponse },
    errors: { 403: [ADMIN_ONLY("manage users")] },
  },
  {
    method: "get", path: "/api/users/{id}", operationId: "getUser", tag: "Users", auth: true,
    summary: "One user",
    description: "A user of your company.",
    params: idParam("user"),
    success: { status: 200, description: "The user.", schema: userSummaryResponse },
    errors: { 403: [ADMIN_ONLY("manage users")], 404: [["NOT_FOUND", "No such user in your company."]] },
  },
  {
    method: "patch", path: "/api/users/{id}", operationId: "updateUser", tag: "Users", auth: true,
    summary: "Change a user's role, kitchens or access",
    description: "Changes only the fields sent. Disabling signs the user out everywhere. A company always keeps at least one active admin.",
    params: idParam("user"),
    body: bodies.userUpdate,
    success: { status: 200, description: "The user as saved.", schema: userSummaryResponse },
    errors: {
      403: [ADMIN_ONLY("manage users")],
      404: [["NOT_FOUND", "No such user in your company."]],
      409: [
        ["CONFLICT", "You tried to remove your own admin role or disable yourself: ask another admin."],
        ["CONFLICT", "The change would leave the company without an active admin."],
      ],
      422: [
        ["VALIDATION", "A kitchenIds entry is not a kitchen of your company (details.fields[\"kitchenIds.N\"])."],
        ["VALIDATION", "A kitchen lead would be left without a kitchen (details.fields.kitchenIds)."],
      ],
    },
  },
  // Invitations ---------------------------------------------------------------------------
  {
    method: "get", path: "/api/invitations", operationId: "listInvitations", tag: "Invitations", auth: true,
    summary: "List invitations",
    description: "The company's invitations, newest first, with their status.",
    success: { status: 200, description: "The invitations.", schema: invitationListResponse },
    errors: { 403: [ADMIN_ONLY("manage users and invitations")] },
  },
  {
    method: "post", path: "/api/invitations", operationId: "createInvitation", tag: "Invitations", auth: true, idempotent: true,
    summary: "Invite someone",
    description: "E-mails a single-use link, valid for 7 days, that creates the account with this role and these kitchens. An open invitation to the same address is withdrawn. Send an Idempotency-Key so a retried request cannot send two links.",
    body: bodies.invitationCreate,
    success: { status: 201, description: "The new invitation.", schema: invitationSummaryResponse },
    errors: {
      403: [ADMIN_ONLY("manage users and invitations")],
      409: [["CONFLICT", "This e-mail already has a Hank & Lot account (details.fields.email)."]],
      422: [["VALIDATION", "A kitchenIds entry is not a kitchen of your company (details.fields[\"kitchenIds.N\"])."]],
    },
  },
  {
    method: "delete", path: "/api/invitations/{id}", operationId: "revokeInvitation", tag: "Invitations", auth: true,
    summary: "Withdraw an invitation",
    description: "The link stops working. Withdrawing twice is harmless.",
    params: idParam("invitation"),
    success: { status: 200, description: "The invitation, now revoked (or as it was, if already used).", schema: invitationSummaryResponse },
    errors: { 403: [ADMIN_ONLY("manage users and invitations")], 404: [["NOT_FOUND", "No such invitation in your company."]] },
  },
  {
    method: "post", path: "/api/invitations/accept", operationId: "acceptInvitation", tag: "Invitations", auth: false,
    summary: "Accept an invitation",
    description: "Creates the account from the link's token and signs the new user in.",
    body: bodies.invitationAccept,
    success: { status: 201, description: "Account created and signed in.", schema: okResponse, setsCookie: sessionCookieNote("carrying the new session") },
    errors: {
      404: [["NOT_FOUND", "No such invitation link."]],
      409: [
        ["INVITATION_USED", "The link has already been used."],
        ["INVITATION_REVOKED", "The invitation was withdrawn."],
        ["INVITATION_EXPIRED", "The link is older than 7 days."],
        ["CONFLICT", "The e-mail already has an account: sign in instead."],
      ],
    },
  },
  // Mail catcher --------------------------------------------------------------------------
  {
    method: "get", path: "/api/mail/captured", operationId: "listCapturedMail", tag: "Mail catcher", auth: true,
    summary: "Caught e-mail",
    description: "While the local mail catcher stands in for a mail server: the messages sent to your company's users and invitees.",
    success: { status: 200, description: "The messages.", schema: capturedMailListResponse },
    errors: {
      403: [ADMIN_ONLY("read caught mail")],
      404: [["NOT_FOUND", "The local mail catcher is not in use."]],
    },
  },
  // Jobs ----------------------------------------------------------------------------------
  {
    method: "get", path: "/api/jobs", operationId: "getJobHealth", tag: "Jobs", auth: true,
    summary: "Job health",
    description: "Per queue the waiting, active, delayed, failed and completed counts (the whole installation's, not only your company's); your company's failed jobs with their reason (scans of your company, its e-mails); and per scan its schedule in the company's time zone, its last run for your company with what it found, and its next run. While the job queue (Redis) does not answer within about a second, redis is \"down\", queues and failed are null and the last runs come from the database: the answer still arrives within about 2 s.",
    success: { status: 200, description: "The job health.", schema: jobHealthResponse },
    errors: { 403: [ADMIN_ONLY("see the job health")] },
  },
  {
    method: "post", path: "/api/jobs/{name}/run", operationId: "runScanNow", tag: "Jobs", auth: true, idempotent: true,
    summary: "Run a scan now",
    description: "Queues a run of the scan for your company at once; the worker delivers what it finds within seconds, as if every recipient's digest hour had come. The run's result shows in GET /api/jobs (lastRunAt moves). Running twice runs twice (the scans raise each alert once); send an Idempotency-Key to make a retried request harmless.",
    params: z.object({ name: z.string().meta({ description: "The scan: one of the names GET /api/jobs lists (expiry-scan, and reorder-scan and shortage-scan once they are in).", example: "expiry-scan" }) }),
    success: { status: 202, description: "Queued: the job's id.", schema: runScanResponse },
    errors: {
      403: [ADMIN_ONLY("run scans")],
      404: [["NOT_FOUND", "No scan has this name; the message and details.scans name the scans."]],
      503: [["QUEUE_UNAVAILABLE", "The job queue (Redis) is not answering: nothing was queued and alerts are delayed. Try again later."]],
    },
  },
  {
    method: "post", path: "/api/jobs/failed/{queue}/{id}/retry", operationId: "retryFailedJob", tag: "Jobs", auth: true, idempotent: true,
    summary: "Retry a failed job",
    description: "Runs a failed job of your company again, its attempts counted afresh. A failed e-mail is put back to pending first, so it is sent.",
    params: z.object({
      queue: z.string().meta({ description: "The job's queue (mail, housekeeping, scans...).", example: "scans" }),
      id: z.string().meta({ description: "The job's id, as GET /api/jobs lists it (URL-encoded)." }),
    }),
    success: { status: 200, description: "Queued again.", schema: retryJobResponse },
    errors: {
      403: [ADMIN_ONLY("retry jobs")],
      404: [["NOT_FOUND", "No such queue, or no such job of your company (another company's job is 404 too)."]],
      409: [["JOB_NOT_FAILED", "The job is not failed (any more): details.state says what it is."]],
      503: [["QUEUE_UNAVAILABLE", "The job queue (Redis) is not answering. Try again later."]],
    },
  },
  // Periods -------------------------------------------------------------------------------
  {
    method: "get", path: "/api/periods", operationId: "listPeriods", tag: "Periods", auth: true,
    summary: "Months and their status",
    description: "The company's months from `from` to `to` (default: the current month and the eleven before it, and back to the next month to close when that is older), newest first: open or closed, who closed each and when, and the audit trail of those months (every close and reopen, newest first). Months are calendar months in the company's time zone. Every month up to `closedThrough` is closed; `nextToClose` is the month that may be closed next.",
    query: periodListQuery.extend({
      from: periodListQuery.shape.from.meta({ description: "The first month, YYYY-MM.", example: "2026-01" }),
      to: periodListQuery.shape.to.meta({ description: "The last month, YYYY-MM; default the current month.", example: "2026-12" }),
    }),
    success: { status: 200, description: "The months.", schema: periodListResponse },
    errors: {
      403: [["FORBIDDEN", "Your role may not see periods (admins, managers and accountants only)."]],
      422: [["VALIDATION", "from or to is not a month as YYYY-MM, from is after to, or the range is over 120 months."]],
    },
  },
  {
    method: "post", path: "/api/periods/{month}/close", operationId: "closePeriod", tag: "Periods", auth: true, idempotent: true,
    summary: "Close a month",
    description: "Closes a month that is over in the company's time zone. From then on every stock movement dated in it, or in a month before it, is refused with 409 PERIOD_CLOSED (details.month): corrections are dated in an open month (a reversal is always dated when it is posted). Postings already under way when the close starts are committed first and belong to the closed month; postings arriving during the close wait for it and are then refused. Months close in order: after the latest closed month comes the next one; before any month is closed, any month that is over up to the month of the company's first movement (the empty months before it close with it). Recorded on the audit trail.",
    params: periodMonthParams,
    success: { status: 200, description: "The month, now closed.", schema: periodResponse },
    errors: {
      403: [["FORBIDDEN", "Your role may not close months (admins, managers and accountants only)."]],
      409: [
        ["PERIOD_ALREADY_CLOSED", "The month is already closed (details.month, details.closedAt); nothing is recorded twice."],
        ["EARLIER_PERIOD_OPEN", "An earlier month must be closed first: details.month names it."],
      ],
      422: [["VALIDATION", "The month is not YYYY-MM, or it has not ended yet in the company's time zone (the current or a later month): details.fields.month."]],
    },
  },
  {
    method: "post", path: "/api/periods/{month}/reopen", operationId: "reopenPeriod", tag: "Periods", auth: true, idempotent: true,
    summary: "Reopen a month",
    description: "Reopens the latest closed month, so movements may be dated in it again. Admins only, with a reason; recorded on the audit trail with the reason. Months reopen from the latest back.",
    params: periodMonthParams,
    body: bodies.periodReopen,
    success: { status: 200, description: "The month, now open.", schema: periodResponse },
    errors: {
      403: [ADMIN_ONLY("reopen months")],
      409: [
        ["PERIOD_NOT_CLOSED", "The month is not closed."],
        ["LATER_PERIOD_CLOSED", "A later month is closed: details.month names the month to reopen first."],
      ],
      422: [["VALIDATION", "The month is not YYYY-MM (details.fields.month), or no reason is given (details.fields.reason)."]],
    },
  },
  // Reference -----------------------------------------------------------------------------
  {
    method: "get", path: "/api/openapi.json", operationId: "getOpenApiDocument", tag: "Reference", auth: true,
    summary: "This OpenAPI document",
    description: "The machine-readable reference of every endpoint, for any signed-in user.",
    success: { status: 200, description: "The document.", schema: openApiDocumentResponse },
  },
];

// ---------------------------------------------------------------------------------------------

function errorCauses(ep: EndpointDoc): Map<ErrorStatus, Cause[]> {
  const out = new Map<ErrorStatus, Cause[]>();
  const add = (status: ErrorStatus, ...causes: Cause[]) => out.set(status, [...(out.get(status) ?? []), ...causes]);
  if (ep.body) add(400, WRAPPER.badJson);
  if (ep.auth) add(401, WRAPPER.unauthenticated);
  for (const [status, causes] of Object.entries(ep.errors ?? {})) add(Number(status) as ErrorStatus, ...causes);
  if (ep.method !== "get") add(403, WRAPPER.crossSite);
  if (ep.idempotent) add(409, WRAPPER.keyBusy);
  if (ep.body) {
    add(413, WRAPPER.tooLarge);
    add(415, WRAPPER.mediaType);
    add(422, WRAPPER.invalid);
  }
  if (ep.idempotent) add(422, WRAPPER.keyInvalid);
  add(500, ep.idempotent ? WRAPPER.internalKeyed : WRAPPER.internal);
  return new Map([...out].sort(([a], [b]) => a - b));
}

function errorResponseConfig(status: ErrorStatus, causes: Cause[]): ResponseConfig {
  const lines = causes.map(([code, when]) => `- \`${code}\`: ${when}`);
  return {
    description: `${STATUS_TITLES[status]}.\n\n${lines.join("\n")}`,
    ...(status === 429
      ? { headers: { "Retry-After": { description: "Seconds to wait before trying again.", schema: { type: "integer" } } } }
      : {}),
    content: { "application/json": { schema: status === 422 ? validationErrorResponse : errorResponse } },
  };
}

const IDEMPOTENCY_HEADER = z.object({
  "Idempotency-Key": z
    .string()
    .min(1)
    .max(200)
    .optional()
    .meta({
      description: "A unique string per user action (a UUID is fine). A retry with the same key and body replays the first answer; keys are kept at least 24 hours.",
      example: "4d5e7c1a-2b1f-4c0e-9a57-0f3e8f9b6a21",
    }),
});

function buildRegistry(): OpenAPIRegistry {
  const registry = new OpenAPIRegistry();
  registry.registerComponent("securitySchemes", SECURITY_SCHEME, {
    type: "apiKey",
    in: "cookie",
    name: SESSION_COOKIE,
    description: "The session cookie set by POST /api/auth/sign-in (or by accepting an invitation).",
  });
  for (const ep of ENDPOINTS) {
    const responses: RouteConfig["responses"] = {
      [ep.success.status]: {
        description: ep.success.description,
        ...(ep.success.setsCookie
          ? { headers: { "Set-Cookie": { description: ep.success.setsCookie, schema: { type: "string" } } } }
          : {}),
        content: Object.fromEntries([ep.success.mediaType ?? "application/json"].flat().map((t) => [t, { schema: ep.success.schema }])),
      },
    };
    for (const [status, causes] of errorCauses(ep)) responses[status] = errorResponseConfig(status, causes);
    registry.registerPath({
      method: ep.method,
      path: ep.path,
      operationId: ep.operationId,
      tags: [ep.tag],
      summary: ep.summary,
      description: ep.description,
      security: ep.auth ? [{ [SECURITY_SCHEME]: [] }] : [],
      request: {
        ...(ep.params ? { params: ep.params } : {}),
        ...(ep.query ? { query: ep.query } : {}),
        ...(ep.idempotent ? { headers: IDEMPOTENCY_HEADER } : {}),
        ...(ep.body ? { body: { required: true, content: { "application/json": { schema: ep.body } } } } : {}),
        ...(ep.upload ? { body: { required: true, content: { "multipart/form-data": { schema: ep.upload } } } } : {}),
      },
      responses,
    });
  }
  return registry;
}

const registry = buildRegistry();

const DESCRIPTION = `JSON API of Hank & Lot: the company, its kitchens, users and invitations; the catalogue of casings, cures and spices; stock per kitchen and lot; and the movement ledger (receipts, transfers, use, waste, adjustments, counts, reversals, transfer requests). Every endpoint lives under \`/api\` on the same host as the app.

## Conventions

- **Sessions.** \`POST /api/auth/sign-in\` sets the \`${SESSION_COOKIE}\` cookie (HttpOnly, SameSite=Lax); every endpoint not marked public needs it. Sessions last 30 days and are extended while in use: any answer may carry a refreshed Set-Cookie.
- **Exact quantities.** Quantities and money travel as decimal strings such as \`"12.5"\`: no exponent, at most the field's stated number of decimals. JSON numbers are refused with 422 VALIDATION, because most clients pass them through binary floating point. Answers carry decimal strings too.
- **Bodies.** \`Content-Type: application/json\`, at most ${DEFAULT_MAX_BODY_BYTES / 1024} KiB. Text fields are trimmed (passwords are kept as typed); e-mail addresses are lower-cased and codes upper-cased before they are stored.
- **Errors.** Every error is \`{"error": {"code", "message", "details"?}}\` with a fixed status per kind: 400 BAD_REQUEST (not JSON), 401 UNAUTHENTICATED, 403 FORBIDDEN, 404 NOT_FOUND, 409 CONFLICT or a domain code such as INVITATION_EXPIRED, 413 PAYLOAD_TOO_LARGE, 415 UNSUPPORTED_MEDIA_TYPE, 422 VALIDATION with \`details.fields\` (\`{"path": ["message", ...]}\`, every bad field named), 429 RATE_LIMITED with Retry-After, 500 INTERNAL, 503 when a service behind the request (the job queue) is not answering. Branch on \`code\`; \`message\` is for people.
- **Idempotency keys.** Creating endpoints marked so take an \`Idempotency-Key\` header (at most 200 characters, e.g. a UUID per user action). A retry with the same key and the same body gets the first answer again, same status and body, without doing the work twice; keys are kept at least 24 hours, per user and endpoint. The same key with another body is 422; while the first request is still running, 409.
- **Same-site writes.** A POST, PATCH or DELETE whose \`Origin\` header names another host is refused with 403. Clients outside a browser send no Origin and are not affected.
- **Tenancy.** Every record belongs to one company. Another company's record answers 404, exactly as if it did not exist. A record of your own company that your role may not act on, such as a kitchen outside a kitchen lead's own, answers 403.`;

/** The whole document, generated afresh (callers may keep or change it). */
export function buildOpenApiDocument() {
  return new OpenApiGeneratorV31(registry.definitions).generateDocument({
    openapi: OPENAPI_VERSION,
    info: { title: "Hank & Lot API", version: API_VERSION, description: DESCRIPTION },
    servers: [{ url: "/", description: "The app's own host." }],
    tags: TAGS.map((t) => ({ ...t })),
    security: [{ [SECURITY_SCHEME]: [] }],
  });
}

export type OpenApiDocument = ReturnType<typeof buildOpenApiDocument>;
