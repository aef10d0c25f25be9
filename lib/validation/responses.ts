// Response shapes of the JSON API, as zod schemas: what app/api/** actually returns (lib/data's
// Kitchen, UserSummary, InvitationSummary, Company, CapturedMail and app/api/me/me-body.ts).
// They feed the OpenAPI document (lib/http/openapi.ts, which checks them against those types at
// compile time) and can check a real response in a test. Plain zod: `.meta({ id })` names a
// component for the document without extending zod, so nothing here changes other schemas.
import { z } from "zod";
import { CASING_KINDS, CASING_STORAGE, DATE_KINDS, ITEM_CATEGORIES, MOVEMENT_KINDS, PUT_UPS, ROLES, STOCK_UNITS } from "../../db/types";
import { SALTS } from "../cure/limits";
import { WEEK_STARTS } from "./company";

const id = z.uuid();
const timestamp = z.iso.datetime({ offset: true }).meta({ description: "ISO 8601 timestamp in UTC, e.g. 2026-12-02T09:30:00.000Z." });
const role = z.enum(ROLES);

export const errorDetails = z
  .object({
    fields: z
      .record(z.string(), z.array(z.string()))
      .optional()
      .meta({ description: 'Messages per field, keyed by dotted path ("kitchenIds.0"); "_" for the body as a whole.' }),
    retryAfterSeconds: z.number().int().positive().optional().meta({ description: "With RATE_LIMITED: seconds to wait (also sent as Retry-After)." }),
  })
  .meta({ id: "ErrorDetails", description: "Present only when the code has more to say." });

export const errorResponse = z
  .object({
    error: z.object({
      code: z.string().meta({ description: "Stable machine-readable code, e.g. NOT_FOUND, VALIDATION, INVITATION_EXPIRED.", example: "NOT_FOUND" }),
      message: z.string().meta({ description: "A sentence for people; may change, never parse it.", example: "Kitchen not found." }),
      details: errorDetails.optional(),
    }),
  })
  .meta({ id: "Error", description: "The one error shape of every endpoint." });

export const validationErrorResponse = z
  .object({
    error: z.object({
      code: z.literal("VALIDATION"),
      message: z.string().meta({ example: "Some fields are not valid." }),
      details: z.object({
        fields: z
          .record(z.string(), z.array(z.string()))
          .meta({ description: "Every bad field with its messages, keyed by dotted path.", example: { code: ["Use 1 to 12 letters, digits or dashes, e.g. NORTH-1."] } }),
      }),
    }),
  })
  .meta({ id: "ValidationError", description: "422: every bad field is named, not just the first." });

export const okResponse = z.object({ ok: z.literal(true) }).meta({ id: "Ok" });

export const okMessageResponse = z
  .object({ ok: z.literal(true), message: z.string() })
  .meta({ id: "OkMessage" });

export const kitchenRefResponse = z
  .object({ id, code: z.string().meta({ example: "NORTH-1" }), name: z.string() })
  .meta({ id: "KitchenRef", description: "A kitchen named in another record." });

export const kitchenResponse = z
  .object({
    id,
    code: z.string().meta({ example: "NORTH-1" }),
    name: z.string(),
    address: z.string(),
    timeZone: z.string().nullable().meta({ description: "IANA time zone; null: the company's." }),
    archived: z.boolean(),
  })
  .meta({ id: "Kitchen" });

export const kitchenListResponse = z.object({ kitchens: z.array(kitchenResponse) }).meta({ id: "KitchenList" });

export const companyResponse = z
  .object({
    id,
    name: z.string(),
    timeZone: z.string().meta({ description: "IANA time zone, e.g. Europe/Vienna." }),
    currency: z.string().meta({ description: "ISO 4217 code.", example: "EUR" }),
    weekStart: z.enum(WEEK_STARTS).meta({ description: "The first day of the planning week: the week planner shows that day and the six after it. Default monday." }),
    approvalThreshold: z.string().meta({ description: "Buyers approve purchase orders up to this total, managers and admins above it; in the company's currency with its decimals. Default 500. A decimal string.", example: "500.00" }),
    receiving: z.object({
      priceTolerancePercent: z.string().meta({ description: "Deliveries flag a price further than this percent from the ordered price (per stock unit). Default 2. A decimal string.", example: "2" }),
      shortDatedDays: z.object({ cure: z.number().int(), casing: z.number().int(), spice: z.number().int(), ingredient: z.number().int() })
        .meta({ description: "The least remaining life, in days, a delivered lot may have per category before it is flagged short-dated (defaults cure 90, casing 60, spice 180, ingredient 0 = no check)." }),
    }),
    scanSeparator: z.string().nullable().meta({ description: "What the company's scanners type instead of GS (ASCII 29) on case labels; POST /api/gs1/parse uses it when a request sends no separator. null: none.", example: "|" }),
    costFormula: z.enum(["fifo", "average"]).meta({ description: "The cost formula of the reports under IAS 2: fifo (cost layers in receipt order, the default) or average (moving weighted average); kept per kitchen. Admins change it while no month is closed." }),
    expiryWindows: z.object({ cure: z.array(z.number().int()), casing: z.array(z.number().int()), spice: z.array(z.number().int()), ingredient: z.array(z.number().int()) })
      .meta({ description: "The daily expiry scan warns when a lot with stock is this many days or fewer from its date, once per number, per category, largest first (defaults cure 60/30/7, casing 30/7, spice 90/30, ingredient none). These are the product's planning defaults, not trade figures.", example: { cure: [60, 30, 7], casing: [30, 7], spice: [90, 30], ingredient: [] } }),
  })
  .meta({ id: "Company" });

export const meResponse = z
  .object({
    id,
    email: z.string(),
    name: z.string(),
    role,
    company: z.object({ id, name: z.string() }),
    kitchens: z.array(kitchenRefResponse).meta({ description: "Kitchens the user acts in: a kitchen lead's own, everyone else's every open kitchen." }),
  })
  .meta({ id: "Me", description: "The signed-in user." });

export const signInResponse = z.object({ user: meResponse }).meta({ id: "SignInResult" });

export const userSummaryResponse = z
  .object({
    id,
    email: z.string(),
    name: z.string(),
    role,
    timeZone: z.string().nullable().meta({ description: "The user's own IANA time zone; null: the company's." }),
    disabled: z.boolean(),
    kitchens: z.array(kitchenRefResponse).meta({ description: "Assigned kitchens (what a kitchen lead may act in)." }),
    createdAt: timestamp,
  })
  .meta({ id: "UserSummary" });

export const userListResponse = z.object({ users: z.array(userSummaryResponse) }).meta({ id: "UserList" });

export const invitationSummaryResponse = z
  .object({
    id,
    email: z.string(),
    name: z.string(),
    role,
    kitchenIds: z.array(id),
    status: z.enum(["pending", "accepted", "revoked", "expired"]),
    expiresAt: timestamp,
    createdAt: timestamp,
  })
  .meta({ id: "InvitationSummary" });

export const invitationListResponse = z
  .object({ invitations: z.array(invitationSummaryResponse).meta({ description: "Newest first, at most 200." }) })
  .meta({ id: "InvitationList" });

export const capturedMailResponse = z
  .object({
    id: z.string().meta({ description: "The catcher's file name without .json." }),
    to: z.array(z.string()),
    subject: z.string(),
    receivedAt: timestamp,
    text: z.string(),
  })
  .meta({ id: "CapturedMail" });

export const capturedMailListResponse = z
  .array(capturedMailResponse)
  .meta({ id: "CapturedMailList", description: "Newest first, at most 200." });

export const openApiDocumentResponse = z
  .looseObject({
    openapi: z.string().meta({ example: "3.1.0" }),
    info: z.looseObject({ title: z.string(), version: z.string() }),
    paths: z.record(z.string(), z.unknown()),
  })
  .meta({ id: "OpenApiDocument", description: "This document (OpenAPI 3.1)." });

// Items (lib/data/items.ts Item) ---------------------------------------------------------------
const decimal = (description: string, example?: string) =>
  z.string().meta({ description: `${description} A decimal string without trailing zeros.`, ...(example ? { example } : {}) });

export const itemUnitsResponse = z
  .object({
    stockUnit: z.enum(STOCK_UNITS),
    putUp: z
      .object({ name: z.string().meta({ example: "hank" }), metres: decimal("Length of one put-up in metres.", "91.44") })
      .nullable()
      .optional()
      .meta({ description: "Casings stocked in put-ups: one pc is one put-up." }),
    densityGPerMl: z.string().nullable().optional().meta({ description: "Grams per millilitre (decimal string)." }),
    packs: z
      .array(z.object({ name: z.string(), quantity: z.string(), unit: z.string() }))
      .readonly()
      .nullable()
      .optional(),
  })
  .meta({ id: "ItemUnits", description: "What the unit conversions need: stock unit, put-up, density and packs as entered." });

export const itemResponse = z
  .object({
    id,
    sku: z.string().meta({ example: "HOG-32-35" }),
    name: z.string(),
    category: z.enum(ITEM_CATEGORIES),
    stockUnit: z.enum(STOCK_UNITS).meta({ description: "The unit stock is held in: g, m, ml or pc (a casing in put-ups: one pc = one put-up)." }),
    trackLots: z.boolean(),
    trackDates: z.boolean(),
    archived: z.boolean(),
    casing: z
      .object({
        kind: z.enum(CASING_KINDS),
        calibreMinMm: decimal("Smallest calibre, mm.", "32"),
        calibreMaxMm: decimal("Largest calibre, mm.", "35"),
        putUp: z.enum(PUT_UPS).nullable(),
        putUpMetres: decimal("Length of one put-up, m (a hank: 91.44).", "91.44").nullable(),
        capacityKgPerPutUp: decimal("Kg of filling one put-up holds (planning default: the lower bound of the trade table's band).", "45").nullable(),
        storage: z.enum(CASING_STORAGE),
      })
      .nullable()
      .meta({ description: "Casings only." }),
    cure: z
      .object({
        nitriteFraction: decimal("Nitrite (the salt in nitriteSalt) as a fraction of the cure's mass, from the label.", "0.0625"),
        nitrateFraction: decimal("Nitrate (the salt in nitrateSalt) as a fraction of the cure's mass, from the label.", "0"),
        nitriteSalt: z.enum(SALTS).meta({ description: "sodium or potassium nitrite, as printed on the label." }),
        nitrateSalt: z.enum(SALTS).meta({ description: "sodium or potassium nitrate, as printed on the label." }),
      })
      .nullable()
      .meta({ description: "Cures only: marks a curing salt (toxic in overdose; keep it labelled and apart from salt and spices)." }),
    form: z.string().nullable().meta({ description: "Spices and ingredients: ground, whole, flakes, liquid, culture..." }),
    densityGPerMl: z.string().nullable().meta({ description: "Spices and ingredients: grams per millilitre (decimal string)." }),
    packs: z.array(
      z.object({
        name: z.string().meta({ example: "25 lb pail" }),
        quantity: decimal("The size as entered.", "25"),
        unit: z.string().meta({ example: "lb" }),
        stockQuantity: decimal("The same size in the stock unit, exact to 12 decimals.", "11339.80925"),
      }),
    ),
    itemUnits: itemUnitsResponse,
    createdAt: timestamp,
    updatedAt: timestamp,
  })
  .meta({ id: "Item" });

export const itemListResponse = z.object({ items: z.array(itemResponse) }).meta({ id: "ItemList" });

// Stock and the ledger (lib/data/ledger.ts Movement, lib/data/stock.ts) ------------------------
const qty = (description: string, example?: string) => decimal(`${description} In the item's stock unit.`, example);
const codeRef = z.object({ id, code: z.string().meta({ example: "YARD" }) });

export const movementResponse = z
  .object({
    id,
    postingId: z.uuid().meta({ description: "Shared by the movements one request posted (a count sheet: the count's id)." }),
    kind: z.enum(MOVEMENT_KINDS),
    kitchen: codeRef,
    otherKitchen: codeRef.nullable().meta({ description: "Transfers: the kitchen on the other side." }),
    item: z.object({ id, sku: z.string(), name: z.string(), unit: z.enum(STOCK_UNITS) }),
    lot: codeRef,
    delta: qty("Signed change of on hand.", "-150"),
    quantity: qty("The size of the movement, zero or more (a count: the counted quantity).", "150"),
    counted: qty("Counts: the counted quantity.").nullable(),
    enteredQuantity: z.string().nullable().meta({ description: "The quantity as typed.", example: "0.15" }),
    enteredUnit: z.string().nullable().meta({ description: "The unit as typed.", example: "kg" }),
    unitCost: decimal("The lot's cost per stock unit, company currency.", "0.0125"),
    reason: z.string().nullable(),
    reversesId: z.uuid().nullable().meta({ description: "Reversals: the movement reversed." }),
    occurredAt: timestamp,
    recordedAt: timestamp,
    userId: z.uuid().nullable(),
  })
  .meta({ id: "Movement" });

export const movementListResponse = z.object({ movements: z.array(movementResponse) }).meta({ id: "MovementList" });
/** A movement in the history (GET /api/movements): with the name of the person who posted it. */
export const movementEntryResponse = movementResponse
  .extend({
    userName: z.string().nullable().meta({ description: "The name of the person who posted it; null when no person is recorded (userId null) or the user is no longer in your company.", example: "Oskar Pell" }),
  })
  .meta({ id: "MovementEntry" });
export const movementPageResponse = z
  .object({ movements: z.array(movementEntryResponse), nextCursor: z.string().nullable().meta({ description: "Pass as cursor for the next page; null on the last." }) })
  .meta({ id: "MovementPage" });
export const countPostedResponse = z.object({ countId: id, movements: z.array(movementResponse) }).meta({ id: "CountPosted" });

const stockLot = z.object({
  lotId: id,
  code: z.string(),
  date: z.string().nullable().meta({ description: "Use-by or best-before, yyyy-mm-dd." }),
  dateKind: z.enum(DATE_KINDS).nullable(),
  receivedOn: z.string(),
  onHand: qty("On hand."),
  reserved: qty("Reserved for planned batches."),
  available: qty("On hand minus reserved."),
  unitCost: decimal("Per stock unit."),
});
const stockRow = z
  .object({
    itemId: id,
    sku: z.string(),
    name: z.string(),
    category: z.enum(ITEM_CATEGORIES),
    unit: z.enum(STOCK_UNITS),
    trackLots: z.boolean(),
    trackDates: z.boolean(),
    casing: z.object({ kind: z.string(), calibreMinMm: z.string(), calibreMaxMm: z.string(), putUp: z.string().nullable(), metresPerPutUp: z.string().nullable() }).nullable(),
    cure: z.object({ nitriteFraction: z.string(), nitrateFraction: z.string() }).nullable().meta({ description: "Cures only: the label's fractions; the row is a curing salt." }),
    parLevel: qty("Par level here.").nullable(),
    reorderPoint: qty("Reorder point here.").nullable(),
    onHand: qty("On hand."),
    reserved: qty("Reserved."),
    available: qty("On hand minus reserved."),
    lots: z.array(stockLot),
  })
  .meta({ id: "StockRow" });
const kitchenNamed = z.object({ id, code: z.string(), name: z.string() });
export const kitchenStockResponse = z.object({ kitchen: kitchenNamed, rows: z.array(stockRow) }).meta({ id: "KitchenStock" });
export const allStockResponse = z.object({ kitchens: z.array(z.object({ kitchen: kitchenNamed, rows: z.array(stockRow) })) }).meta({ id: "AllKitchensStock" });
export const stockResponse = z.union([kitchenStockResponse, allStockResponse]).meta({ id: "Stock" });

export const expiringLotListResponse = z
  .object({
    lots: z.array(
      z.object({
        lotId: id, itemId: id, sku: z.string(), name: z.string(), category: z.enum(ITEM_CATEGORIES), unit: z.enum(STOCK_UNITS),
        code: z.string(), date: z.string(), dateKind: z.enum(DATE_KINDS),
        daysLeft: z.number().int().meta({ description: "Days from the company's today; negative when expired." }),
        onHand: qty("On hand across kitchens."),
        kitchens: z.array(z.object({ code: z.string(), onHand: z.string() })),
      }),
    ),
  })
  .meta({ id: "ExpiringLots" });

export const stockLevelResponse = z
  .object({ kitchen: z.string(), itemId: id, sku: z.string(), unit: z.enum(STOCK_UNITS), parLevel: qty("Par level.").nullable(), reorderPoint: qty("Reorder point.").nullable() })
  .meta({ id: "StockLevel" });

export const transferRequestResponse = z
  .object({
    id,
    status: z.enum(["open", "fulfilled", "declined", "cancelled"]),
    fromKitchen: codeRef,
    toKitchen: codeRef,
    item: z.object({ id, sku: z.string(), name: z.string(), unit: z.string() }),
    quantity: qty("Asked for."),
    enteredQuantity: z.string(),
    enteredUnit: z.string(),
    note: z.string().nullable(),
    requestedBy: z.uuid().nullable(),
    requestedAt: timestamp,
    decidedBy: z.uuid().nullable(),
    decidedAt: timestamp.nullable(),
    declineReason: z.string().nullable(),
    postingId: z.uuid().nullable().meta({ description: "The transfer's movements, once fulfilled." }),
    batchId: z.uuid().nullable().meta({ description: "The planned batch the request was asked for (its shortage), if any." }),
  })
  .meta({ id: "TransferRequest" });
export const transferRequestListResponse = z.object({ requests: z.array(transferRequestResponse) }).meta({ id: "TransferRequestList" });
export const transferFulfilledResponse = z.object({ request: transferRequestResponse, movements: z.array(movementResponse) }).meta({ id: "TransferFulfilled" });
export const transferLotChoicesResponse = z
  .object({
    item: z.object({
      id, sku: z.string(), name: z.string(), unit: z.enum(STOCK_UNITS), trackLots: z.boolean(), trackDates: z.boolean(),
      casing: stockRow.shape.casing, cure: z.boolean().meta({ description: "A curing salt." }),
    }),
    kitchen: codeRef.meta({ description: "The sending kitchen." }),
    today: z.string().meta({ description: "The company's date (yyyy-mm-dd), by which expiry is judged." }),
    lots: z.array(z.object({
      lotId: id,
      code: z.string(),
      date: z.string().nullable().meta({ description: "Use-by or best-before, yyyy-mm-dd." }),
      dateKind: z.enum(DATE_KINDS).nullable(),
      receivedOn: z.string(),
      daysLeft: z.number().int().nullable().meta({ description: "Days from the company's today; negative once expired; null when undated." }),
      expired: z.boolean(),
      available: qty("On hand minus reserved in the sending kitchen."),
    })).meta({ description: "The sending kitchen's lots of the item with stock available, in the order a first-expired-first-out draw takes them (expired ones included, flagged)." }),
    fefo: z.object({
      takes: z.array(z.object({ lotId: id, code: z.string(), quantity: qty("Taken from this lot.") })),
      short: qty("What those lots cannot cover; 0 when the request can be filled.", "0"),
    }).meta({ description: "What fulfilling without a lot would send now (expired lots skipped)." }),
  })
  .meta({ id: "TransferLotChoices" });
